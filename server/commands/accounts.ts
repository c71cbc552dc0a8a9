import type { Request } from 'express';
import { Op, UniqueConstraintError } from 'sequelize';
import { ROLE_LABELS, type Role } from '../../shared/types';
import type { Transaction } from '../db';
import { env } from '../env';
import { badRequest, conflict, HttpError } from '../errors';
import { AuthToken, Organization, User } from '../models';
import type { TokenPurpose } from '../models/AuthToken';
import { queueMail } from '../services/mailer';
import { revokeAllSessions } from '../services/sessions';
import { hashToken, newToken } from '../services/tokens';
import { checkPassword, DEMO_PASSWORD, demoOn, hashNewPassword } from '../services/passwords';
import { audit } from './audit';

export { hashPassword } from '../services/passwords';
export const INVITE_DAYS = 7;
export const RESET_MINUTES = 60;

/**
 * The account that signs in with this e-mail: the one user with a password. Invitations (users
 * without one) never are: several companies may invite the same address (migration 20261205-0010).
 */
export function accountOf(email: string, transaction?: Transaction) {
  return User.findOne({ where: { email, passwordHash: { [Op.ne]: null } }, transaction });
}

/** Checks an e-mail and password; null when either is wrong or the account cannot sign in. */
export async function verifyCredentials(email: string, password: string): Promise<User | null> {
  if (password === DEMO_PASSWORD && !demoOn()) {
    // Whatever the address: says nothing about accounts, and a demo sign-in left in a real
    // database (a seed run by mistake) opens nothing.
    throw new HttpError(401, 'demo_password', 'The demo password works only in the demo. If this account has it, reset the password to choose your own.');
  }
  const user = await accountOf(email);
  const ok = await checkPassword(password, user?.passwordHash ?? null);
  if (!user || !ok || user.status !== 'active') return null;
  return user;
}

async function issueToken(user: User, purpose: TokenPurpose, ttlMs: number, transaction: Transaction) {
  // A new link replaces any unused one of the same kind.
  await AuthToken.update(
    { usedAt: new Date() },
    { where: { userId: user.id, purpose, usedAt: { [Op.is]: null } }, transaction },
  );
  const { token, hash } = newToken();
  await AuthToken.create(
    { organizationId: user.organizationId, userId: user.id, purpose, tokenHash: hash, expiresAt: new Date(Date.now() + ttlMs) },
    { transaction },
  );
  return token;
}

/** Finds a live token and locks it; throws a 400 `invalid_token` when it is unknown, used or expired. */
export async function findLiveToken(token: string, purpose: TokenPurpose, transaction?: Transaction) {
  const row = await AuthToken.findOne({
    where: { tokenHash: hashToken(token), purpose },
    transaction,
    lock: transaction ? transaction.LOCK.UPDATE : undefined,
  });
  if (!row || row.usedAt || row.expiresAt < new Date()) {
    throw badRequest(
      purpose === 'invite'
        ? 'This invitation link has expired or was already used. Ask the owner for a new one.'
        : 'This reset link has expired or was already used. Ask for a new one.',
      undefined,
      'invalid_token',
    );
  }
  const user = await User.findByPk(row.userId, { transaction });
  if (!user) throw badRequest('This link is no longer valid.', undefined, 'invalid_token');
  return { row, user };
}

export async function inviteUser(
  actor: User,
  input: { email: string; name: string; role: Role },
  req: Request,
  transaction: Transaction,
) {
  // Only this company's own people are looked at: whether the address has an account with
  // another company is never told (the invitation goes out the same; see acceptInvite).
  const taken = () => conflict('That e-mail already belongs to someone in your company.', 'email_taken', { email: 'That e-mail already belongs to someone in your company.' });
  if (await User.findOne({ where: { organizationId: actor.organizationId, email: input.email }, transaction })) throw taken();
  const user = await User.create(
    { organizationId: actor.organizationId, name: input.name, email: input.email, passwordHash: null, role: input.role, status: 'invited' },
    { transaction },
  ).catch((err: unknown) => {
    // Two invitations of the same address at once: the index on (organization_id, email) lets one in.
    throw err instanceof UniqueConstraintError ? taken() : err;
  });
  await sendInvite(actor, user, req, transaction);
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'user.invited', subjectType: 'user', subjectId: user.id, data: { email: user.email, role: user.role } }, req, transaction);
  return user;
}

