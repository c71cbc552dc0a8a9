/**
 * Which invoices were paid in full in a range, and when: the SQL the paid-invoices CSV, the PDF
 * ZIP and the UBL ZIP share, so the three always list the same documents.
 *
 * An invoice is settled by payment allocations (at the payment's received time) and by credit
 * notes that took part of it off (at the credit note's ledger time; a credit note on an already
 * paid invoice takes nothing off, it becomes account credit, and does not count). An invoice that
 * is paid now became paid in full at its last settling event: before it, paid + credited was
 * short of the total. A refund reopens the invoice (it is then not paid, and not listed) until a
 * later payment settles it again, whose time is then the paid date. A credit note is settled when
 * it is issued.
 *
 * Parameters: $1 the organization, $2 and $3 the range as instants [from, until).
 */
export const PAID_DOCS_CTE = `
  credit_offs AS (
    SELECT n.id, n.credits_invoice_id AS invoice_id, n.number, e.occurred_at AS at
      FROM invoices n
      JOIN journal_entries e ON e.id = n.ledger_entry_id
     WHERE n.organization_id = $1::uuid AND n.kind = 'credit_note'
       AND EXISTS (SELECT 1 FROM journal_lines l JOIN accounts ac ON ac.id = l.account_id
                    WHERE l.entry_id = e.id AND ac.system_key = 'accounts_receivable' AND l.credit_cents > 0)
  ),
  last_settled AS (
    SELECT invoice_id, max(at) AS at FROM (
      SELECT a.invoice_id, p.received_at AS at
        FROM payment_allocations a JOIN payments p ON p.id = a.payment_id
       WHERE a.organization_id = $1::uuid
      UNION ALL
      SELECT invoice_id, at FROM credit_offs
    ) s GROUP BY invoice_id
  ),
  docs AS (
    SELECT i.*, coalesce(CASE WHEN i.kind = 'credit_note' THEN ie.occurred_at ELSE ls.at END, ie.occurred_at, i.updated_at) AS paid_at
      FROM invoices i
      LEFT JOIN journal_entries ie ON ie.id = i.ledger_entry_id
      LEFT JOIN last_settled ls ON ls.invoice_id = i.id
     WHERE i.organization_id = $1::uuid AND i.status = 'paid' AND i.number IS NOT NULL
  ),
  paid_docs AS (
    SELECT * FROM docs d WHERE d.paid_at >= $2::timestamptz AND d.paid_at < $3::timestamptz
  )`;
