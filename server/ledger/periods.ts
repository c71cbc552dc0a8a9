/**
 * Closed periods: the one place that says whether an entry may be dated on a day. A company's
 * books are closed through its lock date (`period_locks.closed_through`, migration
 * 20261205-0020); an entry's date is its `occurredAt` on the company's calendar. Every ledger
 * write passes here (post.ts), and so will any later money flow that needs the same answer.
 *
 * The company's `period_locks` row is read FOR SHARE in the caller's transaction, and closing
 * takes it FOR UPDATE (commands/closedPeriods.ts): a closing waits for the entries being posted,
 * and posting waits for a closing under way and then sees its date. A trigger on journal_entries
 * checks the same rule under the same lock, for any insert that does not come through here.
 */
import { QueryTypes } from 'sequelize';
import { dateInZone } from '../../shared/dates';
import { periodClosedMessage } from '../../shared/schemas/books';
import { sequelize, type Transaction } from '../db';
import { HttpError } from '../errors';

/** 409 `period_closed`, naming the lock date (also as `closedThrough` beside the error) and the field, if any. */
export function periodClosed(closedThrough: string, field?: string): HttpError {
  const message = periodClosedMessage(closedThrough);
  return new HttpError(409, 'period_closed', message, field ? { [field]: message } : undefined, { closedThrough });
}

/** The lock date and the company's zone, the row locked FOR SHARE until `t` ends. */
async function lockDateForPosting(organizationId: string, t: Transaction): Promise<{ closedThrough: string | null; timeZone: string } | null> {
  const [row] = await sequelize.query<{ closed_through: string | null; time_zone: string }>(
    `SELECT p.closed_through::text AS closed_through, o.time_zone
       FROM period_locks p JOIN organizations o ON o.id = p.organization_id
      WHERE p.organization_id = :org
        FOR SHARE OF p`,
    // A replacement (not a bind parameter), so the statement's text names the company: the
    // concurrency test finds the waiting statement by it.
    { replacements: { org: organizationId }, type: QueryTypes.SELECT, transaction: t },
  );
  return row ? { closedThrough: row.closed_through, timeZone: row.time_zone } : null;
}

/**
 * Throws 409 `period_closed` when `at` (an instant, or a YYYY-MM-DD day of the company's calendar)
 * is on or before the company's lock date. `field` names the request field the date came from.
 */
export async function assertPeriodOpen(organizationId: string, at: Date | string, t: Transaction, opts: { field?: string } = {}): Promise<void> {
  const lock = await lockDateForPosting(organizationId, t);
  if (!lock?.closedThrough) return;
  const day = typeof at === 'string' ? at : dateInZone(at, lock.timeZone);
  if (day <= lock.closedThrough) throw periodClosed(lock.closedThrough, opts.field);
}

/**
 * The date for an entry nobody at the company chose a date for (a card processor's event, the
 * deposit job): its own date while that day is open, otherwise now. Such an entry reports money
 * that moved or was earned whatever the books say; refusing it would fail the job forever, so it
 * goes into the open period, where a closed period's late items belong. Today is never closed
 * (`lockDateProblem`), so now is open; should it not be, this refuses like `assertPeriodOpen`.
 */
export async function openPeriodDate(organizationId: string, at: Date, t: Transaction): Promise<Date> {
  try {
    await assertPeriodOpen(organizationId, at, t);
    return at;
  } catch (err) {
    if (!(err instanceof HttpError && err.code === 'period_closed')) throw err;
  }
  const now = new Date();
  await assertPeriodOpen(organizationId, now, t);
  return now;
}

/** The trigger's refusal (an insert that did not come through here) as the same 409. */
export function periodClosedFromDatabase(err: unknown): HttpError | null {
  const original = (err as { original?: { constraint?: string; message?: string } } | null)?.original;
  if (original?.constraint !== 'journal_entry_in_open_period') return null;
  const day = /closed through (\d{4}-\d{2}-\d{2})/.exec(original.message ?? '')?.[1];
  return periodClosed(day ?? 'the lock date');
}
