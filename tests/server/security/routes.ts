/**
 * Every route the app answers, read from the Express 5 router itself, so the permission matrix and
 * the bad-input test cannot miss a route someone adds later.
 *
 * Express 5 (router 2.x, path-to-regexp v8) keeps no `regexp`/`keys` on its layers as Express 4
 * did. What a layer keeps (checked with `node -e` against this app, router 2.3):
 *   - `layer.rawPath`: the path it was mounted or declared with, exactly as written: a string
 *     ('/api', '/items', '/:id/availability'), a RegExp, or an array of those;
 *   - `layer.route`: set on a route declared with router.get/post/...: `route.path` (the same
 *     declared path) and `route.methods` ({ get: true }, `_all` for router.all);
 *   - `layer.handle.stack`: present when the layer is a mounted Router (its own list of layers);
 *     plain middlewares (cookieParser, csrf, requireJson...) have neither `route` nor `stack`.
 * So a route's full path is the mount paths on the way down joined with the route's own path.
 */
import type { Express } from 'express';

export interface ApiRoute {
  /** Upper case: GET, POST, PUT, PATCH, DELETE (ALL for router.all). */
  method: string;
  /** Full path with Express parameters as declared, e.g. /api/bookings/:id/status. */
  path: string;
}

type RawPath = string | RegExp | RawPath[];

interface Layer {
  name: string;
  rawPath?: RawPath;
  route?: { path: RawPath; methods: Record<string, boolean | undefined> };
  handle: { stack?: Layer[] };
}

/** The declared paths of a layer: arrays are flattened, a RegExp is written as /source/. */
function pathsOf(raw: RawPath | undefined, where: string): string[] {
  if (raw === undefined) {
    // Router 2.0/2.1 (Express 5.0/5.1) had no rawPath; fail loudly rather than list nothing.
    throw new Error(`routes.ts: a layer under ${where || '/'} has no rawPath; the Express router changed, update the lister.`);
  }
  if (Array.isArray(raw)) return raw.flatMap((r) => pathsOf(r, where));
  return [raw instanceof RegExp ? `/${raw.source}/` : raw];
}

/** '/api' + '/' -> '/api'; '/api' + '/items' -> '/api/items'; never a trailing or double slash. */
function join(prefix: string, path: string): string {
  const joined = `${prefix}/${path}`.replace(/\/{2,}/g, '/');
  return joined.length > 1 ? joined.replace(/\/$/, '') : joined;
}

function walk(stack: Layer[], prefix: string, into: ApiRoute[]) {
  for (const layer of stack) {
    if (layer.route) {
      const methods = Object.keys(layer.route.methods)
        .filter((m) => layer.route!.methods[m])
        .map((m) => (m === '_all' ? 'ALL' : m.toUpperCase()));
      for (const path of pathsOf(layer.route.path, prefix)) {
        for (const method of methods) into.push({ method, path: join(prefix, path) });
      }
    } else if (Array.isArray(layer.handle?.stack)) {
      // A mounted Router: its routes live under this layer's mount path(s).
      for (const mount of pathsOf(layer.rawPath, prefix)) walk(layer.handle.stack, join(prefix, mount), into);
    }
  }
}

/**
 * Every { method, path } of the app, in the order Express tries them. A route declared twice
 * (the same method and path in two routers) is listed once: only the first can answer.
 */
export function listRoutes(app: Express): ApiRoute[] {
  const router = (app as unknown as { router?: { stack: Layer[] } }).router;
  if (!router?.stack) throw new Error('routes.ts: app.router has no stack; is this Express 5?');
  const all: ApiRoute[] = [];
  walk(router.stack, '', all);
  const seen = new Set<string>();
  return all.filter((r) => {
    const key = routeKey(r);
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

/** 'POST /api/bookings/:id/status': how the matrix and the fuzz test name a route. */
export const routeKey = (r: ApiRoute) => `${r.method} ${r.path}`;

/** Fills :params from a map; throws when one is missing so a new parameter cannot go unnoticed. */
export function fillPath(path: string, params: Record<string, string>): string {
  return path.replace(/:(\w+)/g, (_m, name: string) => {
    const value = params[name];
    if (value === undefined) throw new Error(`No value for :${name} in ${path}`);
    return encodeURIComponent(value);
  });
}
