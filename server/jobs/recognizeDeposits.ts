import type PgBoss from 'pg-boss';
import { dateInZone } from '../../shared/dates';
import { withTransaction } from '../db';
import { recognizeDepositsDue } from '../ledger/jobs';
import { logger } from '../logger';
import { Organization } from '../models';

/**
 * Every hour, each company's deposits for events that have started (by the company's own calendar
 * day) become revenue. recognizeDepositsDue posts once per booking, so running often is harmless.
 */
export async function registerRecognizeDeposits(boss: PgBoss) {
  await boss.schedule('recognize-deposits', '7 * * * *', {}, { singletonKey: 'recognize-deposits' });
  await boss.work('recognize-deposits', { pollingIntervalSeconds: 5, batchSize: 1 }, async () => {
    for (const org of await Organization.findAll({ attributes: ['id', 'timeZone'] })) {
      const posted = await withTransaction((t) => recognizeDepositsDue(org.id, dateInZone(new Date(), org.timeZone), t));
      if (posted.length) logger.info({ organizationId: org.id, entries: posted.length }, 'deposits recognized as revenue');
    }
  });
}
