import { INVOICE_KIND_LABELS, INVOICE_STATUS_LABELS, OFFLINE_METHODS, type InvoiceRow, type InvoiceStatus, type PaymentRow } from '@shared/schemas/invoices';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import { formatCalendarDate, formatZoned } from '@/lib/zoned-time';

export const INVOICE_STATUS_TONES: Record<InvoiceStatus, BadgeTone> = {
  draft: 'neutral',
  open: 'caution',
  partly_paid: 'caution',
  paid: 'positive',
  void: 'negative',
};

export const PAYMENT_METHOD_LABELS: Record<PaymentRow['method'], string> = {
  cash: 'Cash',
  check: 'Check',
  transfer: 'Bank transfer',
  card: 'Card',
};

export const offlineMethodOptions = OFFLINE_METHODS.map((value) => ({ value, label: PAYMENT_METHOD_LABELS[value] }));

/** "Deposit invoice INV-2027-0004", or "Draft deposit invoice" before it has a number. */
export const invoiceName = (i: Pick<InvoiceRow, 'kind' | 'number'>) => (i.number ? `${INVOICE_KIND_LABELS[i.kind]} ${i.number}` : `Draft ${INVOICE_KIND_LABELS[i.kind].toLowerCase()}`);

/** Its number, or "Draft" while it has none. */
export const invoiceNumber = (i: Pick<InvoiceRow, 'number'>) => i.number ?? 'Draft';

/** Issue and due dates are calendar dates; an instant is shown on the company's calendar. */
export const formatInvoiceDate = (value: string | null, timeZone: string) =>
  !value ? '' : /^\d{4}-\d{2}-\d{2}$/.test(value) ? formatCalendarDate(value) : formatZoned(value, timeZone, false);

/** The status, and "Overdue" beside it when the due date has passed with money owing. */
export function InvoiceStatusBadges({ invoice }: { invoice: Pick<InvoiceRow, 'status' | 'overdue'> }) {
  return (
    <span className="inline-flex flex-wrap items-center gap-1">
      <Badge tone={INVOICE_STATUS_TONES[invoice.status]}>{INVOICE_STATUS_LABELS[invoice.status]}</Badge>
      {invoice.overdue ? <Badge tone="negative">Overdue</Badge> : null}
    </span>
  );
}
