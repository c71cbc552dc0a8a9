/**
 * Figure 5: the client. From the build's manifest (vite build --manifest, into a folder of the
 * bench's own): the JavaScript a browser loads to show the sign-in page (the entry chunk, the
 * sign-in route's chunk and everything they import statically), gzipped with zlib, under 150 kB;
 * and every route module the router names is a lazy chunk (a dynamic entry, outside the entry's
 * static imports).
 */
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import type { BenchContext } from '../lib/context';
import type { Result } from '../lib/measure';

interface Chunk { file: string; isEntry?: boolean; isDynamicEntry?: boolean; imports?: string[]; dynamicImports?: string[] }

const LIMIT_KB = 150;
const SIGN_IN = 'src/app/routes/auth/sign-in.tsx';

/** The chunk keys loaded with `key`: itself and its static imports, recursively. */
function closure(manifest: Record<string, Chunk>, key: string, seen = new Set<string>()): Set<string> {
  if (seen.has(key) || !manifest[key]) return seen;
  seen.add(key);
  for (const k of manifest[key].imports ?? []) closure(manifest, k, seen);
  return seen;
}

/** Route modules as the router names them: `import('./routes/...')`. */
function routeModules(root: string): string[] {
  const source = fs.readFileSync(path.join(root, 'src/app/router.tsx'), 'utf8');
  const found = new Set<string>();
  for (const m of source.matchAll(/import\('\.\/(routes\/[^']+)'\)/g)) {
    const base = path.join('src/app', m[1]);
    const file = ['.tsx', '.ts', '/index.tsx'].map((ext) => base + ext).find((f) => fs.existsSync(path.join(root, f)));
    if (file) found.add(file);
  }
  return [...found].sort();
}

export async function clientBundleFigure(ctx: BenchContext): Promise<Result> {
  const manifestPath = path.join(ctx.distDir, '.vite', 'manifest.json');
  const manifest = JSON.parse(fs.readFileSync(manifestPath, 'utf8')) as Record<string, Chunk>;
  const entry = Object.keys(manifest).find((k) => manifest[k].isEntry);
  if (!entry) throw new Error(`No entry chunk in ${manifestPath}.`);
  const entryKeys = closure(manifest, entry);
  const signInKeys = closure(manifest, SIGN_IN, new Set(entryKeys));
  const files = [...signInKeys].map((k) => manifest[k].file).filter((f) => f.endsWith('.js'));
  const sizes = files.map((f) => ({ file: f, gzip: zlib.gzipSync(fs.readFileSync(path.join(ctx.distDir, f)), { level: 9 }).length }));
  const kb = sizes.reduce((n, s) => n + s.gzip, 0) / 1024;

  // The sign-in route may ship with the entry or lazily; every other route must be lazy.
  const routes = routeModules(ctx.root).filter((r) => r !== SIGN_IN);
  const eager = routes.filter((r) => !manifest[r]?.isDynamicEntry || entryKeys.has(r));
  const lazy = routes.length - eager.length;
  return {
    key: 'client-bundle',
    figure: `Client: sign-in page JavaScript (${files.length} chunks, gzip), route modules lazy`,
    measured: `${kb.toFixed(1)} kB; ${lazy} of ${routes.length} other routes lazy${eager.length ? ` (eager: ${eager.join(', ')})` : ''}`,
    target: `< ${LIMIT_KB} kB, every route lazy`,
    pass: kb < LIMIT_KB && eager.length === 0,
    notes: sizes.sort((a, b) => b.gzip - a.gzip).map((s) => `${(s.gzip / 1024).toFixed(1)} kB  ${s.file}`),
  };
}
