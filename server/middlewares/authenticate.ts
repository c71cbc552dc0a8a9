import type { NextFunction, Request, Response } from 'express';
import { unauthenticated } from '../errors';
import { Organization, Session, User } from '../models';
import { clearSessionCookie, readSessionClaims } from '../services/sessions';

export interface AuthContext {
  user: User;
  organization: Organization;
  session: Session;
}

/** Loads the signed-in user from the session cookie; a revoked, expired or disabled session is a 401. */
export async function authenticate(req: Request, res: Response, next: NextFunction) {
  const claims = readSessionClaims(req);
  if (!claims) return next(unauthenticated());
  // One query per request: the session with its user and the user's company.
  const session = (await Session.findByPk(claims.sid, {
    include: [{ model: User, as: 'user', include: [{ model: Organization, as: 'organization' }] }],
  })) as (Session & { user?: User & { organization?: Organization } }) | null;
  if (!session || session.userId !== claims.sub || session.revokedAt || session.expiresAt < new Date()) {
    clearSessionCookie(res);
    return next(unauthenticated('Your session has ended. Sign in again.'));
  }
  const user = session.user;
  if (!user || user.organizationId !== session.organizationId || user.status !== 'active') {
    clearSessionCookie(res);
    return next(unauthenticated('Your account is not active. Ask the owner of your company.'));
  }
  const organization = user.organization;
  if (!organization) return next(unauthenticated());
  req.auth = { user, organization, session };
  next();
}

/** For handlers behind `authenticate`. */
export function auth(req: Request): AuthContext {
  if (!req.auth) throw unauthenticated();
  return req.auth;
}
