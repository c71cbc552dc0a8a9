import type { Request, Response } from 'express';
import jwt from 'jsonwebtoken';
import { renewCsrfToken } from '../middlewares/csrf';
import { CUSTOMER_SESSION_COOKIE } from '../../shared/schemas/portal';
import { env, secureCookies } from '../env';
import { col, fn, Op, where as sqlWhere } from 'sequelize';
import type { Transaction } from '../db';
import { Customer, CustomerSession, CustomerSignInToken, Organization } from '../models';
import { queueMail } from './mailer';
import { newToken } from './tokens';

/** A customer's session lasts a week; signing out or a new link does not end the others. */
const CUSTOMER_SESSION_DAYS = 7;
const AUDIENCE = 'guyline-customer';

interface CustomerClaims {
  csid: string;
  email: string;
  /** The one company whose pages this session opens. */
  org: string;
}

/** Starts a session on the customer's pages of one company (a new sign-in replaces the cookie, so one company at a time). */
export async function startCustomerSession(req: Request, res: Response, email: string, organizationId: string) {
  const expiresAt = new Date(Date.now() + CUSTOMER_SESSION_DAYS * 86_400_000);
  const session = await CustomerSession.create({ organizationId, email, expiresAt, ip: req.ip ?? null, userAgent: (req.get('user-agent') ?? '').slice(0, 400) || null });
  const token = jwt.sign({ csid: session.id, email, org: organizationId } satisfies CustomerClaims, env.JWT_SECRET, {
    expiresIn: CUSTOMER_SESSION_DAYS * 86_400,
    algorithm: 'HS256',
    audience: AUDIENCE,
  });
  res.cookie(CUSTOMER_SESSION_COOKIE, token, { httpOnly: true, sameSite: 'lax', secure: secureCookies, path: '/', expires: expiresAt });
  // The CSRF token is bound to the session: the new session's first write needs a new one.
  renewCsrfToken(req, res, { customer: token });
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
  if (!session || session.revokedAt || session.expiresAt < new Date() || session.email !== claims.email || session.organizationId !== claims.org) return null;
  return session;
}

export function clearCustomerSessionCookie(res: Response) {
  res.clearCookie(CUSTOMER_SESSION_COOKIE, { httpOnly: true, sameSite: 'lax', secure: secureCookies, path: '/' });
}

/** How long a customer's e-mailed sign-in link works. */
export const SIGN_IN_LINK_MINUTES = 15;

/**
 * Mails a sign-in link for each company that has this address on a customer record (each link
 * opens that company's pages only); nothing when none has. Runs in the `account-request` job
 * (jobs/accountRequests.ts), so the request's answer and its time are the same either way.
 */
export async function mailPortalSignInLinks(email: string, next: string | null, transaction: Transaction) {
  const companies = await Customer.findAll({
    where: sqlWhere(fn('lower', col('email')), email.toLowerCase()),
    attributes: ['organizationId'],
    group: ['organizationId'],
    raw: true,
    transaction,
  });
  if (companies.length === 0) return 0;
  const organizations = await Organization.findAll({ where: { id: { [Op.in]: companies.map((c) => c.organizationId) } }, attributes: ['id', 'name'], transaction });
  for (const organization of organizations) {
    const { token, hash } = newToken();
    await CustomerSignInToken.create(
      { organizationId: organization.id, email, tokenHash: hash, next, expiresAt: new Date(Date.now() + SIGN_IN_LINK_MINUTES * 60_000) },
      { transaction },
    );
    await queueMail(organization.id, email, 'portal-sign-in', { companyName: organization.name, link: `${env.APP_URL}/portal/welcome?token=${token}` }, transaction);
  }
  return organizations.length;
}
