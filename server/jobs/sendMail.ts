import type PgBoss from 'pg-boss';
import { logger } from '../logger';
import { deliverMail, type OutgoingMail } from '../services/mailer';

export async function registerSendMail(boss: PgBoss) {
  await boss.work<OutgoingMail>('send-mail', { pollingIntervalSeconds: 0.5, batchSize: 1 }, async (jobs) => {
    for (const job of jobs) {
      await deliverMail(job.data);
      logger.info({ jobId: job.id, to: job.data.to, subject: job.data.subject }, 'mail sent');
    }
  });
}
