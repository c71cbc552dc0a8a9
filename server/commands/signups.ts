/**
 * Signing up a company, in two steps so that nobody learns from the answer whether an address
 * already has an account, and nobody can take an address that is not theirs:
 *
 * 1. `requestSignup` (the request): stores the request with its bcrypt hash and queues the
 *    `account-request` job; the same work and the same answer for every address.
 * 2. `mailSignupLink` (the job): an address without an account gets a link; one with an account
 *    gets a note saying someone tried to sign up with it (sign in, or reset the password).
 * 3. `confirmSignup` (the link): makes the company and its owner, and queues its certificate.
 */
import type { Request } from 'express';
import { Op, UniqueConstraintError } from 'sequelize';
import type { Transaction } from '../db';
import { env } from '../env';
import { badRequest, conflict } from '../errors';
import { Organization, SignupRequest, User } from '../models';
import { queueJob } from '../services/jobs';
import { queueMail } from '../services/mailer';
import { hashToken, newToken } from '../services/tokens';
import { accountOf } from './accounts';
import { audit } from './audit';

/** How long a sign-up link works. */
export const SIGNUP_LINK_HOURS = 24;

/** What every sign-up is told, whatever the address. */
export const SIGNUP_ACCEPTED = 'Check your e-mail: we sent that address a message about creating your company. A link in it works for 24 hours.';

/**
 * Stores a sign-up request and queues the job that mails the link (or the note). The caller has
 * already hashed the password (off the event loop); nothing here looks at existing accounts.
 */
export async function requestSignup(
  input: { organizationName: string; name: string; email: string; passwordHash: string },
  req: Request,
  transaction: Transaction,
) {
  const request = await SignupRequest.create(
    {
      email: input.email,
      organizationName: input.organizationName,
      name: input.name,
      passwordHash: input.passwordHash,
      expiresAt: new Date(Date.now() + SIGNUP_LINK_HOURS * 3_600_000),
      ip: req.ip ?? null,
    },
    { transaction },
  );
  await queueJob('account-request', { kind: 'signup', signupRequestId: request.id }, transaction);
  return request;
}

/** The job's half: mails the link, or the note when the address already has an account. Safe to run twice. */
export async function mailSignupLink(signupRequestId: string, transaction: Transaction) {
  const request = await SignupRequest.findByPk(signupRequestId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!request || request.usedAt || request.tokenHash || !request.passwordHash) return 'done' as const;
  // Old requests keep no password hashes around.
  await SignupRequest.update({ passwordHash: null }, { where: { expiresAt: { [Op.lt]: new Date() }, passwordHash: { [Op.ne]: null } }, transaction });

  const account = await accountOf(request.email, transaction);
  if (account) {
    request.passwordHash = null;
    request.usedAt = new Date();
    await request.save({ transaction });
    const organization = await Organization.findByPk(account.organizationId, { transaction });
    await queueMail(
      account.organizationId,
      request.email,
      'signup-existing',
      { name: account.name, organizationName: organization!.name, signInLink: `${env.APP_URL}/sign-in`, resetLink: `${env.APP_URL}/forgot-password` },
      transaction,
    );
    return 'existing' as const;
  }
  const { token, hash } = newToken();
  request.tokenHash = hash;
  await request.save({ transaction });
  // No company exists yet to file the message under.
  await queueMail(
    null,
    request.email,
    'signup-confirm',
    { name: request.name, organizationName: request.organizationName, hours: SIGNUP_LINK_HOURS, link: `${env.APP_URL}/sign-up/confirm?token=${token}` },
    transaction,
  );
  return 'link' as const;
}

/** The link's half: makes the company and its owner from the request. */
export async function confirmSignup(token: string, req: Request, transaction: Transaction) {
  const request = await SignupRequest.findOne({ where: { tokenHash: hashToken(token) }, transaction, lock: transaction.LOCK.UPDATE });
  if (!request || request.usedAt || !request.passwordHash || request.expiresAt < new Date()) {
    throw badRequest('This link has expired or was already used. Sign up again: it takes a minute.', undefined, 'invalid_token');
  }
  // Told only to whoever holds the link, which went to that mailbox.
  const taken = () => conflict('This address already has an account. Sign in, or reset the password.', 'email_taken');
  if (await accountOf(request.email, transaction)) throw taken();

  const organization = await Organization.create({ name: request.organizationName }, { transaction });
  const user = await User.create(
    { organizationId: organization.id, name: request.name, email: request.email, passwordHash: request.passwordHash, role: 'owner', status: 'active' },
    { transaction },
  ).catch((err: unknown) => {
    // Another request for the same address was confirmed at this moment.
    throw err instanceof UniqueConstraintError ? taken() : err;
  });
  // This request and any other for the same address are spent, their hashes gone.
  await SignupRequest.update(
    { usedAt: new Date(), passwordHash: null },
    { where: { [Op.or]: [{ id: request.id }, { email: request.email, usedAt: null }] }, transaction },
  );
  // Each company signs its agreements with its own certificate: made by a job, off this request.
  await queueJob('company-certificate', { organizationId: organization.id }, transaction);
  await audit({ organizationId: organization.id, actorUserId: user.id, action: 'organization.created', subjectType: 'organization', subjectId: organization.id }, req, transaction);
  await queueMail(organization.id, user.email, 'welcome', { name: user.name, organizationName: organization.name, link: `${env.APP_URL}/sign-in` }, transaction);
  return { user, organization };
}
