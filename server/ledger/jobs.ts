/**
 * The daily recognition of customer deposits (scheduled with pg-boss elsewhere). ASC 606: revenue
 * is recognised when the performance obligation is satisfied, which for a rental is the event;
 * until then money billed or paid in advance is a contract liability (606-10-45-2).
 */
import { QueryTypes } from 'sequelize';
import { addDays, dateInZone, zonedTimeToInstant } from '../../shared/dates';
import { sequelize, type Transaction } from '../db';
import { Booking, Organization, type JournalEntry } from '../models';
import type { RevenueKey } from './chart';
import { depositEarned, postEntry } from './post';

/** The customer deposits a booking still holds, by the revenue account each part becomes. */
async function depositsHeld(bookingId: string, t: Transaction) {
  const rows = await sequelize.query<{ revenue_key: RevenueKey; held: string | number; latest: Date }>(
    `SELECT l.revenue_key, sum(l.credit_cents - l.debit_cents)::bigint AS held, max(e.occurred_at) AS latest
       FROM journal_entries e JOIN journal_lines l ON l.entry_id = e.id JOIN accounts a ON a.id = l.account_id
      WHERE e.booking_id = :id AND a.system_key = 'customer_deposits'
      GROUP BY l.revenue_key`,
    { replacements: { id: bookingId }, type: QueryTypes.SELECT, transaction: t },
  );
  const held: Partial<Record<RevenueKey, number>> = {};
  let latest: Date | null = null;
  for (const r of rows) {
    if (Number(r.held) !== 0) held[r.revenue_key] = Number(r.held);
    const at = new Date(r.latest);
    if (!latest || at > latest) latest = at;
  }
  return { held, latest };
}

/**
 * Posts one `deposit_earned` entry for every booking of the company whose event date (in the
 * company's zone) is `today` or earlier and that still holds customer deposits. Idempotent: the
 * entry empties the booking's deposits, so a second run finds nothing; concurrent runs queue on
 * the booking's row lock and the later one re-reads the deposits after the first commits.
 * Cancelled bookings are left alone: their deposits are refunded or kept by the cancellation
 * terms, which is that flow's entry to write.
 */
export async function recognizeDepositsDue(organizationId: string, today: string | Date, t: Transaction): Promise<JournalEntry[]> {
  const org = await Organization.findByPk(organizationId, { attributes: ['id', 'timeZone'], transaction: t });
  if (!org) throw new RangeError(`Organization ${organizationId} was not found.`);
  const day = typeof today === 'string' ? today : dateInZone(today, org.timeZone);
  if (!/^\d{4}-\d{2}-\d{2}$/.test(day)) throw new RangeError(`today is YYYY-MM-DD; got "${day}".`);
  const endOfToday = zonedTimeToInstant(addDays(day, 1), '00:00', org.timeZone);

  const due = await sequelize.query<{ booking_id: string }>(
    `SELECT DISTINCT e.booking_id
       FROM journal_entries e
       JOIN journal_lines l ON l.entry_id = e.id
       JOIN accounts a ON a.id = l.account_id
       JOIN bookings b ON b.id = e.booking_id
      WHERE e.organization_id = :org AND a.system_key = 'customer_deposits'
        AND b.event_start < :endOfToday AND b.status <> 'cancelled'
      GROUP BY e.booking_id, l.revenue_key
     HAVING sum(l.credit_cents - l.debit_cents) <> 0
      ORDER BY e.booking_id`,
    { replacements: { org: organizationId, endOfToday }, type: QueryTypes.SELECT, transaction: t },
  );

  const posted: JournalEntry[] = [];
  for (const { booking_id: bookingId } of due) {
    const booking = await Booking.findOne({
      where: { id: bookingId, organizationId },
      attributes: ['id', 'reference', 'eventStart', 'customerId'],
      lock: t.LOCK.UPDATE,
      transaction: t,
    });
    if (!booking) continue;
    const { held, latest } = await depositsHeld(bookingId, t);
    const draft = depositEarned(held);
    if (draft.lines.length === 0) continue; // another run got here first
    const eventDate = dateInZone(booking.eventStart, org.timeZone);
    const eventDay = zonedTimeToInstant(eventDate, '00:00', org.timeZone);
    posted.push(
      await postEntry(
        {
          organizationId,
          bookingId,
          kind: draft.kind,
          memo: `Deposits earned: booking ${booking.reference}, event on ${eventDate}`,
          // Dated the event day; never before a deposit it empties (an invoice wrongly dated in advance afterwards).
          occurredAt: latest && latest > eventDay ? latest : eventDay,
          // The job may run after the event's period was closed (it was down, or the deposit was
          // paid late): the revenue is then recognised today, in the open period, not refused forever.
          whenClosed: 'post_today',
          source: { type: 'booking', id: bookingId },
          lines: draft.lines,
        },
        t,
      ),
    );
  }
  return posted;
}
