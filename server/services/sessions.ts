import type { Request, Response } from 'express';
import jwt from 'jsonwebtoken';
import { Op } from 'sequelize';
import { SESSION_COOKIE } from '../../shared/types';
import type { Transaction } from '../db';
import { env, secureCookies } from '../env';
import { Session, type User } from '../models';

interface SessionClaims {
  sid: string;
  sub: string;
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
  const token = jwt.sign({ sid: session.id, sub: user.id } satisfies SessionClaims, env.JWT_SECRET, {
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
  return session;
}

export function readSessionClaims(req: Request): SessionClaims | null {
  const token = req.cookies?.[SESSION_COOKIE];
  if (!token || typeof token !== 'string') return null;
  try {
    const claims = jwt.verify(token, env.JWT_SECRET, { algorithms: ['HS256'] }) as SessionClaims;
    return typeof claims.sid === 'string' && typeof claims.sub === 'string' ? claims : null;
  } catch {
    return null;
  }
}

export function clearSessionCookie(res: Response) {
  res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: 'lax', secure: secureCookies, path: '/' });
}

/** Signs out every browser of the user (sign out everywhere, disabled user, new password). */
export async function revokeAllSessions(userId: string, transaction?: Transaction) {
  await Session.update(
    { revokedAt: new Date() },
    { where: { userId, revokedAt: { [Op.is]: null } }, transaction },
  );
}
