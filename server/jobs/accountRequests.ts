/**
 * The work behind the public requests that must not tell whether an address is known: a request
 * only queues an `account-request` job (the same row whatever the address) and answers; the job
 * looks the address up and sends the link, a note, or nothing. So the answer and its time are the
 * same for every address (sign-up, password reset, the customer's sign-in link).
 *
 * `company-certificate` makes a new company's signing certificate, off the sign-up's request.
 */
import type PgBoss from 'pg-boss';
import { requestPasswordReset } from '../commands/accounts';
import { mailSignupLink } from '../commands/signups';
import { withTransaction } from '../db';
import { logger } from '../logger';
import { ensureCompanyCertificate } from '../services/companyCertificate';
import { mailPortalSignInLinks } from '../services/customerSessions';
import { WORKERS_PER_QUEUE } from './sendMail';

export type AccountRequest =
  | { kind: 'signup'; signupRequestId: string }
  | { kind: 'password-reset'; email: string; requestedFrom: string | null }
  | { kind: 'portal-sign-in'; email: string; next: string | null };

/** Handles one request (at least once: each kind is safe to run again). */
export async function handleAccountRequest(request: AccountRequest) {
  return withTransaction(async (t) => {
    switch (request.kind) {
      case 'signup':
        return mailSignupLink(request.signupRequestId, t);
      case 'password-reset':
        return requestPasswordReset(request.email, request.requestedFrom, t);
      case 'portal-sign-in':
        return mailPortalSignInLinks(request.email, request.next, t);
    }
  });
}

export async function registerAccountRequests(boss: PgBoss) {
  for (let i = 0; i < WORKERS_PER_QUEUE; i++) {
    await boss.work<AccountRequest>('account-request', { pollingIntervalSeconds: 0.5, batchSize: 1 }, async (jobs) => {
      for (const job of jobs) {
        await handleAccountRequest(job.data);
        logger.info({ jobId: job.id, kind: job.data.kind }, 'account request handled');
      }
    });
  }
  await boss.work<{ organizationId: string }>('company-certificate', { pollingIntervalSeconds: 1, batchSize: 1 }, async (jobs) => {
    for (const job of jobs) await withTransaction((t) => ensureCompanyCertificate(job.data.organizationId, t));
  });
}
