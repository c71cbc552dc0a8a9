import bcrypt from 'bcryptjs';
import type { Request } from 'express';
import { Op } from 'sequelize';
import { ROLE_LABELS, type Role } from '../../shared/types';
import type { Transaction } from '../db';
import { env } from '../env';
import { badRequest, conflict } from '../errors';
import { AuthToken, Organization, User } from '../models';
import type { TokenPurpose } from '../models/AuthToken';
import { queueMail } from '../services/mailer';
import { revokeAllSessions } from '../services/sessions';
import { hashToken, newToken } from '../services/tokens';
import { ensureCompanyCertificate } from '../services/companyCertificate';
import { audit } from './audit';

const BCRYPT_ROUNDS = 12;
export const INVITE_DAYS = 7;
export const RESET_MINUTES = 60;

export const hashPassword = (password: string) => bcrypt.hash(password, BCRYPT_ROUNDS);

/** A hash of a random password: comparing against it costs as much as a real check, so timing tells nothing. */
const decoyHash = bcrypt.hashSync('decoy-password-never-used', BCRYPT_ROUNDS);

/** Checks an e-mail and password; null when either is wrong or the account cannot sign in. */
export async function verifyCredentials(email: string, password: string): Promise<User | null> {
  const user = await User.findOne({ where: { email } });
  const ok = await bcrypt.compare(password, user?.passwordHash ?? decoyHash);
  if (!user || !ok || user.status !== 'active' || !user.passwordHash) return null;
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

export async function signup(
  input: { organizationName: string; name: string; email: string; password: string },
  req: Request,
  transaction: Transaction,
) {
  if (await User.findOne({ where: { email: input.email }, transaction })) {
    throw conflict('That e-mail already has an account. Sign in, or reset the password.', 'email_taken', {
      email: 'That e-mail already has an account.',
    });
  }
  const organization = await Organization.create({ name: input.organizationName }, { transaction });
  const user = await User.create(
    {
      organizationId: organization.id,
      name: input.name,
      email: input.email,
      passwordHash: await hashPassword(input.password),
      role: 'owner',
      status: 'active',
    },
    { transaction },
  );
  // Each company signs its agreements with its own certificate, made now.
  await ensureCompanyCertificate(organization.id, transaction);
  await audit({ organizationId: organization.id, actorUserId: user.id, action: 'organization.created', subjectType: 'organization', subjectId: organization.id }, req, transaction);
  await queueMail(user.email, 'welcome', { name: user.name, organizationName: organization.name, link: `${env.APP_URL}/sign-in` }, transaction);
  return { user, organization };
}

export async function inviteUser(
  actor: User,
  input: { email: string; name: string; role: Role },
  req: Request,
  transaction: Transaction,
) {
  if (await User.findOne({ where: { email: input.email }, transaction })) {
    throw conflict('That e-mail already belongs to a user.', 'email_taken', { email: 'That e-mail already belongs to a user.' });
  }
  const user = await User.create(
    { organizationId: actor.organizationId, name: input.name, email: input.email, passwordHash: null, role: input.role, status: 'invited' },
    { transaction },
  );
  await sendInvite(actor, user, req, transaction);
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'user.invited', subjectType: 'user', subjectId: user.id, data: { email: user.email, role: user.role } }, req, transaction);
  return user;
}

export async function sendInvite(actor: User, user: User, _req: Request, transaction: Transaction) {
  const organization = await Organization.findByPk(user.organizationId, { transaction });
  const token = await issueToken(user, 'invite', INVITE_DAYS * 86_400_000, transaction);
  await queueMail(
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
  user.passwordHash = await hashPassword(input.password);
  if (input.name) user.name = input.name;
  user.status = 'active';
  await user.save({ transaction });
  row.usedAt = new Date();
  await row.save({ transaction });
  await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'user.joined', subjectType: 'user', subjectId: user.id }, req, transaction);
  return user;
}

/** Sends a reset link when the e-mail belongs to an active user; says nothing either way. */
export async function requestPasswordReset(email: string, req: Request, transaction: Transaction) {
  const user = await User.findOne({ where: { email }, transaction });
  if (!user || user.status !== 'active') return;
  const organization = await Organization.findByPk(user.organizationId, { transaction });
  const token = await issueToken(user, 'password_reset', RESET_MINUTES * 60_000, transaction);
  await queueMail(
    user.email,
    'password-reset',
    { name: user.name, organizationName: organization!.name, minutes: RESET_MINUTES, link: `${env.APP_URL}/reset-password?token=${token}` },
    transaction,
  );
  await audit({ organizationId: user.organizationId, actorUserId: null, action: 'user.password_reset_requested', subjectType: 'user', subjectId: user.id }, req, transaction);
}

export async function confirmPasswordReset(input: { token: string; password: string }, req: Request, transaction: Transaction) {
  const { row, user } = await findLiveToken(input.token, 'password_reset', transaction);
  if (user.status !== 'active') throw badRequest('This account is not active.', undefined, 'invalid_token');
  user.passwordHash = await hashPassword(input.password);
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
