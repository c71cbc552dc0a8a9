/**
 * Receivables aging at the end of a day: every issued invoice's balance on that day (total less
 * what was paid and credited by then, plus what refunds reopened), bucketed by days past its due
 * date in the company's calendar (shared/aging.ts).
 *
 * Reconciliation: every line that moves accounts receivable belongs to exactly one invoice event:
 * the invoice issued (Dr), its void (the reversal, Cr), a payment's applied parts (Cr, one per
 * allocation; an overpayment's rest goes to customer credit, a liability, never to AR), a credit
 * note's part taken off the invoice (Cr; the rest goes to customer credit) and a refund (Dr,
 * reopening the invoices its payment paid). So the invoices' balances on a day add up to the AR
 * balance in the ledger on that day, and the report shows both side by side. A difference would
 * mean an entry outside these rules, and the report says so rather than hiding it.
 */
import { QueryTypes } from 'sequelize';
import { AGING_BUCKETS, agingBucket, daysPastDue, emptyBuckets } from '../../../shared/aging';
import type { AgingCustomerRow, AgingInvoice, AgingReport } from '../../../shared/schemas/reports';
import { sequelize } from '../../db';
import { accountBalances } from '../../ledger/balances';
import { accountsByKey, endOfDay, ledgerCheck, type ReportContext } from './common';

interface InvoiceRow {
  id: string; number: string; kind: AgingInvoice['kind']; booking_id: string; reference: string; customer_id: string; customer_name: string;
  issue_date: string; due_date: string; total_cents: number; issued_at: Date; voided_at: Date | null; paid_cents: number; credited_cents: number;
}
interface AllocationRow { id: string; invoice_id: string; payment_id: string; amount_cents: number; created_at: Date }
interface RefundRow { payment_id: string; amount_cents: number; occurred_at: Date; created_at: Date }

const q = <T extends object>(sql: string, ctx: ReportContext, extra: Record<string, unknown> = {}) =>
  sequelize.query<T>(sql, { replacements: { org: ctx.organizationId, ...extra }, type: QueryTypes.SELECT, transaction: ctx.t });

/**
 * What each refund gave back to each invoice, replayed in the order the refunds were recorded with
 * the same rule as the refund command (`reopenInvoices`): the payment's allocations newest id
 * first, each up to what it paid and what the invoice had paid at the time. `allocations` holds
 * every allocation of the invoices those payments paid.
 */
function reopenedByRefunds(allocations: AllocationRow[], refunds: RefundRow[]) {
  const byPayment = new Map<string, AllocationRow[]>();
  const byInvoice = new Map<string, AllocationRow[]>();
  for (const a of allocations) {
    byPayment.set(a.payment_id, [...(byPayment.get(a.payment_id) ?? []), a]);
    byInvoice.set(a.invoice_id, [...(byInvoice.get(a.invoice_id) ?? []), a]);
  }
  const reopenedSoFar = new Map<string, number>();
  const reopens: { invoiceId: string; cents: number; occurredAt: Date }[] = [];
  for (const r of refunds) {
    let left = Number(r.amount_cents);
    const mine = [...(byPayment.get(r.payment_id) ?? [])].sort((a, b) => (a.id < b.id ? 1 : a.id > b.id ? -1 : 0));
    for (const a of mine) {
      if (left === 0) break;
      const paidThen =
        (byInvoice.get(a.invoice_id) ?? []).filter((x) => x.created_at <= r.created_at).reduce((s, x) => s + Number(x.amount_cents), 0) -
        (reopenedSoFar.get(a.invoice_id) ?? 0);
      const back = Math.min(left, paidThen, Number(a.amount_cents));
      if (back <= 0) continue;
      reopenedSoFar.set(a.invoice_id, (reopenedSoFar.get(a.invoice_id) ?? 0) + back);
      reopens.push({ invoiceId: a.invoice_id, cents: back, occurredAt: r.occurred_at });
      left -= back;
    }
  }
  return reopens;
}

