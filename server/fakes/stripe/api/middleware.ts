import type { ErrorRequestHandler, RequestHandler, Response } from 'express';
import Stripe from 'stripe';
import { ApiError } from '../params';
import type { RequestInfo } from '../payments';
import { newId } from '../store';

/** Every API answer carries a request id and the API version, as the real ones do. */
export const requestId: RequestHandler = (req, res, next) => {
  res.locals.requestId = newId.request();
  res.set('Request-Id', res.locals.requestId);
  res.set('Stripe-Version', req.get('Stripe-Version') ?? Stripe.API_VERSION);
  next();
};

/** The request behind an event: its id and idempotency key. */
export function requestInfo(res: Response): RequestInfo {
  return { id: res.locals.requestId ?? null, idempotency_key: res.locals.idempotencyKey ?? null };
}

/** The key as the real refusal quotes it: its kind, then stars, then the last four characters. */
function masked(key: string): string {
  const kind = /^[a-z]{2}_(test|live)_/.exec(key)?.[0] ?? '';
  if (key.length < kind.length + 8) return '*'.repeat(key.length);
  return `${kind}${'*'.repeat(key.length - kind.length - 4)}${key.slice(-4)}`;
}

/**
 * A secret test key in `Authorization: Bearer` (or HTTP Basic with the key as user name). When the
 * fake was started with `apiKey`, only that key is taken. The refusal is a 401 with the real body
 * (`type: invalid_request_error`), which the SDK raises as StripeAuthenticationError.
 */
export function authenticate(apiKey: string | undefined): RequestHandler {
  return (req, res, next) => {
    const header = req.get('Authorization') ?? '';
    let key = '';
    if (/^Bearer /i.test(header)) key = header.slice(7).trim();
    else if (/^Basic /i.test(header)) key = Buffer.from(header.slice(6), 'base64').toString('utf8').split(':')[0];
    if (!key) {
      throw new ApiError(401, {
        type: 'invalid_request_error',
        message:
          "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').",
      });
    }
    const testKey = /^(sk|rk)_test_\w+$/.test(key);
    if (!testKey || (apiKey !== undefined && key !== apiKey)) {
      throw new ApiError(401, {
        type: 'invalid_request_error',
        message: testKey
          ? `Invalid API Key provided: ${masked(key)}`
          : `Invalid API Key provided: ${masked(key)}. The local card fake takes secret test keys (sk_test_...) only.`,
      });
    }
    res.locals.apiKey = key;
    next();
  };
}

/** Parameters in a fixed key order, so two requests with the same parameters compare equal. */
function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
  if (value && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonical(v)}`).join(',')}}`;
  }
  return JSON.stringify(value ?? null);
}

export interface StoredAnswer {
  /** When the first answer was given, ms; keys are forgotten after 24 hours, as the real ones are. */
  at: number;
  endpoint: string;
  params: string;
  status: number;
  body: unknown;
  requestId: string;
}

const KEY_LIFETIME_MS = 24 * 60 * 60 * 1000;

/**
 * `Idempotency-Key` on a POST: the first answer is kept (successes and card errors; refused
 * parameters are not, as with the real service) and replayed with `Idempotent-Replayed: true`
 * for the same key and parameters within 24 hours. The same key on another endpoint or with
 * other parameters is a 400 `idempotency_error`. Keys are kept per API key.
 */
export function idempotency(answers: Map<string, StoredAnswer>): RequestHandler {
  return (req, res, next) => {
    const key = req.get('Idempotency-Key');
    if (req.method !== 'POST' || key === undefined) return next();
    if (key.length === 0 || key.length > 255) {
      throw new ApiError(400, {
        type: 'invalid_request_error',
        message: 'The Idempotency-Key header must be between 1 and 255 characters long.',
      });
    }
    const scope = `${res.locals.apiKey as string}\u0000${key}`;
    const endpoint = `${req.method} ${req.originalUrl.split('?')[0]}`;
    const params = canonical(req.body ?? {});
    const kept = answers.get(scope);
    const stored = kept && Date.now() - kept.at < KEY_LIFETIME_MS ? kept : undefined;
    res.set('Idempotency-Key', key);
    if (stored) {
      if (stored.endpoint !== endpoint) {
        throw new ApiError(400, {
          type: 'idempotency_error',
          message:
            `Keys for idempotent requests can only be used for the same endpoint they were first used for ` +
            `('${stored.endpoint}' vs '${endpoint}'). Try using a key other than '${key}' if you meant to execute a different request.`,
        });
      }
      if (stored.params !== params) {
        throw new ApiError(400, {
          type: 'idempotency_error',
          message:
            `Keys for idempotent requests can only be used with the same parameters they were first used with. ` +
            `Try using a key other than '${key}' if you meant to execute a different request.`,
        });
      }
      res.set('Idempotent-Replayed', 'true');
      res.set('Original-Request', stored.requestId);
      res.status(stored.status).json(stored.body);
      return;
    }
    res.locals.idempotencyKey = key;
    const send = res.json.bind(res);
    res.json = (body: unknown) => {
      if (res.statusCode < 400 || res.statusCode === 402) {
        answers.set(scope, { at: Date.now(), endpoint, params, status: res.statusCode, body, requestId: res.locals.requestId });
      }
      return send(body);
    };
    next();
  };
}

export const unknownRoute: RequestHandler = (req) => {
  throw new ApiError(404, {
    type: 'invalid_request_error',
    message: `Unrecognized request URL (${req.method}: ${req.originalUrl.split('?')[0]}). The local card fake implements only the endpoints the product uses.`,
  });
};

export const apiErrors: ErrorRequestHandler = (err, _req, res, _next) => {
  if (err instanceof ApiError) {
    res.status(err.status).json({ error: err.body });
    return;
  }
  const status = typeof err?.status === 'number' && err.status >= 400 && err.status < 500 ? err.status : 500;
  if (status < 500) {
    res.status(400).json({ error: { type: 'invalid_request_error', message: `Invalid request body: ${err.message}` } });
    return;
  }
  res.set('Stripe-Should-Retry', 'false');
  res.status(500).json({
    error: { type: 'api_error', message: `The local card fake failed: ${err instanceof Error ? err.message : String(err)}` },
  });
};
