import { QueryTypes } from 'sequelize';
import { addDays, dateInZone, zonedTimeToInstant } from '../../shared/dates';
import type { DashboardSummary } from '../../shared/schemas/dashboard';
import { sequelize } from '../db';
import type { Organization, User } from '../models';
import { can } from '../policies';
import { daySheet } from './fieldDay';

/** New money in: not account credit or a security deposit moved onto an invoice. */
const MONEY_IN = ['cash', 'check', 'transfer', 'card'];

/** The Home screen's figures: a handful of counts and sums, each one query, scoped to the company. */
export async function dashboardSummary(user: User, organization: Organization, now = new Date()): Promise<DashboardSummary> {
  const org = organization.id;
  const tz = organization.timeZone;
  const today = dateInZone(now, tz);
  const weekEnd = zonedTimeToInstant(addDays(today, 7), '00:00', tz);

  const stops = can(user, 'field', 'read')
    ? await daySheet(user, organization, today).then((sheet) => ({
        deliveries: sheet.stops.filter((s) => s.stop === 'delivery').length,
        pickups: sheet.stops.filter((s) => s.stop === 'pickup').length,
        mine: sheet.stops.filter((s) => s.mine).length,
      }))
    : null;

  const [bookings] = await sequelize.query<{ quoted: string; awaiting: string; starting: string }>(
    `SELECT (SELECT count(*) FROM bookings WHERE organization_id = :org AND status = 'quoted') AS quoted,
            (SELECT count(DISTINCT booking_id) FROM signing_requests
              WHERE organization_id = :org AND status = 'pending' AND expires_at > :now) AS awaiting,
            (SELECT count(*) FROM bookings
              WHERE organization_id = :org AND status IN ('reserved', 'out') AND event_start >= :dayStart AND event_start < :weekEnd) AS starting`,
    { replacements: { org, now, dayStart: zonedTimeToInstant(today, '00:00', tz), weekEnd }, type: QueryTypes.SELECT },
  );

  let money: DashboardSummary['money'] = null;
  if (can(user, 'invoice', 'read')) {
    const [m] = await sequelize.query<{ open_count: string; open_cents: string; overdue_count: string; overdue_cents: string; received: string }>(
      `WITH owed AS (
         SELECT total_cents - paid_cents - credited_cents AS balance, due_date
           FROM invoices
          WHERE organization_id = :org AND status IN ('open', 'partly_paid') AND kind <> 'credit_note')
       SELECT (SELECT count(*) FROM owed) AS open_count,
              (SELECT coalesce(sum(balance), 0) FROM owed) AS open_cents,
              (SELECT count(*) FROM owed WHERE due_date < :today) AS overdue_count,
              (SELECT coalesce(sum(balance), 0) FROM owed WHERE due_date < :today) AS overdue_cents,
              (SELECT coalesce(sum(amount_cents), 0) FROM payments
                WHERE organization_id = :org AND method IN (:methods) AND received_at >= :since) AS received`,
      { replacements: { org, today, methods: MONEY_IN, since: new Date(now.getTime() - 7 * 24 * 3600 * 1000) }, type: QueryTypes.SELECT },
    );
    money = {
      currency: organization.currency,
      openCount: Number(m.open_count),
      openCents: Number(m.open_cents),
      overdueCount: Number(m.overdue_count),
      overdueCents: Number(m.overdue_cents),
      receivedLast7DaysCents: Number(m.received),
    };
  }

  return {
    today,
    stops,
    bookings: { quoted: Number(bookings.quoted), awaitingSignature: Number(bookings.awaiting), startingThisWeek: Number(bookings.starting) },
    money,
  };
}
