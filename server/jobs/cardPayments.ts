import type PgBoss from 'pg-boss';
import { processEvent, requestCardRefund } from '../commands/cardPayments';
import { WORKERS_PER_QUEUE } from './sendMail';

/**
 * Card events and card refunds. Each event is handled once however often it is delivered (the
 * event row is locked and marked in the handling's transaction); pg-boss retries a failed
 * handling, and a refund request reuses its idempotency key on retry.
 */
export async function registerCardPayments(boss: PgBoss) {
  for (let i = 0; i < WORKERS_PER_QUEUE; i++) {
    await boss.work<{ eventId: string }>('card-event', { pollingIntervalSeconds: 0.5, batchSize: 1 }, async ([job]) => processEvent(job.data.eventId));
    await boss.work<{ refundId: string }>('card-refund', { pollingIntervalSeconds: 0.5, batchSize: 1 }, async ([job]) => requestCardRefund(job.data.refundId));
  }
}
