/**
 * The journal entries behind a figure: every entry with a line on the traced accounts in the
 * period (days in the company's zone, both ends included), narrowed to a booking, a customer or a
 * tax rate when the figure is. Each entry's effect is its lines on those accounts, on the
 * figure's side, so the entries add up to the figure they explain.
 */
import { Op, QueryTypes } from 'sequelize';
import type { EntriesQuery, TracedEntries, TracedEntry } from '../../../shared/schemas/reports';
import { sequelize } from '../../db';
import { notFound } from '../../errors';
import { Account, Booking, Customer } from '../../models';
import { endOfDay, startOfDay, type ReportContext } from './common';

/** Accounts whose figures read credits less debits. Contra revenue too: the reports show it as what it takes off revenue (negative). */
const CREDIT_SIDE = ['liability', 'equity', 'revenue', 'contra_revenue'];

export async function tracedEntries(ctx: ReportContext, query: EntriesQuery): Promise<TracedEntries> {
  const ids = [...new Set(query.accountIds)];
  const accounts = await Account.findAll({ where: { id: { [Op.in]: ids }, organizationId: ctx.organizationId }, order: [['code', 'ASC']], transaction: ctx.t });
  // Another company's account, booking or customer is missing here, never forbidden.
  if (accounts.length !== ids.length) throw notFound('That account');
  if (query.bookingId && !(await Booking.findOne({ where: { id: query.bookingId, organizationId: ctx.organizationId }, attributes: ['id'], transaction: ctx.t }))) throw notFound('That booking');
  if (query.customerId && !(await Customer.findOne({ where: { id: query.customerId, organizationId: ctx.organizationId }, attributes: ['id'], transaction: ctx.t }))) throw notFound('That customer');
  // Liabilities and revenue (with its contra) read credits less debits; assets debits less credits.
  const side: 'credit' | 'debit' = accounts.some((a) => CREDIT_SIDE.includes(a.type)) ? 'credit' : 'debit';

  // Line filters give the figure; entry filters pick the entries that carry it.
  const entryFilters = [
    'e.organization_id = :org',
    query.from ? 'e.occurred_at >= :from' : null,
    query.to ? 'e.occurred_at < :until' : null,
    query.bookingId ? 'e.booking_id = :bookingId' : null,
    query.customerId ? 'e.customer_id = :customerId' : null,
    query.taxRateBp !== undefined ? 'coalesce(b.tax_rate_bp, 0) = :rate' : null,
  ].filter(Boolean).join(' AND ');
  const replacements = {
    org: ctx.organizationId, ids,
    from: query.from ? startOfDay(query.from, ctx.timeZone) : null,
    until: query.to ? endOfDay(query.to, ctx.timeZone) : null,
    bookingId: query.bookingId ?? null, customerId: query.customerId ?? null, rate: query.taxRateBp ?? null,
    limit: query.pageSize, offset: (query.page - 1) * query.pageSize,
  };
  const [summary] = await sequelize.query<{ n: number; debit: number; credit: number }>(
    `SELECT count(DISTINCT l.entry_id)::int AS n, coalesce(sum(l.debit_cents), 0)::bigint AS debit, coalesce(sum(l.credit_cents), 0)::bigint AS credit
       FROM journal_lines l JOIN journal_entries e ON e.id = l.entry_id LEFT JOIN bookings b ON b.id = e.booking_id
      WHERE l.organization_id = :org AND l.account_id IN (:ids) AND ${entryFilters}`,
    { replacements, type: QueryTypes.SELECT, transaction: ctx.t },
  );
  const page = await sequelize.query<{
    id: string; occurred_at: Date; kind: string; memo: string; booking_id: string | null; reference: string | null;
    customer_id: string | null; customer_name: string | null; invoice_id: string | null; invoice_number: string | null;
  }>(
    `SELECT e.id, e.occurred_at, e.kind, e.memo, e.booking_id, b.reference, e.customer_id, c.name AS customer_name,
            i.id AS invoice_id, i.number AS invoice_number
       FROM journal_entries e
       LEFT JOIN bookings b ON b.id = e.booking_id
       LEFT JOIN customers c ON c.id = e.customer_id
       LEFT JOIN invoices i ON e.source_type = 'invoice' AND i.id = e.source_id
      WHERE ${entryFilters} AND EXISTS (SELECT 1 FROM journal_lines l WHERE l.entry_id = e.id AND l.account_id IN (:ids))
      ORDER BY e.occurred_at, e.created_at, e.id
      LIMIT :limit OFFSET :offset`,
    { replacements, type: QueryTypes.SELECT, transaction: ctx.t },
  );
  const lines = page.length
    ? await sequelize.query<{ entry_id: string; account_id: string; code: string; name: string; debit_cents: number; credit_cents: number }>(
        `SELECT l.entry_id, l.account_id, a.code, a.name, l.debit_cents, l.credit_cents
           FROM journal_lines l JOIN accounts a ON a.id = l.account_id
          WHERE l.entry_id IN (:entries)
          ORDER BY l.entry_id, l.position`,
        { replacements: { entries: page.map((p) => p.id) }, type: QueryTypes.SELECT, transaction: ctx.t },
      )
    : [];
  const effect = (debit: number, credit: number) => (side === 'credit' ? Number(credit) - Number(debit) : Number(debit) - Number(credit));
  const entries: TracedEntry[] = page.map((p) => {
    const mine = lines.filter((l) => l.entry_id === p.id);
    const traced = mine.filter((l) => ids.includes(l.account_id));
    return {
      id: p.id,
      occurredAt: new Date(p.occurred_at).toISOString(),
      kind: p.kind,
      memo: p.memo,
      booking: p.booking_id ? { id: p.booking_id, reference: p.reference! } : null,
      customer: p.customer_id ? { id: p.customer_id, name: p.customer_name! } : null,
      invoice: p.invoice_id ? { id: p.invoice_id, number: p.invoice_number } : null,
      lines: mine.map((l) => ({
        accountId: l.account_id, accountCode: l.code, accountName: l.name, debitCents: Number(l.debit_cents), creditCents: Number(l.credit_cents), traced: ids.includes(l.account_id),
      })),
      effectCents: effect(traced.reduce((a, l) => a + Number(l.debit_cents), 0), traced.reduce((a, l) => a + Number(l.credit_cents), 0)),
    };
  });
  return {
    accounts: accounts.map((a) => ({ id: a.id, code: a.code, name: a.name, type: a.type })),
    entries, total: Number(summary.n), totalCents: effect(summary.debit, summary.credit), side, currency: ctx.currency, timeZone: ctx.timeZone,
  };
}
