import { createHash } from 'node:crypto';
import { setTimeout as sleep } from 'node:timers/promises';
import type { Request } from 'express';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { QueryTypes } from 'sequelize';
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

/**
 * Sign-in attempts, counted before the password is checked (the count is one atomic upsert, so
 * parallel attempts cannot all read "under the limit" and then guess): 5 for one e-mail from one
 * address in 15 minutes, 50 from one address in an hour. A right password gives its point back.
 */
const loginByEmailAndIp = limiter('login_email_ip', 5, 15 * 60, 15 * 60);
const loginByIp = limiter('login_ip', 50, 60 * 60, 60 * 60);
/** Per account, from every address together: 10 attempts an hour at full speed, then slowed (below). */
export const LOGIN_ACCOUNT_FREE_ATTEMPTS = 10;
const loginByAccount = limiter('login_account', LOGIN_ACCOUNT_FREE_ATTEMPTS, 60 * 60);
/**
 * Past the account's free attempts, attempts on it take turns: one every LOGIN_SLOT_MS, each
 * answered when its turn comes, so guessing from many addresses at once gains nothing. An attempt
 * whose turn is more than LOGIN_MAX_WAIT_MS away is told to come back in a few seconds. Nothing
 * locks the account: the person gets in with a wait, and not even that from an address they have
 * signed in from in the last LOGIN_KNOWN_ADDRESS_DAYS (common practice, no published source).
 */
export const LOGIN_SLOT_MS = 2_000;
export const LOGIN_MAX_WAIT_MS = 10_000;
const LOGIN_KNOWN_ADDRESS_DAYS = 30;

function tooMany(res: RateLimiterRes | null): HttpError {
  const minutes = Math.max(1, Math.ceil((res?.msBeforeNext ?? 60_000) / 60_000));
  const e = new HttpError(429, 'rate_limited', `Too many attempts. Wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again.`);
  (e as HttpError & { retryAfterSeconds?: number }).retryAfterSeconds = minutes * 60;
  return e;
}

function tooManyForNow(ms: number): HttpError {
  const seconds = Math.max(1, Math.ceil(ms / 1000));
  const e = new HttpError(429, 'rate_limited', `Too many sign-in attempts on this account just now. Wait ${seconds} seconds and try again.`);
  (e as HttpError & { retryAfterSeconds?: number }).retryAfterSeconds = seconds;
  return e;
}

const ip = (req: Request) => req.ip ?? 'unknown';

/** An e-mail as part of a key: a long one by its SHA-256, so prefix, e-mail and address fit `rate_limits.key` (255). */
const emailKey = (email: string) => (email.length > 100 ? createHash('sha256').update(email).digest('hex') : email);

async function consumeAll(consumes: Promise<unknown>[]) {
  try {
    await Promise.all(consumes);
  } catch (r) {
    if (r instanceof RateLimiterRes) throw tooMany(r);
    throw r;
  }
}

/** Whether the account with this e-mail has started a session from this address lately. */
async function signedInFromHere(email: string, address: string) {
  const rows = await sequelize.query(
    `SELECT 1 FROM sessions s JOIN users u ON u.id = s.user_id
      WHERE u.email = :email AND u.password_hash IS NOT NULL AND s.ip = :address
        AND s.created_at > now() - make_interval(days => :days)
      LIMIT 1`,
    { replacements: { email, address, days: LOGIN_KNOWN_ADDRESS_DAYS }, type: QueryTypes.SELECT },
  );
  return rows.length > 0;
}

/**
 * Takes this attempt's turn on the account: the next free turn, one LOGIN_SLOT_MS after the last
 * one given (in the database's clock, one row in rate_limits, so every process shares the turns).
 * Returns how long to wait for it; throws a 429 when it is further off than LOGIN_MAX_WAIT_MS.
 */
