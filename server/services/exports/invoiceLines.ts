import { INVOICE_KIND_LABELS, INVOICE_STATUS_LABELS, type InvoiceKind, type InvoiceStatus } from '../../../shared/schemas/invoices';
import { amountColumn, type CsvExport, type ExportScope } from './csv';
import { centsText, negatedCents, ratePercent } from './format';

/**
 * Invoice lines: one row per line of every invoice and credit note issued in the range (by its
 * issue date; drafts have no number and void invoices were reversed, so neither is listed), with
 * the account the line's money belongs to. Sales tax is worked once per invoice, not per line
 * (rounded once per rate per invoice), so it is a line of its own on the sales tax account; the
 * lines of an invoice add up to its total. Credit note lines read as minus.
 */
export const invoiceLinesCsv: CsvExport = {
  rows: (s: ExportScope) => ({
    sql: `
      SELECT i.number, i.kind, i.status, i.issue_date::text AS issue_date, c.name AS customer, b.reference AS booking, b.tax_rate_bp::text AS tax_rate_bp,
             l.ord::text AS line_no, l.line->>'description' AS description, l.line->>'category' AS category, (l.line->>'amountCents') AS amount,
             a.code AS account_code, a.name AS account_name
        FROM invoices i
        JOIN customers c ON c.id = i.customer_id
        JOIN bookings b ON b.id = i.booking_id
        CROSS JOIN LATERAL jsonb_array_elements(i.lines) WITH ORDINALITY AS l(line, ord)
        LEFT JOIN accounts a ON a.organization_id = i.organization_id AND a.system_key = CASE l.line->>'category'
             WHEN 'rental' THEN 'rental_revenue' WHEN 'delivery_labor' THEN 'delivery_labor_revenue' WHEN 'damage_waiver' THEN 'damage_waiver_revenue'
             WHEN 'damage' THEN 'damage_recovery' WHEN 'tax' THEN 'sales_tax_payable' END
       WHERE i.organization_id = $1::uuid AND i.number IS NOT NULL AND i.status NOT IN ('draft', 'void')
         AND i.issue_date >= $2::date AND i.issue_date <= $3::date`,
    params: [s.organizationId, s.from, s.to],
  }),
  orderBy: 'i.issue_date, i.number, l.ord',
  async prepare(_client, scope) {
    return {
      header: [
        'Invoice number', 'Type', 'Status', 'Issue date', 'Customer', 'Booking', 'Line', 'Description', 'Category',
        'Account code', 'Account name', amountColumn('Amount'), 'Currency', 'Tax rate %',
      ],
      toRecord(row) {
        const amount = row.amount ?? '0';
        return [
          row.number ?? '', INVOICE_KIND_LABELS[row.kind as InvoiceKind] ?? row.kind ?? '', INVOICE_STATUS_LABELS[row.status as InvoiceStatus] ?? row.status ?? '',
          row.issue_date ?? '', row.customer ?? '', row.booking ?? '', row.line_no ?? '', row.description ?? '', row.category ?? '',
          row.account_code ?? '', row.account_name ?? '', centsText(row.kind === 'credit_note' ? negatedCents(amount) : amount), scope.currency,
          ratePercent(row.tax_rate_bp ?? '0'),
        ];
      },
    };
  },
};
