import type { Request } from 'express';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { sequelize } from '../db';
import { HttpError } from '../errors';

// Counters live in PostgreSQL (table rate_limits) so every app process sees the same counts.
function limiter(keyPrefix: string, points: number, durationSeconds: number, blockSeconds = 0) {
  return new RateLimiterPostgres({
    storeClient: sequelize,
    storeType: 'sequelize',
    tableName: 'rate_limits',
    tableCreated: true,
    keyPrefix,
    points,
    duration: durationSeconds,
    blockDuration: blockSeconds,
  });
}

/** Failed sign-ins: 5 for one e-mail from one address in 15 minutes, 50 from one address in an hour. */
const loginByEmailAndIp = limiter('login_email_ip', 5, 15 * 60, 15 * 60);
const loginByIp = limiter('login_ip', 50, 60 * 60, 60 * 60);
/** Password-reset requests: 3 an hour per e-mail, 10 an hour per address. */
const resetByEmail = limiter('reset_email', 3, 60 * 60);
const resetByIp = limiter('reset_ip', 10, 60 * 60);

function tooMany(res: RateLimiterRes | null): HttpError {
  const minutes = Math.max(1, Math.ceil((res?.msBeforeNext ?? 60_000) / 60_000));
  const e = new HttpError(429, 'rate_limited', `Too many attempts. Wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again.`);
  (e as HttpError & { retryAfterSeconds?: number }).retryAfterSeconds = minutes * 60;
  return e;
}

const ip = (req: Request) => req.ip ?? 'unknown';

/** Throws a 429 when this e-mail/address has failed too often; call before checking the password. */
export async function assertLoginAllowed(req: Request, email: string) {
  const [a, b] = await Promise.all([loginByEmailAndIp.get(`${email}|${ip(req)}`), loginByIp.get(ip(req))]);
  for (const r of [a, b]) {
    if (r && r.remainingPoints <= 0) throw tooMany(r);
  }
}

export async function recordLoginFailure(req: Request, email: string) {
  try {
    await Promise.all([loginByEmailAndIp.consume(`${email}|${ip(req)}`), loginByIp.consume(ip(req))]);
  } catch (r) {
    if (r instanceof RateLimiterRes) throw tooMany(r);
    throw r;
  }
}

export async function recordLoginSuccess(req: Request, email: string) {
  await loginByEmailAndIp.delete(`${email}|${ip(req)}`);
}

/** Counts a password-reset request; a 429 once over the limit, whether the e-mail exists or not. */
export async function consumePasswordReset(req: Request, email: string) {
  try {
    await Promise.all([resetByEmail.consume(email), resetByIp.consume(ip(req))]);
  } catch (r) {
    if (r instanceof RateLimiterRes) throw tooMany(r);
    throw r;
  }
}

/** Customer sign-in links: 5 an hour per e-mail, 20 an hour per address. */
const portalLinkByEmail = limiter('portal_link_email', 5, 60 * 60);
const portalLinkByIp = limiter('portal_link_ip', 20, 60 * 60);

/** Counts a customer sign-in link request; a 429 once over the limit, whether the e-mail is known or not. */
export async function consumePortalLink(req: Request, email: string) {
  try {
    await Promise.all([portalLinkByEmail.consume(email), portalLinkByIp.consume(ip(req))]);
  } catch (r) {
    if (r instanceof RateLimiterRes) throw tooMany(r);
    throw r;
  }
}