async function takeAccountTurn(email: string): Promise<number> {
  const key = `login_turn:${emailKey(email)}`;
  const [rows] = (await sequelize.query(
    `INSERT INTO rate_limits AS r (key, points, expire)
       VALUES (:key, 1, (extract(epoch FROM clock_timestamp()) * 1000)::bigint + :slot)
     ON CONFLICT (key) DO UPDATE
       SET points = r.points + 1, expire = GREATEST(r.expire, EXCLUDED.expire - :slot) + :slot
       WHERE r.expire - (EXCLUDED.expire - :slot) <= :maxWait
     RETURNING expire - :slot - (extract(epoch FROM clock_timestamp()) * 1000)::bigint AS wait`,
    { replacements: { key, slot: LOGIN_SLOT_MS, maxWait: LOGIN_MAX_WAIT_MS } },
  )) as [{ wait: string }[], unknown];
  if (rows.length === 0) {
    const [[row]] = (await sequelize.query(
      `SELECT expire - (extract(epoch FROM clock_timestamp()) * 1000)::bigint AS ahead FROM rate_limits WHERE key = :key`,
      { replacements: { key } },
    )) as [{ ahead: string }[], unknown];
    throw tooManyForNow(Math.max(LOGIN_SLOT_MS, Number(row?.ahead ?? 0) - LOGIN_MAX_WAIT_MS));
  }
  return Math.max(0, Number(rows[0].wait));
}

export interface LoginAttempt {
  /** The password was right: this attempt no longer counts against the address or the account. */
  succeeded(): Promise<void>;
}

/**
 * Counts a sign-in attempt before the password is checked. Throws a 429 past the limits of the
 * e-mail and address; past the account's free attempts, waits for the account's next turn.
 */
export async function beginLoginAttempt(req: Request, typedEmail: string): Promise<LoginAttempt> {
  const address = ip(req);
  const email = emailKey(typedEmail);
  await consumeAll([loginByEmailAndIp.consume(`${email}|${address}`), loginByIp.consume(address)]);
  let countedOnAccount = false;
  if (!(await signedInFromHere(typedEmail, address))) {
    countedOnAccount = true;
    const over = await loginByAccount.consume(email).then(() => false, (r) => {
      if (r instanceof RateLimiterRes) return true;
      throw r;
    });
    if (over) {
      const wait = await takeAccountTurn(email);
      if (wait > 0) await sleep(wait);
    }
  }
  return {
    async succeeded() {
      await Promise.all([
        loginByEmailAndIp.delete(`${email}|${address}`),
        loginByIp.reward(address, 1),
        countedOnAccount ? loginByAccount.reward(email, 1) : null,
      ]);
    },
  };
}

/** Password-reset requests: 3 an hour per e-mail, 10 an hour per address. */
const resetByEmail = limiter('reset_email', 3, 60 * 60);
const resetByIp = limiter('reset_ip', 10, 60 * 60);

/** Counts a password-reset request; a 429 once over the limit, whether the e-mail exists or not. */
export async function consumePasswordReset(req: Request, email: string) {
  try {
    await Promise.all([resetByEmail.consume(emailKey(email)), resetByIp.consume(ip(req))]);
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
    await Promise.all([portalLinkByEmail.consume(emailKey(email)), portalLinkByIp.consume(ip(req))]);
  } catch (r) {
    if (r instanceof RateLimiterRes) throw tooMany(r);
    throw r;
  }
}

/**
 * Sign-ups: each one costs a bcrypt hash and an e-mail, so 5 an hour per address, 3 an hour per
 * e-mail (nobody's inbox is flooded with links), and SIGNUPS_PER_HOUR from everyone together, which
 * bounds the work whatever the number of addresses. The shared limit is taken only by requests
 * that pass their own address's and e-mail's, so one address cannot use it up.
 */
export const SIGNUPS_PER_HOUR = 100;

export function signupLimits(opts: { prefix?: string; perAddress?: number; perEmail?: number; overall?: number } = {}) {
  const prefix = opts.prefix ?? 'signup';
  const byIp = limiter(`${prefix}_ip`, opts.perAddress ?? 5, 60 * 60);
  const byEmail = limiter(`${prefix}_email`, opts.perEmail ?? 3, 60 * 60);
  const overall = limiter(`${prefix}_all`, opts.overall ?? SIGNUPS_PER_HOUR, 60 * 60);
  /** Counts a sign-up; a 429 once over a limit, whether or not the address has an account. */
  return async function consumeSignup(req: Request, email: string) {
    await consumeAll([byIp.consume(ip(req)), byEmail.consume(emailKey(email))]);
    await consumeAll([overall.consume('all')]);
  };
}

export const consumeSignup = signupLimits();
