import type { NextFunction, Request, Response } from 'express';
import type { InferAttributes } from 'sequelize';
import { preparedQuery } from '../db';
import { unauthenticated } from '../errors';
import { Organization, Session, User } from '../models';
import { clearSessionCookie, readSessionClaims, type SessionClaims } from '../services/sessions';

export interface AuthContext {
  user: User;
  organization: Organization;
  session: Session;
}

/** `"alias"."column" AS "alias.attribute"` for every attribute of a model, for a hand-written join read back nested. */
function columnsOf(model: { getAttributes(): Record<string, { field?: string }> }, alias: string) {
  return Object.entries(model.getAttributes())
    .map(([name, a]) => `"${alias}"."${a.field ?? name}" AS "${alias}.${name}"`)
    .join(', ');
}

let sessionQuery: string | null = null;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * The session with its user and the user's company, in one query written out: Sequelize's nested
 * include took longer to build and read than the query took to run, on every signed-in request
 * (npm run bench, bookings list). The rows become model instances as findByPk would make them.
 */
async function loadSession(sid: string) {
  sessionQuery ??= `SELECT ${columnsOf(Session, 's')}, ${columnsOf(User, 'u')}, ${columnsOf(Organization, 'o')}
    FROM sessions s
    LEFT JOIN users u ON u.id = s.user_id
    LEFT JOIN organizations o ON o.id = u.organization_id
   WHERE s.id = $1`;
  // Left joins: a session whose user or company is gone reads back with their ids null. A
  // prepared statement: planned once per pooled connection, not on every request.
  const [flat] = await preparedQuery<Record<string, unknown>>('auth-session', sessionQuery, [sid]);
  if (!flat) return null;
  // "s.id" -> row.s.id: the three models' attributes side by side.
  const row = { s: {}, u: {}, o: {} } as { s: InferAttributes<Session>; u: InferAttributes<User>; o: InferAttributes<Organization> };
  for (const [key, value] of Object.entries(flat)) {
    const dot = key.indexOf('.');
    (row[key.slice(0, dot) as 's' | 'u' | 'o'] as unknown as Record<string, unknown>)[key.slice(dot + 1)] = value;
  }
  const built = { isNewRecord: false, raw: true };
  return {
    session: Session.build(row.s, built),
    user: row.u.id === null ? undefined : User.build(row.u, built),
    organization: row.o.id === null ? undefined : Organization.build(row.o, built),
  };
}

/**
 * The session of verified claims, with its user and company; a revoked, expired or disabled
 * session throws the 401 (and clears the cookie).
 */
export async function resolveSession(claims: SessionClaims, res: Response): Promise<AuthContext> {
  // One query per request: the session with its user and the user's company.
  const found = UUID.test(claims.sid) ? await loadSession(claims.sid) : null;
  const session = found?.session;
  if (!session || session.userId !== claims.sub || session.revokedAt || session.expiresAt < new Date()) {
    clearSessionCookie(res);
    throw unauthenticated('Your session has ended. Sign in again.');
  }
  const user = found.user;
  if (!user || user.organizationId !== session.organizationId || user.status !== 'active') {
    clearSessionCookie(res);
    throw unauthenticated('Your account is not active. Ask the owner of your company.');
  }
  const organization = found.organization;
  if (!organization) throw unauthenticated();
  return { user, organization, session };
}

/** Loads the signed-in user from the session cookie; a revoked, expired or disabled session is a 401. */
export async function authenticate(req: Request, res: Response, next: NextFunction) {
  const claims = readSessionClaims(req);
  if (!claims) return next(unauthenticated());
  try {
    req.auth = await resolveSession(claims, res);
  } catch (err) {
    return next(err);
  }
  next();
}

/** The cookie's verified claims, or a 401 before anything else is done (for routes that overlap the session check with their read). */
export function requireClaims(req: Request, _res: Response, next: NextFunction) {
  const claims = readSessionClaims(req);
  if (!claims) return next(unauthenticated());
  req.claims = claims;
  next();
}

/** For handlers behind `authenticate`. */
export function auth(req: Request): AuthContext {
  if (!req.auth) throw unauthenticated();
  return req.auth;
}
