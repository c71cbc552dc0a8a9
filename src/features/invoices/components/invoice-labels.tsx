import { INVOICE_KIND_LABELS, INVOICE_STATUS_LABELS, OFFLINE_METHODS, type InvoiceRow, type InvoiceStatus, type PaymentRow, type ReceiptMethod } from '@shared/schemas/invoices';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import { formatCalendarDate, formatZoned } from '@/lib/zoned-time';

export const INVOICE_STATUS_TONES: Record<InvoiceStatus, BadgeTone> = {
  draft: 'neutral',
  open: 'caution',
  partly_paid: 'caution',
  paid: 'positive',
  void: 'negative',
};

export const PAYMENT_METHOD_LABELS: Record<ReceiptMethod, string> = {
  cash: 'Cash',
  check: 'Check',
  transfer: 'Bank transfer',
  card: 'Card',
  security_deposit: 'From security deposit',
  credit: 'From account credit',
};

/** Ways money itself moves (a security deposit collected or returned, credit paid back). */
export const MONEY_METHODS = ['cash', 'check', 'transfer', 'card'] as const;
export const moneyMethodOptions = MONEY_METHODS.map((value) => ({ value, label: PAYMENT_METHOD_LABELS[value] }));

/** A payment that moved what the customer already had with us, rather than new money. */
export const isTransfer = (method: ReceiptMethod) => method === 'security_deposit' || method === 'credit';

/**
 * What can still go back of a payment: the part kept as account credit is not refunded from the
 * payment (the owner pays credit back from the customer's page), nor is what went back before.
 */
export const refundableCents = (p: Pick<PaymentRow, 'amountCents' | 'creditCents' | 'refundedCents' | 'pendingRefundCents'>) =>
  Math.max(0, p.amountCents - p.creditCents - p.refundedCents - p.pendingRefundCents);

/** Money payments can be refunded; moves from the security deposit or account credit are not money paid in. */
export const canRefundPayment = (p: PaymentRow) => !isTransfer(p.method) && refundableCents(p) > 0;

export const offlineMethodOptions = OFFLINE_METHODS.map((value) => ({ value, label: PAYMENT_METHOD_LABELS[value] }));

/** "Deposit invoice INV-2027-0004", or "Draft deposit invoice" before it has a number. */
export const invoiceName = (i: Pick<InvoiceRow, 'kind' | 'number'>) => (i.number ? `${INVOICE_KIND_LABELS[i.kind]} ${i.number}` : `Draft ${INVOICE_KIND_LABELS[i.kind].toLowerCase()}`);

/** Its number, or "Draft" while it has none. */
export const invoiceNumber = (i: Pick<InvoiceRow, 'number'>) => i.number ?? 'Draft';

/** Issue and due dates are calendar dates; an instant is shown on the company's calendar. */
export const formatInvoiceDate = (value: string | null, timeZone: string) =>
  !value ? '' : /^\d{4}-\d{2}-\d{2}$/.test(value) ? formatCalendarDate(value) : formatZoned(value, timeZone, false);

/** A credit note is settled the moment it is issued: "paid" on it means it has been applied. */
export const invoiceStatusLabel = (i: Pick<InvoiceRow, 'status' | 'kind'>) => (i.kind === 'credit_note' && i.status === 'paid' ? 'Applied' : INVOICE_STATUS_LABELS[i.status]);

/** The status, and "Overdue" beside it when the due date has passed with money owing. */
export function InvoiceStatusBadges({ invoice }: { invoice: Pick<InvoiceRow, 'status' | 'overdue' | 'kind'> }) {
  return (
    <span className="inline-flex flex-wrap items-center gap-1">
      <Badge tone={INVOICE_STATUS_TONES[invoice.status]}>{invoiceStatusLabel(invoice)}</Badge>
      {invoice.overdue ? <Badge tone="negative">Overdue</Badge> : null}
    </span>
  );
}
