import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import cookieParser from 'cookie-parser';
import express from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { env } from './env';
import { logger } from './logger';
import { csrf } from './middlewares/csrf';
import { webhooksRouter } from './routes/webhooks';
import { errorHandler, notFoundHandler, requireJson } from './middlewares/errorHandler';
import { apiRouter } from './routes';

const distDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', 'dist');

export interface AppOptions {
  /** Serve the built client from dist/ (production); Vite serves it in development. */
  serveClient?: boolean;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * A path with its secret parts (signing, pay and calendar links: long random segments, not record
 * ids) masked for the log. A segment goes whole when any of its dot-separated pieces is long and
 * random: a pay link is `<invoice id>.<generation>.<end day>.<HMAC>`, and its id must not stay
 * beside a masked HMAC either; a feed is `<token>.ics`.
 */
export function withoutTokens(url: string): string {
  const [path, query] = url.split('?', 2);
  const secret = (piece: string) => /^[A-Za-z0-9_-]{24,}$/.test(piece) && !UUID.test(piece);
  const masked = path
    .split('/')
    .map((part) => (part.split('.').some(secret) ? '[token]' : part))
    .join('/');
  return query === undefined ? masked : `${masked}?${query.replace(/(token|code|key)=[^&]*/gi, '$1=[hidden]')}`;
}

/** The Express app without listen(), so tests can drive it with supertest. */
export function createApp(options: AppOptions = {}) {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', env.TRUST_PROXY === 'false' ? false : env.TRUST_PROXY);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // The developer mail inbox shows caught HTML mail in a sandboxed srcdoc frame.
          'frame-src': ["'self'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          ...(env.APP_URL.startsWith('https://') ? {} : { 'upgrade-insecure-requests': null }),
        },
      },
      hsts: env.APP_URL.startsWith('https://'),
    }),
  );
  if (env.LOG_LEVEL !== 'silent') {
    app.use(
      pinoHttp({
        logger,
        autoLogging: { ignore: (req) => !req.url?.startsWith('/api') },
        // One short line a request: what was asked and how it ended. Headers (cookies, tokens, the
        // browser's whole self-description) stay out of the log, and out of every request's time.
        serializers: {
          req: (req: { id: unknown; method: string; url: string; remoteAddress?: string }) => ({ id: req.id, method: req.method, url: withoutTokens(req.url), remoteAddress: req.remoteAddress }),
          res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
        },
      }),
    );
  }

  // No API answer is kept by a browser or a proxy: they carry customers' and the company's data
  // (and sign-in links' state). A route that sends a file may say more (private, no-store) itself.
  app.use('/api', (_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  // Webhooks first: they need the raw body for their signature, and carry no cookies or CSRF token.
  app.use('/api/webhooks', webhooksRouter);
  app.use('/api', cookieParser(), express.json({ limit: '1mb' }), requireJson, csrf, apiRouter(), notFoundHandler);

  if (options.serveClient) {
    const index = path.join(distDir, 'index.html');
    if (!fs.existsSync(index)) throw new Error('dist/index.html is missing: build the client with `npm run build`.');
    app.use(cookieParser(), csrf);
    app.use(express.static(distDir, { index: false, maxAge: '1h', setHeaders: (res, file) => {
      if (file.includes(`${path.sep}assets${path.sep}`)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
    } }));
    // Client-side routes: every other GET gets the app's page.
    app.get(/^\/(?!api\/).*/, (_req, res) => res.sendFile(index, { headers: { 'Cache-Control': 'no-cache' } }));
  }

  app.use(errorHandler);
  return app;
}