export async function agingReport(ctx: ReportContext, at: string): Promise<AgingReport> {
  const until = endOfDay(at, ctx.timeZone);
  const accounts = await accountsByKey(ctx, ['accounts_receivable']);
  const ar = accounts.get('accounts_receivable')!;

  // Refunds are few: their payments' invoices are replayed in full; every other invoice is summed in SQL.
  const refunds = await q<RefundRow>(
    `SELECT r.payment_id, r.amount_cents, re.occurred_at, re.created_at
       FROM refunds r JOIN journal_entries re ON re.id = r.ledger_entry_id
      WHERE r.organization_id = :org
      ORDER BY re.created_at, re.id`,
    ctx,
  );
  const refundedPayments = [...new Set(refunds.map((r) => r.payment_id))];
  const allocations = refundedPayments.length
    ? await q<AllocationRow>(
        `SELECT pa.id, pa.invoice_id, pa.payment_id, pa.amount_cents, pe.created_at
           FROM payment_allocations pa
           JOIN payments p ON p.id = pa.payment_id
           JOIN journal_entries pe ON pe.id = p.ledger_entry_id
          WHERE pa.invoice_id IN (SELECT invoice_id FROM payment_allocations WHERE payment_id IN (:payments))`,
        ctx,
        { payments: refundedPayments },
      )
    : [];
  const reopened = new Map<string, number>();
  for (const r of reopenedByRefunds(allocations, refunds)) if (r.occurredAt < until) reopened.set(r.invoiceId, (reopened.get(r.invoiceId) ?? 0) + r.cents);
  const touched = [...new Set(allocations.map((a) => a.invoice_id))];

  // Each issued invoice with what was paid (allocations of payments dated by then) and credited
  // (the part of credit notes dated by then that came off AR); only those with something left,
  // or touched by a refund, come back.
  const invoices = await q<InvoiceRow>(
    `WITH paid AS (
       SELECT pa.invoice_id, sum(pa.amount_cents)::bigint AS cents
         FROM payment_allocations pa JOIN payments p ON p.id = pa.payment_id JOIN journal_entries pe ON pe.id = p.ledger_entry_id
        WHERE pa.organization_id = :org AND pe.occurred_at < :until
        GROUP BY pa.invoice_id
     ), credited AS (
       SELECT n.credits_invoice_id AS invoice_id, sum(l.credit_cents - l.debit_cents)::bigint AS cents
         FROM invoices n JOIN journal_entries ne ON ne.id = n.ledger_entry_id JOIN journal_lines l ON l.entry_id = ne.id AND l.account_id = :ar
        WHERE n.organization_id = :org AND n.kind = 'credit_note' AND ne.occurred_at < :until
        GROUP BY n.credits_invoice_id
     ), owed AS (
       SELECT i.id, i.number, i.kind, i.booking_id, i.customer_id, i.total_cents, i.issue_date, i.due_date,
              ie.occurred_at AS issued_at, rv.occurred_at AS voided_at,
              coalesce(paid.cents, 0) AS paid_cents, coalesce(credited.cents, 0) AS credited_cents,
              CASE WHEN ie.occurred_at < :until AND (rv.occurred_at IS NULL OR rv.occurred_at >= :until) THEN i.total_cents ELSE 0 END
                - coalesce(paid.cents, 0) - coalesce(credited.cents, 0) AS before_refunds
         FROM invoices i
         JOIN journal_entries ie ON ie.id = i.ledger_entry_id
         LEFT JOIN journal_entries rv ON rv.reverses_id = i.ledger_entry_id
         LEFT JOIN paid ON paid.invoice_id = i.id
         LEFT JOIN credited ON credited.invoice_id = i.id
        WHERE i.organization_id = :org AND i.kind <> 'credit_note'
     )
     SELECT o.id, o.number, o.kind, o.booking_id, b.reference, o.customer_id, c.name AS customer_name,
            to_char(o.issue_date, 'YYYY-MM-DD') AS issue_date, to_char(o.due_date, 'YYYY-MM-DD') AS due_date,
            o.total_cents, o.issued_at, o.voided_at, o.paid_cents, o.credited_cents
       FROM owed o JOIN bookings b ON b.id = o.booking_id JOIN customers c ON c.id = o.customer_id
      WHERE o.before_refunds <> 0 ${touched.length ? 'OR o.id IN (:touched)' : ''}`,
    ctx,
    { until, ar: ar.id, touched },
  );

  const byCustomer = new Map<string, AgingCustomerRow>();
  for (const i of invoices) {
    const total = Number(i.total_cents);
    // An invoice issued after the day owes nothing on it yet (a payment dated before its issue would show, as in the ledger).
    const issued = i.issued_at < until;
    const voided = i.voided_at !== null && i.voided_at < until;
    const paidCents = Number(i.paid_cents) - (reopened.get(i.id) ?? 0);
    const creditedCents = Number(i.credited_cents);
    const balanceCents = (issued && !voided ? total : 0) - paidCents - creditedCents;
    if (balanceCents === 0) continue;
    const dueDate = i.due_date;
    const days = daysPastDue(dueDate, at);
    const bucket = agingBucket(days);
    let row = byCustomer.get(i.customer_id);
    if (!row) byCustomer.set(i.customer_id, (row = { customer: { id: i.customer_id, name: i.customer_name }, buckets: emptyBuckets(), totalCents: 0, invoices: [] }));
    row.buckets[bucket] += balanceCents;
    row.totalCents += balanceCents;
    row.invoices.push({
      id: i.id, number: i.number, kind: i.kind, bookingId: i.booking_id, bookingReference: i.reference, issueDate: i.issue_date, dueDate,
      daysPastDue: days, bucket, totalCents: total, paidCents, creditedCents, balanceCents,
    });
  }
  const customers = [...byCustomer.values()].sort((a, b) => b.totalCents - a.totalCents || a.customer.name.localeCompare(b.customer.name));
  for (const c of customers) c.invoices.sort((a, b) => a.dueDate.localeCompare(b.dueDate) || a.number.localeCompare(b.number));
  const totals = emptyBuckets();
  for (const c of customers) for (const k of AGING_BUCKETS) totals[k] += c.buckets[k];
  const totalCents = customers.reduce((s, c) => s + c.totalCents, 0);

  // The ledger's own sum (balances.ts), read in the same snapshot.
  const ledger = (await accountBalances(ctx.organizationId, { at, transaction: ctx.t })).find((a) => a.accountId === ar.id)!;
  return {
    at, timeZone: ctx.timeZone, currency: ctx.currency, customers, totals, totalCents,
    reconciliation: ledgerCheck(ar, ledger.balanceCents, totalCents, { accountIds: [ar.id], to: at }),
  };
}
