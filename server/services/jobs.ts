import PgBoss from 'pg-boss';
import type { Transaction } from '../db';
import { env } from '../env';
import { logger } from '../logger';

/** Every background queue the app uses; created when the schema is set up. */
export const QUEUES = ['send-mail', 'send-document', 'recognize-deposits', 'send-reminders', 'card-event', 'card-refund', 'account-request', 'company-certificate'] as const;
export type QueueName = (typeof QUEUES)[number];

let boss: PgBoss | null = null;
let starting: Promise<PgBoss> | null = null;

/** The process's pg-boss client over the app's own database (started once, lazily). */
export function getBoss(): Promise<PgBoss> {
  if (boss) return Promise.resolve(boss);
  if (!starting) {
    const b = new PgBoss({ connectionString: env.DATABASE_URL, max: 4, application_name: 'guyline-jobs', maintenanceIntervalSeconds: env.JOB_MAINTENANCE_SECONDS });
    b.on('error', (err) => logger.error({ err }, 'job queue error'));
    starting = b
      .start()
      .then(async () => {
        for (const q of QUEUES) await b.createQueue(q);
        boss = b;
        return b;
      })
      .catch((err) => {
        starting = null;
        throw err;
      });
  }
  return starting;
}

export async function stopBoss() {
  const b = boss ?? (starting ? await starting.catch(() => null) : null);
  boss = null;
  starting = null;
  if (b) await b.stop({ graceful: true, wait: true, timeout: 5000 });
}

/**
 * Queues a job. Given a transaction, the job row is written inside it, so the job exists
 * exactly when the change that asked for it was committed.
 */
export async function queueJob(name: QueueName, data: object, transaction?: Transaction) {
  const b = await getBoss();
  const options: PgBoss.SendOptions = { retryLimit: 5, retryDelay: 10, retryBackoff: true, expireInSeconds: env.JOB_TIMEOUT_SECONDS };
  if (transaction) {
    options.db = {
      // The transaction's own pg connection: the job row commits or rolls back with it.
      executeSql: (text: string, values: unknown[]) =>
        (transaction as unknown as { connection: { query(t: string, v: unknown[]): Promise<{ rows: unknown[] }> } }).connection.query(text, values),
    };
  }
  return b.send(name, data, options);
}
