import type { NextFunction, Request, Response } from 'express';
import { ConnectionError } from 'sequelize';
import { HttpError } from '../errors';
import { logger } from '../logger';

/** The one JSON error shape: { error: { code, message, fields? } }. Internals never leave. */
export function errorHandler(err: unknown, req: Request, res: Response, _next: NextFunction) {
  // A stream (an export, a PDF) that fails after its first bytes cannot turn into a JSON answer:
  // log it and cut the connection, so the client sees an incomplete download, not a corrupt file.
  if (res.headersSent) {
    logger.error({ err, url: req.originalUrl, method: req.method }, 'request failed after the response started');
    res.destroy(err instanceof Error ? err : undefined);
    return;
  }
  if (err instanceof HttpError) {
    const retry = (err as HttpError & { retryAfterSeconds?: number }).retryAfterSeconds;
    if (retry) res.setHeader('Retry-After', String(retry));
    return res
      .status(err.status)
      .json({ error: { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}) }, ...(err.extra ?? {}) });
  }
  const e = err as { type?: string; status?: number; statusCode?: number };
  // body-parser's own errors
  if (e?.type === 'entity.too.large') {
    return res.status(413).json({ error: { code: 'too_large', message: 'The request is too large.' } });
  }
  if (e?.type === 'entity.parse.failed') {
    return res.status(400).json({ error: { code: 'malformed_json', message: 'The request body is not valid JSON.' } });
  }
  if (e?.type === 'charset.unsupported' || e?.type === 'encoding.unsupported') {
    return res.status(415).json({ error: { code: 'unsupported_media_type', message: 'Send the body as UTF-8 JSON.' } });
  }
  if (databaseUnavailable(err)) {
    logger.warn({ err: (err as Error).message, url: req.originalUrl, method: req.method }, 'database unavailable');
    res.setHeader('Retry-After', '5');
    return res.status(503).json({ error: { code: 'database_unavailable', message: 'Guyline cannot reach its database just now. Nothing was changed; try again in a minute.' } });
  }
  logger.error({ err, url: req.originalUrl, method: req.method }, 'request failed');
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on our side. Try again, and tell us if it keeps happening.' } });
}

/**
 * Errors that mean the database is out of reach rather than a mistake in the request or the code:
 * no connection (refused, timed out, none free in the pool), a connection cut by a restarting
 * server (SQLSTATE class 08, 57P01-57P03 shutdown and start-up, 53300 too many connections).
 * A transaction cut off this way is rolled back by PostgreSQL, so nothing was half-saved.
 */
export function databaseUnavailable(err: unknown): boolean {
  if (err instanceof ConnectionError) return true;
  const e = err as { code?: unknown; parent?: { code?: unknown; message?: unknown }; original?: { code?: unknown }; message?: unknown } | null;
  const code = e?.parent?.code ?? e?.original?.code ?? e?.code;
  if (typeof code === 'string' && /^(08|57P0[1-3]$|53300$)/.test(code)) return true;
  if (typeof code === 'string' && /^(ECONNREFUSED|ECONNRESET|EPIPE|ETIMEDOUT)$/.test(code)) return true;
  const message = String(e?.parent?.message ?? e?.message ?? '');
  return /Connection terminated|Client has encountered a connection error|terminating connection/i.test(message);
}

export function notFoundHandler(req: Request, res: Response) {
  res.status(404).json({ error: { code: 'not_found', message: `No API route ${req.method} ${req.path}.` } });
}

/** Non-JSON writes get a 415 instead of a confusing validation error. */
export function requireJson(req: Request, res: Response, next: NextFunction) {
  const hasBody = Number(req.headers['content-length'] ?? 0) > 0 || req.headers['transfer-encoding'] !== undefined;
  if (['POST', 'PUT', 'PATCH'].includes(req.method) && hasBody && !req.is('application/json') && !req.is('multipart/form-data')) {
    return res.status(415).json({ error: { code: 'unsupported_media_type', message: 'Send the body as application/json.' } });
  }
  next();
}
