import { Router } from 'express';
import {
  InviteAccept, LoginRequest, PasswordResetConfirm, PasswordResetRequest, SignupConfirm, SignupRequest, Token, type SignupAccepted,
} from '../../../shared/schemas/auth';
import { z } from 'zod';
import { withTransaction } from '../../db';
import { acceptInvite, confirmPasswordReset, findLiveToken, verifyCredentials } from '../../commands/accounts';
import { confirmSignup, requestSignup, SIGNUP_ACCEPTED } from '../../commands/signups';
import type { AccountRequest } from '../../jobs/accountRequests';
import { audit } from '../../commands/audit';
import { HttpError } from '../../errors';
import { auth, authenticate } from '../../middlewares/authenticate';
import { beginLoginAttempt, consumePasswordReset, consumeSignup } from '../../middlewares/rateLimit';
import { parsed, validate } from '../../middlewares/validate';
import { Organization, Session } from '../../models';
import { presentMe } from '../../presenters/me';
import { queueJob } from '../../services/jobs';
import { assertNewPassword, hashPassword } from '../../services/passwords';
import { clearSessionCookie, revokeAllSessions, startSession } from '../../services/sessions';

export const authRouter = Router();

/**
 * A sign-up is answered the same for every address, with the same work (the password's hash on a
 * worker thread, one request row, one job); the e-mail says the rest (commands/signups.ts).
 */
authRouter.post('/signup', validate(SignupRequest), async (req, res) => {
  const input = parsed<SignupRequest>(res);
  await assertNewPassword(input.password);
  await consumeSignup(req, input.email);
  const passwordHash = await hashPassword(input.password);
  await withTransaction((t) => requestSignup({ ...input, passwordHash }, req, t));
  res.status(202).json({ message: SIGNUP_ACCEPTED } satisfies SignupAccepted);
});

/** The e-mailed link: makes the company and its owner, and signs the owner in. */
authRouter.post('/signup/confirm', validate(SignupConfirm), async (req, res) => {
  const { token } = parsed<SignupConfirm>(res);
  const { user, organization } = await withTransaction(async (t) => {
    const created = await confirmSignup(token, req, t);
    await startSession(req, res, created.user, t);
    return created;
  });
  res.status(201).json(presentMe(user, organization));
});

authRouter.post('/login', validate(LoginRequest), async (req, res) => {
  const { email, password } = parsed<LoginRequest>(res);
  // Counted before the password is checked, so parallel guesses cannot slip past the limit.
  const attempt = await beginLoginAttempt(req, email);
  const user = await verifyCredentials(email, password);
  if (!user) throw new HttpError(401, 'invalid_credentials', 'E-mail or password is not right.');
  await attempt.succeeded();
  const organization = await Organization.findByPk(user.organizationId);
  await withTransaction(async (t) => {
    await startSession(req, res, user, t);
    await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'user.signed_in', subjectType: 'user', subjectId: user.id }, req, t);
  });
  res.json(presentMe(user, organization!));
});

authRouter.post('/logout', authenticate, async (req, res) => {
  const { session } = auth(req);
  await Session.update({ revokedAt: new Date() }, { where: { id: session.id } });
  clearSessionCookie(res);
  res.status(204).end();
});

authRouter.post('/logout-all', authenticate, async (req, res) => {
  const { user } = auth(req);
  await withTransaction(async (t) => {
    await revokeAllSessions(user.id, t);
    await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'user.signed_out_everywhere', subjectType: 'user', subjectId: user.id }, req, t);
  });
  clearSessionCookie(res);
  res.status(204).end();
});

authRouter.get('/me', authenticate, (req, res) => {
  const { user, organization } = auth(req);
  res.json(presentMe(user, organization));
});

authRouter.post('/password-reset/request', validate(PasswordResetRequest), async (req, res) => {
  const { email } = parsed<PasswordResetRequest>(res);
  await consumePasswordReset(req, email);
  // The job looks the address up: the same work, answer and time whether or not it has an account.
  await queueJob('account-request', { kind: 'password-reset', email, requestedFrom: req.ip ?? null } satisfies AccountRequest);
  res.status(202).json({ message: 'If that address has an account, a link is on its way.' });
});

authRouter.post('/password-reset/confirm', validate(PasswordResetConfirm), async (req, res) => {
  const input = parsed<PasswordResetConfirm>(res);
  await withTransaction((t) => confirmPasswordReset(input, req, t));
  clearSessionCookie(res);
  res.status(204).end();
});

authRouter.get('/invites/:token', validate(z.object({ token: Token }), 'params'), async (req, res) => {
  const { token } = parsed<{ token: string }>(res, 'params');
  const { user } = await findLiveToken(token, 'invite');
  if (user.status !== 'invited') throw new HttpError(400, 'invalid_token', 'This invitation was withdrawn. Ask the owner for a new one.');
  const organization = await Organization.findByPk(user.organizationId);
  res.json({ email: user.email, name: user.name, role: user.role, organizationName: organization!.name });
});

authRouter.post('/invites/accept', validate(InviteAccept), async (req, res) => {
  const input = parsed<InviteAccept>(res);
  const user = await withTransaction(async (t) => {
    const u = await acceptInvite(input, req, t);
    await startSession(req, res, u, t);
    return u;
  });
  const organization = await Organization.findByPk(user.organizationId);
  res.json(presentMe(user, organization!));
});
