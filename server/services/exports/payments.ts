import { amountColumn, type CsvExport, type ExportScope, type TextRow } from './csv';
import { centsText, METHOD_LABELS } from './format';

const TYPE_LABELS: Record<string, string> = {
  payment: 'Payment',
  refund: 'Refund',
  security_deposit_received: 'Security deposit received',
  security_deposit_returned: 'Security deposit returned',
  credit_paid_back: 'Account credit paid back',
};

const STATUS_LABELS: Record<string, string> = {
  received: 'Received',
  done: 'Done',
  pending: 'Pending at the card processor',
  succeeded: 'Refunded',
  failed: 'Failed',
};

const invoicesOf = (payment: string) => `(SELECT json_agg(json_build_object('number', i.number, 'amount', a.amount_cents::text) ORDER BY i.number)
           FROM payment_allocations a JOIN invoices i ON i.id = a.invoice_id WHERE a.payment_id = ${payment})::text`;

/**
 * Payments and refunds: one row for each payment received in the range (by its received time),
 * each refund (by the time its ledger entry was posted, or asked for while a card refund is
 * pending), each security deposit taken or returned, and each payment of account credit back to
 * a customer. Money in is positive, money out negative. Card rows carry the processor's ids.
 * Fee: what the card processor kept of a card payment, as a positive amount (the payout is the
 * amount less the fee; the ledger books it to Card processing fees). It is empty, never zero, where
 * the fee is not known: other methods, refunds (the processor keeps the payment's fee and charges
 * none on a US refund, but Guyline does not ask), or a card payment whose fee lookup failed.
 */
export const paymentsCsv: CsvExport = {
  rows: (s: ExportScope) => ({
    sql: `
      SELECT x.*, to_char(x.at AT TIME ZONE $4::text, 'YYYY-MM-DD') AS date FROM (
        SELECT p.id, p.received_at AS at, 'payment' AS type, p.method::text AS method, p.amount_cents::text AS amount, p.credit_cents::text AS kept_credit,
               p.reference, p.stripe_payment_intent_id AS intent, p.stripe_charge_id AS charge, NULL::text AS refund_id, p.fee_cents::text AS fee, 'received' AS status,
               ${invoicesOf('p.id')} AS invoices, c.name AS customer, b.reference AS booking, d.number AS receipt, ''::text AS note
          FROM payments p
          JOIN customers c ON c.id = p.customer_id
          JOIN bookings b ON b.id = p.booking_id
          LEFT JOIN documents d ON d.id = p.receipt_document_id
         WHERE p.organization_id = $1::uuid AND p.received_at >= $2::timestamptz AND p.received_at < $3::timestamptz
        UNION ALL
        SELECT r.id, coalesce(e.occurred_at, r.created_at), 'refund', p.method::text, (-r.amount_cents)::text, '0',
               p.reference, p.stripe_payment_intent_id, p.stripe_charge_id, r.stripe_refund_id, NULL, r.status::text,
               ${invoicesOf('p.id')}, c.name, b.reference, NULL, r.reason
          FROM refunds r
          JOIN payments p ON p.id = r.payment_id
          JOIN customers c ON c.id = p.customer_id
          JOIN bookings b ON b.id = r.booking_id
          LEFT JOIN journal_entries e ON e.id = r.ledger_entry_id
         WHERE r.organization_id = $1::uuid AND coalesce(e.occurred_at, r.created_at) >= $2::timestamptz AND coalesce(e.occurred_at, r.created_at) < $3::timestamptz
        UNION ALL
        SELECT m.id, coalesce(e.occurred_at, m.created_at), CASE m.kind WHEN 'held' THEN 'security_deposit_received' ELSE 'security_deposit_returned' END,
               coalesce(m.method::text, ''), (CASE m.kind WHEN 'held' THEN m.amount_cents ELSE -m.amount_cents END)::text, '0',
               '', NULL, NULL, NULL, NULL, 'done', NULL, c.name, b.reference, NULL, m.reason
          FROM security_deposit_moves m
          JOIN bookings b ON b.id = m.booking_id
          JOIN customers c ON c.id = b.customer_id
          LEFT JOIN journal_entries e ON e.id = m.ledger_entry_id
         WHERE m.organization_id = $1::uuid AND m.kind IN ('held', 'refunded')
           AND coalesce(e.occurred_at, m.created_at) >= $2::timestamptz AND coalesce(e.occurred_at, m.created_at) < $3::timestamptz
        UNION ALL
        SELECT e.id, e.occurred_at, 'credit_paid_back', coalesce(substring(e.memo from '^Credit paid back by ([a-z ]+):'), ''),
               (-(SELECT sum(l.debit_cents) FROM journal_lines l JOIN accounts ac ON ac.id = l.account_id WHERE l.entry_id = e.id AND ac.system_key = 'customer_credit'))::text,
               '0', '', NULL, NULL, NULL, NULL, 'done', NULL, c.name, NULL, NULL, e.memo
          FROM journal_entries e
          LEFT JOIN customers c ON c.id = e.customer_id
         WHERE e.organization_id = $1::uuid AND e.kind = 'credit_refunded' AND e.occurred_at >= $2::timestamptz AND e.occurred_at < $3::timestamptz
      ) x`,
    params: [s.organizationId, s.fromInstant, s.untilInstant, s.timeZone],
  }),
  orderBy: 'x.at, x.type, x.id',
  async prepare(_client, scope) {
    return {
      header: [
        'Date', 'Type', 'Method', amountColumn('Amount'), amountColumn('Kept as account credit'), 'Currency', 'Reference', 'Card payment id', 'Card charge id', 'Card refund id',
        amountColumn('Fee'), 'Status', 'Invoices', 'Customer', 'Booking', 'Receipt', 'Note',
      ],
      toRecord(row: TextRow) {
        const invoices = (JSON.parse(row.invoices ?? 'null') as { number: string; amount: string }[] | null) ?? [];
        return [
          row.date ?? '', TYPE_LABELS[row.type ?? ''] ?? row.type ?? '', METHOD_LABELS[row.method ?? ''] ?? row.method ?? '', centsText(row.amount),
          centsText(row.kept_credit), scope.currency, row.reference ?? '', row.intent ?? '', row.charge ?? '', row.refund_id ?? '',
          row.fee == null ? '' : centsText(row.fee),
          STATUS_LABELS[row.status ?? ''] ?? row.status ?? '',
          invoices.map((i) => `${i.number} ${centsText(i.amount)}`).join('; '),
          row.customer ?? '', row.booking ?? '', row.receipt ?? '', row.note ?? '',
        ];
      },
    };
  },
};
