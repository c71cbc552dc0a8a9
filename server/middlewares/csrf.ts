import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import { CUSTOMER_SESSION_COOKIE } from '../../shared/schemas/portal';
import { CSRF_COOKIE, CSRF_HEADER, SESSION_COOKIE } from '../../shared/types';
import { env, secureCookies } from '../env';
import { HttpError } from '../errors';

const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/** The key CSRF tokens are signed with, derived from the session secret for this one use. */
const key = createHmac('sha256', env.JWT_SECRET).update('guyline csrf token').digest();

function same(a: string, b: string) {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

interface Sessions {
  staff?: string | null;
  customer?: string | null;
}

const cookieOf = (req: Request, name: string) => (typeof req.cookies?.[name] === 'string' ? (req.cookies[name] as string) : '');

/** What a token is bound to: the session cookies the browser holds (either, both or none). */
function binding(s: Sessions) {
  return `${s.staff ?? ''}\n${s.customer ?? ''}`;
}

function sign(nonce: string, s: Sessions) {
  return createHmac('sha256', key).update(`${nonce}\n${binding(s)}`).digest('base64url');
}

/** A new token `<nonce>.<mac>`: the MAC ties it to the sessions, so a token from another session fails. */
function tokenFor(s: Sessions) {
  const nonce = randomBytes(18).toString('base64url');
  return `${nonce}.${sign(nonce, s)}`;
}

function validFor(token: string, s: Sessions) {
  const [nonce, mac, extra] = token.split('.');
  return !!nonce && !!mac && extra === undefined && same(mac, sign(nonce, s));
}

const sessionsOf = (req: Request): Sessions => ({ staff: cookieOf(req, SESSION_COOKIE), customer: cookieOf(req, CUSTOMER_SESSION_COOKIE) });

function setToken(res: Response, token: string) {
  res.cookie(CSRF_COOKIE, token, { httpOnly: false, sameSite: 'lax', secure: secureCookies, path: '/' });
}

/**
 * Gives the browser a token bound to the session it now holds; called where a session starts, so
 * the first write of the new session already carries a matching token.
 */
export function renewCsrfToken(req: Request, res: Response, changed: Sessions) {
  setToken(res, tokenFor({ ...sessionsOf(req), ...changed }));
}

/**
 * Double-submit CSRF with a token bound to the session (OWASP CSRF Prevention Cheat Sheet,
 * "Signed Double-Submit Cookie"): the readable `guyline_csrf` cookie holds a nonce and an HMAC of
 * the nonce with the session cookies. A write made with a session cookie must echo the cookie in
 * the X-CSRF-Token header, and the token must be the one made for that session: a token planted
 * by another page or left from another session is refused. Any response renews a token that is
 * missing or belongs to another session.
 */
export function csrf(req: Request, res: Response, next: NextFunction) {
  const cookie = cookieOf(req, CSRF_COOKIE);
  const sessions = sessionsOf(req);
  const bound = !!cookie && validFor(cookie, sessions);
  if (!bound) setToken(res, tokenFor(sessions));
  // Staff and customer sessions alike: a write made with either cookie must echo the CSRF cookie.
  if (UNSAFE.has(req.method) && (sessions.staff || sessions.customer)) {
    const header = req.get(CSRF_HEADER) ?? '';
    if (!bound || !header || !same(cookie, header)) {
      return next(new HttpError(403, 'csrf', 'The page was out of date. Reload it and try again.'));
    }
  }
  next();
}
