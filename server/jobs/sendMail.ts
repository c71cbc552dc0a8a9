import type PgBoss from 'pg-boss';
import { logger } from '../logger';
import { deliverMail, type OutgoingMail } from '../services/mailer';

/** Workers per queue in one process; each takes one job at a time, so one failing message is retried alone. */
export const WORKERS_PER_QUEUE = 1;

export async function registerSendMail(boss: PgBoss) {
  for (let i = 0; i < WORKERS_PER_QUEUE; i++) {
    await boss.work<OutgoingMail>('send-mail', { pollingIntervalSeconds: 0.5, batchSize: 1 }, async (jobs) => {
      for (const job of jobs) {
        await deliverMail(job.data);
        logger.info({ jobId: job.id, to: job.data.to, subject: job.data.subject }, 'mail sent');
      }
    });
  }
}
