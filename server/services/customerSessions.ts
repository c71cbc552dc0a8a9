import type { Request, Response } from 'express';
import jwt from 'jsonwebtoken';
import { CUSTOMER_SESSION_COOKIE } from '../../shared/schemas/portal';
import { env, secureCookies } from '../env';
import { CustomerSession } from '../models';

/** A customer's session lasts a week; signing out or a new link does not end the others. */
const CUSTOMER_SESSION_DAYS = 7;
const AUDIENCE = 'guyline-customer';

interface CustomerClaims {
  csid: string;
  email: string;
}

export async function startCustomerSession(req: Request, res: Response, email: string) {
  const expiresAt = new Date(Date.now() + CUSTOMER_SESSION_DAYS * 86_400_000);
  const session = await CustomerSession.create({ email, expiresAt, ip: req.ip ?? null, userAgent: (req.get('user-agent') ?? '').slice(0, 400) || null });
  const token = jwt.sign({ csid: session.id, email } satisfies CustomerClaims, env.JWT_SECRET, {
    expiresIn: CUSTOMER_SESSION_DAYS * 86_400,
    algorithm: 'HS256',
    audience: AUDIENCE,
  });
  res.cookie(CUSTOMER_SESSION_COOKIE, token, { httpOnly: true, sameSite: 'lax', secure: secureCookies, path: '/', expires: expiresAt });
  return session;
}

/** The customer's live session from the cookie, or null (expired, revoked, tampered or absent). */
export async function readCustomerSession(req: Request): Promise<CustomerSession | null> {
  const raw = req.cookies?.[CUSTOMER_SESSION_COOKIE];
  if (typeof raw !== 'string' || !raw) return null;
  let claims: CustomerClaims;
  try {
    claims = jwt.verify(raw, env.JWT_SECRET, { algorithms: ['HS256'], audience: AUDIENCE }) as CustomerClaims;
  } catch {
    return null;
  }
  const session = await CustomerSession.findByPk(claims.csid);
  if (!session || session.revokedAt || session.expiresAt < new Date() || session.email !== claims.email) return null;
  return session;
}

export function clearCustomerSessionCookie(res: Response) {
  res.clearCookie(CUSTOMER_SESSION_COOKIE, { httpOnly: true, sameSite: 'lax', secure: secureCookies, path: '/' });
}
