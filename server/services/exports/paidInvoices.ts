import type pg from 'pg';
import { INVOICE_KIND_LABELS, type InvoiceKind } from '../../../shared/schemas/invoices';
import { DEFAULT_CHART } from '../../ledger/chart';
import type { CsvExport, ExportScope, TextRow } from './csv';
import { RAW_TEXT_TYPES } from './db';
import { centsText, METHOD_LABELS, negatedCents, ratePercent, safeText } from './format';
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

const rows = (s: ExportScope) => ({
  sql: `
    WITH ${PAID_DOCS_CTE}
    SELECT d.id, d.number, d.kind, cn.number AS credits_number, d.issue_date::text AS issue_date,
           to_char(d.paid_at AT TIME ZONE $4::text, 'YYYY-MM-DD') AS paid_date, d.paid_at AS sort_at,
           c.name AS customer, b.reference AS booking, b.tax_rate_bp::text AS tax_rate_bp,
           d.rental_cents::text AS rental, d.delivery_labor_cents::text AS delivery_labor, d.damage_waiver_cents::text AS damage_waiver,
           d.damage_cents::text AS damage, d.tax_cents::text AS tax, d.total_cents::text AS total,
           (SELECT json_agg(json_build_object('method', p.method, 'reference', p.reference, 'intent', p.stripe_payment_intent_id) ORDER BY p.received_at, p.id)
              FROM payment_allocations a JOIN payments p ON p.id = a.payment_id WHERE a.invoice_id = d.id) AS payments,
           (SELECT json_agg(o.number ORDER BY o.at, o.number) FROM credit_offs o WHERE o.invoice_id = d.id) AS credit_notes
      FROM paid_docs d
      JOIN customers c ON c.id = d.customer_id
      JOIN bookings b ON b.id = d.booking_id
      LEFT JOIN invoices cn ON cn.id = d.credits_invoice_id`,
  params: [s.organizationId, s.fromInstant, s.untilInstant, s.timeZone],
});

/** "check Check 2201; card pi_3Q…; credit note INV-CR-2026-0003". */
function howPaid(row: TextRow): string {
  const payments = JSON.parse(row.payments ?? 'null') as { method: string; reference: string; intent: string | null }[] | null;
  const notes = JSON.parse(row.credit_notes ?? 'null') as string[] | null;
  return [
    ...(payments ?? []).map((p) => [METHOD_LABELS[p.method] ?? p.method, p.reference || p.intent || ''].filter(Boolean).join(' ')),
    ...(notes ?? []).map((n) => `credit note ${n}`),
  ].join('; ');
}

/**
 * Paid invoices: one row per invoice paid in full in the range (by the day it became paid in
 * full) and per credit note issued in it, its amounts negative. Amounts by revenue account (one
 * column per revenue account of the chart), discount, tax by rate (one column per rate in the
 * range), total.
 */
export const paidInvoicesCsv: CsvExport = {
  rows,
  orderBy: 'sort_at, number',
  async prepare(client, scope) {
    const accounts = await revenueAccounts(client, scope.organizationId);
    const rates = (
      await client.query<{ rate: string }>({
        text: `WITH ${PAID_DOCS_CTE}
               SELECT rate::text AS rate FROM (SELECT DISTINCT b.tax_rate_bp AS rate FROM paid_docs d JOIN bookings b ON b.id = d.booking_id) x ORDER BY x.rate`,
        values: [scope.organizationId, scope.fromInstant, scope.untilInstant],
        types: RAW_TEXT_TYPES,
      })
    ).rows.map((r) => r.rate);
    const header = [
      'Number', 'Type', 'Credits invoice', 'Issue date', 'Paid date', 'Customer', 'Booking',
      ...accounts.map((a) => `${a.code} ${a.name}`),
      'Discount',
      ...rates.map((r) => `Sales tax ${ratePercent(r)}%`),
      'Total', 'Currency', 'Payment methods and references',
    ];
    return {
      header,
      toRecord(row) {
        const sign = (cents: string | null) => centsText(row.kind === 'credit_note' ? negatedCents(cents ?? '0') : cents);
        return [
          row.number ?? '', INVOICE_KIND_LABELS[row.kind as InvoiceKind] ?? row.kind ?? '', row.credits_number ?? '', row.issue_date ?? '', row.paid_date ?? '',
          safeText(row.customer), row.booking ?? '',
          ...accounts.map((a) => {
            const part = a.system_key ? PART_OF_ACCOUNT[a.system_key] : undefined;
            return sign(part ? row[part] : '0');
          }),
          // Booking discounts are taken off before the invoice's amounts are split (the quote's
          // lines are net), so the invoice holds no separate discount (see DEVELOPERS.md).
          '0.00',
          ...rates.map((r) => sign(r === row.tax_rate_bp ? row.tax : '0')),
          sign(row.total), scope.currency, safeText(howPaid(row)),
        ];
      },
    };
  },
};
