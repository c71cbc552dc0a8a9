import type PgBoss from 'pg-boss';
import { logger } from '../logger';
import { deliverOnce, type OutgoingMail } from '../services/mailer';

/** Workers per queue in one process; each takes one job at a time, so one failing message is retried alone. */
export const WORKERS_PER_QUEUE = 2;

/** Sends each queued mail once per job: a job run again after a crash finds its delivery row (see deliverOnce). */
export async function registerSendMail(boss: PgBoss) {
  for (let i = 0; i < WORKERS_PER_QUEUE; i++) {
    await boss.work<OutgoingMail>('send-mail', { pollingIntervalSeconds: 0.5, batchSize: 1 }, async (jobs) => {
      for (const job of jobs) {
        const outcome = await deliverOnce(`send-mail:${job.id}`, job.data);
        logger.info({ jobId: job.id, to: job.data.to, subject: job.data.subject, outcome }, outcome === 'sent' ? 'mail sent' : 'mail already sent');
      }
    });
  }
}
