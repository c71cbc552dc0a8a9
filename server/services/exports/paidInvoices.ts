import type pg from 'pg';
import { INVOICE_KIND_LABELS, type InvoiceKind } from '../../../shared/schemas/invoices';
import { DEFAULT_CHART } from '../../ledger/chart';
import { amountColumn, type CsvExport, type ExportScope } from './csv';
import { RAW_TEXT_TYPES } from './db';
import { centsSql, methodLabelSql, ratePercent } from './format';
import { PAID_DOCS_CTE } from './paidDocs';

/** Which invoice column feeds each revenue account (by the role the posting rules give it). */
const PART_OF_ACCOUNT: Record<string, string> = {
  rental_revenue: 'rental',
  delivery_labor_revenue: 'delivery_labor',
  damage_waiver_revenue: 'damage_waiver',
  damage_recovery: 'damage',
};

/** The chart's revenue accounts, by code; the default chart's when the company has posted nothing yet. */
export async function revenueAccounts(client: pg.PoolClient, organizationId: string) {
  const { rows } = await client.query<{ code: string; name: string; system_key: string | null }>({
    text: `SELECT code, name, system_key FROM accounts WHERE organization_id = $1 AND type = 'revenue' ORDER BY code`,
    values: [organizationId],
    types: RAW_TEXT_TYPES,
  });
  if (rows.length) return rows;
  return DEFAULT_CHART.filter((a) => a.type === 'revenue').map((a) => ({ code: a.code, name: a.name, system_key: a.systemKey as string | null }));
}

/** A credit note's amounts read as minus. */
const UNIT = `CASE WHEN l.kind = 'credit_note' THEN -0.01 ELSE 0.01 END`;

/**
 * PostgreSQL prints the amounts and writes "how paid" ("check Check 2201; card pi_3Q…; credit note
 * INV-CR-2026-0003": each payment's method and its reference, else its card payment id, in the
 * order received, then the credit notes that settled it), so a row arrives nearly as its CSV
 * cells; the payments and credit notes are grouped once and joined, not looked up row by row.
 * Every row also carries the tax rates of the whole range ("700.00 725.00"), which the header
 * needs before the first row: `listed` is read twice but worked out once, where asking for the
 * rates in a query of their own would settle every invoice a second time.
 */
const rows = (s: ExportScope) => ({
  sql: `
    WITH ${PAID_DOCS_CTE},
    listed AS (
      SELECT d.id, d.number, d.kind, d.credits_invoice_id, d.issue_date, d.paid_at, d.customer_id, b.reference AS booking, b.tax_rate_bp,
             d.rental_cents, d.delivery_labor_cents, d.damage_waiver_cents, d.damage_cents, d.tax_cents, d.total_cents
        FROM paid_docs d JOIN bookings b ON b.id = d.booking_id
    ),
    paid_by AS (
      SELECT a.invoice_id,
             string_agg(${methodLabelSql('p.method')} || coalesce(' ' || coalesce(nullif(p.reference, ''), nullif(p.stripe_payment_intent_id, '')), ''),
                        '; ' ORDER BY p.received_at, p.id) AS how
        FROM payment_allocations a JOIN payments p ON p.id = a.payment_id
       WHERE a.organization_id = $1::uuid
       GROUP BY a.invoice_id
    ),
    noted AS (
      SELECT invoice_id, string_agg('credit note ' || number, '; ' ORDER BY at, number) AS how FROM credit_offs GROUP BY invoice_id
    )
    SELECT l.number, l.kind, cn.number AS credits_number, l.issue_date::text AS issue_date,
           to_char(l.paid_at AT TIME ZONE $4::text, 'YYYY-MM-DD') AS paid_date,
           c.name AS customer, l.booking, l.tax_rate_bp::text AS tax_rate_bp,
           ${centsSql('l.rental_cents', UNIT)} AS rental, ${centsSql('l.delivery_labor_cents', UNIT)} AS delivery_labor,
           ${centsSql('l.damage_waiver_cents', UNIT)} AS damage_waiver, ${centsSql('l.damage_cents', UNIT)} AS damage,
           ${centsSql('l.tax_cents', UNIT)} AS tax, ${centsSql('l.total_cents', UNIT)} AS total,
           concat_ws('; ', pb.how, n.how) AS how_paid,
           (SELECT string_agg(r.rate::text, ' ' ORDER BY r.rate) FROM (SELECT DISTINCT tax_rate_bp AS rate FROM listed) r) AS rates
      FROM listed l
      JOIN customers c ON c.id = l.customer_id
      LEFT JOIN invoices cn ON cn.id = l.credits_invoice_id
      LEFT JOIN paid_by pb ON pb.invoice_id = l.id
      LEFT JOIN noted n ON n.invoice_id = l.id`,
  params: [s.organizationId, s.fromInstant, s.untilInstant, s.timeZone],
});

/**
 * Paid invoices: one row per invoice paid in full in the range (by the day it became paid in
 * full) and per credit note issued in it, its amounts negative. Amounts by revenue account (one
 * column per revenue account of the chart), discount, tax by rate (one column per rate in the
 * range), total.
 */
export const paidInvoicesCsv: CsvExport = {
  rows,
  orderBy: 'l.paid_at, l.number',
  // Every season's invoices sort in about 10 MB; PostgreSQL's default 4 MB would send the sort to
  // disk. Compiling the query (JIT) costs more than it saves on rows this cheap to compute.
  settings: [`SET LOCAL work_mem = '32MB'`, 'SET LOCAL jit = off'],
  async prepare(client, scope) {
    const accounts = await revenueAccounts(client, scope.organizationId);
    const parts = accounts.map((a) => (a.system_key ? PART_OF_ACCOUNT[a.system_key] : undefined));
    return (first) => {
      const rates = first?.rates ? first.rates.split(' ') : [];
      const header = [
        'Number', 'Type', 'Credits invoice', 'Issue date', 'Paid date', 'Customer', 'Booking',
        ...accounts.map((a) => amountColumn(`${a.code} ${a.name}`)),
        amountColumn('Discount'),
        ...rates.map((r) => amountColumn(`Sales tax ${ratePercent(r)}%`)),
        amountColumn('Total'), 'Currency', 'Payment methods and references',
      ];
      return {
        header,
        toRecord(row) {
          const record = [
            row.number ?? '', INVOICE_KIND_LABELS[row.kind as InvoiceKind] ?? row.kind ?? '', row.credits_number ?? '', row.issue_date ?? '', row.paid_date ?? '',
            row.customer ?? '', row.booking ?? '',
          ];
          for (const part of parts) record.push(part ? (row[part] ?? '0.00') : '0.00');
          // Booking discounts are taken off before the invoice's amounts are split (the quote's
          // lines are net), so the invoice holds no separate discount (see DEVELOPERS.md).
          record.push('0.00');
          for (const rate of rates) record.push(rate === row.tax_rate_bp ? (row.tax ?? '0.00') : '0.00');
          record.push(row.total ?? '0.00', scope.currency, row.how_paid ?? '');
          return record;
        },
      };
    };
  },
};
