import { amountColumn, type CsvExport, type ExportScope } from './csv';
import { ACCOUNT_TYPE_LABELS, centsText, entryKindLabel } from './format';

/**
 * The general journal: one row per journal line of the entries dated in the range, oldest first,
 * each with its entry's stable number (per company, given when the entry was posted). Every entry
 * balances (the database refuses one that does not), so the debits of any range equal its credits.
 * The source document is what caused the entry: an invoice or credit note number, a payment's
 * reference (or its receipt number when it has none), a booking reference, or the customer.
 */
export const journalCsv: CsvExport = {
  rows: (s: ExportScope) => ({
    sql: `
      SELECT to_char(e.occurred_at AT TIME ZONE $4::text, 'YYYY-MM-DD') AS date, e.occurred_at AS sort_at, e.entry_number::text AS entry_number,
             e.kind, l.position, a.code AS account_code, a.name AS account_name, l.debit_cents::text AS debit, l.credit_cents::text AS credit, e.memo,
             e.source_type,
             CASE e.source_type
               WHEN 'invoice' THEN si.number
               WHEN 'payment' THEN coalesce(nullif(sp.reference, ''), sd.number, sp.stripe_payment_intent_id)
               WHEN 'booking' THEN sb.reference
               WHEN 'customer' THEN sc.name
             END AS source_document,
             b.reference AS booking, c.name AS customer, r.entry_number::text AS reverses
        FROM journal_entries e
        JOIN journal_lines l ON l.entry_id = e.id
        JOIN accounts a ON a.id = l.account_id
        LEFT JOIN invoices si ON e.source_type = 'invoice' AND si.id = e.source_id
        LEFT JOIN payments sp ON e.source_type = 'payment' AND sp.id = e.source_id
        LEFT JOIN documents sd ON sd.id = sp.receipt_document_id
        LEFT JOIN bookings sb ON e.source_type = 'booking' AND sb.id = e.source_id
        LEFT JOIN customers sc ON e.source_type = 'customer' AND sc.id = e.source_id
        LEFT JOIN bookings b ON b.id = e.booking_id
        LEFT JOIN customers c ON c.id = e.customer_id
        LEFT JOIN journal_entries r ON r.id = e.reverses_id
       WHERE e.organization_id = $1::uuid AND e.occurred_at >= $2::timestamptz AND e.occurred_at < $3::timestamptz`,
    params: [s.organizationId, s.fromInstant, s.untilInstant, s.timeZone],
  }),
  orderBy: 'e.occurred_at, e.entry_number, l.position',
  async prepare(_client, scope) {
    return {
      header: [
        'Date', 'Entry number', 'Entry', 'Account code', 'Account name', amountColumn('Debit'), amountColumn('Credit'), 'Currency', 'Memo',
        'Source', 'Source document', 'Booking', 'Customer', 'Reverses entry',
      ],
      toRecord(row) {
        return [
          row.date ?? '', row.entry_number ?? '', entryKindLabel(row.kind ?? ''), row.account_code ?? '', row.account_name ?? '',
          centsText(row.debit), centsText(row.credit), scope.currency, row.memo ?? '', row.source_type ?? '', row.source_document ?? '',
          row.booking ?? '', row.customer ?? '', row.reverses ?? '',
        ];
      },
    };
  },
};

/**
 * The trial balance at the end of the closing day: every account with its net balance in the
 * debit or the credit column, as `trialBalance` in server/ledger/balances.ts works it out (an
 * inactive account shows only while it carries a balance). A separate file rather than a closing
 * section of the journal, so each CSV is one table that spreadsheets and imports read as it is.
 * `Balance` is debit minus credit, so that column sums to zero.
 */
export const trialBalanceCsv: CsvExport = {
  rows: (s: ExportScope) => ({
    sql: `
      SELECT a.code, a.name, a.type::text AS type,
             greatest(coalesce(sum(x.debit_cents - x.credit_cents), 0), 0)::text AS debit,
             greatest(coalesce(sum(x.credit_cents - x.debit_cents), 0), 0)::text AS credit,
             coalesce(sum(x.debit_cents - x.credit_cents), 0)::text AS balance
        FROM accounts a
        LEFT JOIN (SELECT l.account_id, l.debit_cents, l.credit_cents
                     FROM journal_lines l JOIN journal_entries e ON e.id = l.entry_id
                    WHERE l.organization_id = $1::uuid AND e.occurred_at < $2::timestamptz) x ON x.account_id = a.id
       WHERE a.organization_id = $1::uuid
       GROUP BY a.id
      HAVING a.active OR coalesce(sum(x.debit_cents - x.credit_cents), 0) <> 0`,
    params: [s.organizationId, s.untilInstant],
  }),
  orderBy: 'code',
  async prepare(_client, scope) {
    return {
      header: ['Account code', 'Account name', 'Account type', amountColumn('Debit'), amountColumn('Credit'), amountColumn('Balance'), 'Currency'],
      toRecord(row) {
        return [row.code ?? '', row.name ?? '', ACCOUNT_TYPE_LABELS[row.type ?? ''] ?? row.type ?? '', centsText(row.debit), centsText(row.credit), centsText(row.balance), scope.currency];
      },
    };
  },
};
