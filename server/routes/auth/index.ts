import { Router } from 'express';
import {
  InviteAccept, LoginRequest, PasswordResetConfirm, PasswordResetRequest, SignupRequest, Token,
} from '../../../shared/schemas/auth';
import { z } from 'zod';
import { withTransaction } from '../../db';
import {
  acceptInvite, confirmPasswordReset, findLiveToken, requestPasswordReset, signup, verifyCredentials,
} from '../../commands/accounts';
import { audit } from '../../commands/audit';
import { HttpError } from '../../errors';
import { auth, authenticate } from '../../middlewares/authenticate';
import { assertLoginAllowed, consumePasswordReset, recordLoginFailure, recordLoginSuccess } from '../../middlewares/rateLimit';
import { parsed, validate } from '../../middlewares/validate';
import { Organization, Session } from '../../models';
import { presentMe } from '../../presenters/me';
import { clearSessionCookie, revokeAllSessions, startSession } from '../../services/sessions';

export const authRouter = Router();

authRouter.post('/signup', validate(SignupRequest), async (req, res) => {
  const input = parsed<SignupRequest>(res);
  const { user, organization } = await withTransaction(async (t) => {
    const created = await signup(input, req, t);
    await startSession(req, res, created.user, t);
    return created;
  });
  res.status(201).json(presentMe(user, organization));
});

authRouter.post('/login', validate(LoginRequest), async (req, res) => {
  const { email, password } = parsed<LoginRequest>(res);
  await assertLoginAllowed(req, email);
  const user = await verifyCredentials(email, password);
  if (!user) {
    await recordLoginFailure(req, email);
    throw new HttpError(401, 'invalid_credentials', 'E-mail or password is not right.');
  }
  await recordLoginSuccess(req, email);
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
  await withTransaction((t) => requestPasswordReset(email, req, t));
  // The same answer whether or not the address has an account.
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
