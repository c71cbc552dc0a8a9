/**
 * What the company holds that is not yet its own, at the end of a day: customer deposits (billed
 * or paid before the event, a contract liability until the event day), refundable security
 * deposits, and customers' account credit. Each by booking (credit by customer), summed from the
 * ledger's lines on that account, and checked against the account's balance from balances.ts.
 */
import { QueryTypes } from 'sequelize';
import type { DepositsReport, HeldByBooking, HeldSection } from '../../../shared/schemas/reports';
import { sequelize } from '../../db';
import { accountBalances } from '../../ledger/balances';
import type { SystemKey } from '../../ledger/chart';
import type { Account } from '../../models';
import { accountsByKey, endOfDay, isoDate, ledgerCheck, reportAccount, trace, type ReportContext } from './common';

interface HeldRow {
  booking_id: string | null; reference: string | null; status: string | null; event_start: Date | null;
  customer_id: string | null; customer_name: string | null; held: number;
}

async function heldOn(ctx: ReportContext, account: Account, at: string, by: 'booking' | 'customer'): Promise<HeldByBooking[]> {
  // Credit belongs to the customer (a credit refund names no booking); deposits to the booking.
  const group = by === 'booking' ? 'e.booking_id, b.reference, b.status, b.event_start, c.id, c.name' : 'c.id, c.name';
  const rows = await sequelize.query<HeldRow>(
    `SELECT ${by === 'booking' ? 'e.booking_id, b.reference, b.status, b.event_start,' : 'NULL AS booking_id, NULL AS reference, NULL AS status, NULL AS event_start,'}
            c.id AS customer_id, c.name AS customer_name, sum(l.credit_cents - l.debit_cents)::bigint AS held
       FROM journal_lines l
       JOIN journal_entries e ON e.id = l.entry_id
       LEFT JOIN bookings b ON b.id = e.booking_id
       LEFT JOIN customers c ON c.id = e.customer_id
      WHERE l.organization_id = :org AND l.account_id = :account AND e.occurred_at < :until
      GROUP BY ${group}
     HAVING sum(l.credit_cents - l.debit_cents) <> 0
      ORDER BY ${by === 'booking' ? 'b.event_start NULLS LAST, b.reference' : 'c.name'}`,
    { replacements: { org: ctx.organizationId, account: account.id, until: endOfDay(at, ctx.timeZone) }, type: QueryTypes.SELECT, transaction: ctx.t },
  );
  return rows.map((r) => ({
    booking: r.booking_id ? { id: r.booking_id, reference: r.reference!, status: r.status!, eventDate: isoDate(r.event_start!, ctx.timeZone) } : null,
    customer: r.customer_id ? { id: r.customer_id, name: r.customer_name! } : null,
    cents: Number(r.held),
    trace: trace({
      accountIds: [account.id], to: at,
      ...(by === 'booking' && r.booking_id ? { bookingId: r.booking_id } : {}),
      ...(by === 'customer' && r.customer_id ? { customerId: r.customer_id } : {}),
    }),
  }));
}

export async function depositsReport(ctx: ReportContext, at: string): Promise<DepositsReport> {
  const keys: SystemKey[] = ['customer_deposits', 'security_deposits_held', 'customer_credit'];
  const accounts = await accountsByKey(ctx, keys);
  const balances = await accountBalances(ctx.organizationId, { at, transaction: ctx.t });
  const section = async (key: SystemKey, by: 'booking' | 'customer'): Promise<HeldSection> => {
    const account = accounts.get(key)!;
    const rows = await heldOn(ctx, account, at, by);
    const totalCents = rows.reduce((s, r) => s + r.cents, 0);
    const ledger = balances.find((b) => b.accountId === account.id)!.balanceCents;
    return { account: reportAccount(account), rows, totalCents, check: ledgerCheck(account, ledger, totalCents, { accountIds: [account.id], to: at }) };
  };
  const customerDeposits = await section('customer_deposits', 'booking');
  const securityDeposits = await section('security_deposits_held', 'booking');
  const customerCredit = await section('customer_credit', 'customer');
  return {
    at, timeZone: ctx.timeZone, currency: ctx.currency, customerDeposits, securityDeposits, customerCredit,
    totalCents: customerDeposits.totalCents + securityDeposits.totalCents + customerCredit.totalCents,
  };
}
