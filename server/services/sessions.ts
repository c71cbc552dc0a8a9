import { createSecretKey, type KeyObject } from 'node:crypto';
import type { Request, Response } from 'express';
import jwt from 'jsonwebtoken';
import { renewCsrfToken } from '../middlewares/csrf';
import { Op } from 'sequelize';
import { SESSION_COOKIE } from '../../shared/types';
import type { Transaction } from '../db';
import { env, secureCookies } from '../env';
import { CalendarFeed, Session, type User } from '../models';

export interface SessionClaims {
  sid: string;
  sub: string;
  /**
   * The company the session was opened in (tokens from before it was added have none). Signed, so
   * a read may start on it while the session is checked; nothing is answered before the check.
   */
  org?: string;
}

// Given the secret as a string, jsonwebtoken makes a key of it on every call, first by trying it as
// a PEM public key and catching the failure: over a millisecond of every signed-in request (npm run
// bench, bookings list). The same secret as a key object, made once.
let signingKey: { secret: string; key: KeyObject } | null = null;
function sessionKey() {
  if (signingKey?.secret !== env.JWT_SECRET) signingKey = { secret: env.JWT_SECRET, key: createSecretKey(Buffer.from(env.JWT_SECRET, 'utf8')) };
  return signingKey.key;
}

export async function startSession(req: Request, res: Response, user: User, transaction?: Transaction) {
  const expiresAt = new Date(Date.now() + env.SESSION_DAYS * 86_400_000);
  const session = await Session.create(
    {
      organizationId: user.organizationId,
      userId: user.id,
      expiresAt,
      ip: req.ip ?? null,
      userAgent: (req.get('user-agent') ?? '').slice(0, 400) || null,
    },
    { transaction },
  );
  user.lastSignInAt = new Date();
  await user.save({ transaction });
  const token = jwt.sign({ sid: session.id, sub: user.id, org: user.organizationId } satisfies SessionClaims, sessionKey(), {
    expiresIn: env.SESSION_DAYS * 86_400,
    algorithm: 'HS256',
  });
  res.cookie(SESSION_COOKIE, token, {
    httpOnly: true,
    sameSite: 'lax',
    secure: secureCookies,
    path: '/',
    expires: expiresAt,
  });
  // The CSRF token is bound to the session: the new session's first write needs a new one.
  renewCsrfToken(req, res, { staff: token });
  return session;
}

export function readSessionClaims(req: Request): SessionClaims | null {
  const token = req.cookies?.[SESSION_COOKIE];
  if (!token || typeof token !== 'string') return null;
  try {
    const claims = jwt.verify(token, sessionKey(), { algorithms: ['HS256'] }) as SessionClaims;
    if (typeof claims.sid !== 'string' || typeof claims.sub !== 'string') return null;
    return { sid: claims.sid, sub: claims.sub, org: typeof claims.org === 'string' ? claims.org : undefined };
  } catch {
    return null;
  }
}

export function clearSessionCookie(res: Response) {
  res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: 'lax', secure: secureCookies, path: '/' });
}

/**
 * Signs out every browser of the user (sign out everywhere, disabled user, new password). The
 * person's calendar feed address goes too: it is a key to their stops like a session is, and
 * whoever is locking a lost phone or a leaked password out means that address as well.
 */
export async function revokeAllSessions(userId: string, transaction?: Transaction) {
  await Session.update(
    { revokedAt: new Date() },
    { where: { userId, revokedAt: { [Op.is]: null } }, transaction },
  );
  await CalendarFeed.update({ revokedAt: new Date() }, { where: { userId, revokedAt: { [Op.is]: null } }, transaction });
}