export async function sendInvite(actor: User, user: User, _req: Request, transaction: Transaction) {
  const organization = await Organization.findByPk(user.organizationId, { transaction });
  const token = await issueToken(user, 'invite', INVITE_DAYS * 86_400_000, transaction);
  await queueMail(
    user.organizationId,
    user.email,
    'invite',
    {
      name: user.name,
      inviterName: actor.name,
      organizationName: organization!.name,
      roleLabel: ROLE_LABELS[user.role].toLowerCase(),
      days: INVITE_DAYS,
      link: `${env.APP_URL}/invite?token=${token}`,
    },
    transaction,
  );
}

export async function acceptInvite(input: { token: string; name?: string; password: string }, req: Request, transaction: Transaction) {
  const { row, user } = await findLiveToken(input.token, 'invite', transaction);
  if (user.status !== 'invited') throw badRequest('This invitation was withdrawn. Ask the owner for a new one.', undefined, 'invalid_token');
  // Told only to whoever holds the link, which went to that mailbox: nothing is revealed.
  const taken = () =>
    conflict(
      'This address already has a Guyline account, with another company. One address signs in to one company: ask the owner to invite another address of yours.',
      'email_taken',
    );
  if (await accountOf(user.email, transaction)) throw taken();
  user.passwordHash = await hashNewPassword(input.password);
  if (input.name) user.name = input.name;
  user.status = 'active';
  try {
    await user.save({ transaction });
  } catch (err) {
    // The same address became an account at this moment (a sign-up confirmed at once).
    if (err instanceof UniqueConstraintError) throw taken();
    throw err;
  }
  row.usedAt = new Date();
  await row.save({ transaction });
  await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'user.joined', subjectType: 'user', subjectId: user.id }, req, transaction);
  return user;
}

/**
 * Sends a reset link when the e-mail belongs to an active account; nothing otherwise. Runs in the
 * `account-request` job (jobs/accountRequests.ts), so the request's answer and its time are the
 * same either way.
 */
export async function requestPasswordReset(email: string, requestedFrom: string | null, transaction: Transaction) {
  const user = await accountOf(email, transaction);
  if (!user || user.status !== 'active') return;
  const organization = await Organization.findByPk(user.organizationId, { transaction });
  const token = await issueToken(user, 'password_reset', RESET_MINUTES * 60_000, transaction);
  await queueMail(
    user.organizationId,
    user.email,
    'password-reset',
    { name: user.name, organizationName: organization!.name, minutes: RESET_MINUTES, link: `${env.APP_URL}/reset-password?token=${token}` },
    transaction,
  );
  await audit(
    { organizationId: user.organizationId, actorUserId: null, action: 'user.password_reset_requested', subjectType: 'user', subjectId: user.id, data: { requestedFrom } },
    null,
    transaction,
  );
}

export async function confirmPasswordReset(input: { token: string; password: string }, req: Request, transaction: Transaction) {
  const { row, user } = await findLiveToken(input.token, 'password_reset', transaction);
  if (user.status !== 'active') throw badRequest('This account is not active.', undefined, 'invalid_token');
  user.passwordHash = await hashNewPassword(input.password);
  await user.save({ transaction });
  row.usedAt = new Date();
  await row.save({ transaction });
  await revokeAllSessions(user.id, transaction);
  await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'user.password_reset', subjectType: 'user', subjectId: user.id }, req, transaction);
  return user;
}

/** Changes a user's role or disables/enables them, keeping at least one active owner. */
export async function updateUser(
  actor: User,
  target: User,
  input: { role?: Role; disabled?: boolean },
  req: Request,
  transaction: Transaction,
) {
  const before = { role: target.role, status: target.status };
  if (input.role !== undefined) target.role = input.role;
  if (input.disabled !== undefined) {
    if (input.disabled) target.status = 'disabled';
    else if (target.status === 'disabled') target.status = target.passwordHash ? 'active' : 'invited';
  }
  const losesOwner = before.role === 'owner' && before.status === 'active' && (target.role !== 'owner' || target.status !== 'active');
  if (losesOwner) {
    // Lock the organization's owners so two concurrent changes cannot both remove "the other" owner.
    const owners = await User.findAll({
      where: { organizationId: actor.organizationId, role: 'owner', status: 'active' },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (owners.filter((o) => o.id !== target.id).length === 0) {
      throw conflict('A company needs at least one active owner. Make someone else owner first.', 'last_owner', { role: 'The last active owner must stay owner.' });
    }
  }
  await target.save({ transaction });
  if (target.status === 'disabled') await revokeAllSessions(target.id, transaction);
  await audit(
    { organizationId: actor.organizationId, actorUserId: actor.id, action: 'user.updated', subjectType: 'user', subjectId: target.id, data: { before, after: { role: target.role, status: target.status } } },
    req,
    transaction,
  );
  return target;
}
