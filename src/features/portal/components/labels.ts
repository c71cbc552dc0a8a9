import type { InvoiceKind, InvoiceStatus } from '@shared/schemas/invoices';
import type { PortalInvoice } from '@shared/schemas/portal';
import { formatMoney } from '@shared/money';
import type { BadgeTone } from '@/components/ui/badge';
import { formatCalendarDate, formatZoned } from '@/lib/zoned-time';

/*
 * Words for customers, not bookkeepers: "to pay" rather than "open", "confirmed" rather than
 * "reserved". The office's screens keep the trade's own labels.
 */

export const BOOKING_STATUS_WORDS: Record<string, { label: string; tone: BadgeTone }> = {
  draft: { label: 'Being prepared', tone: 'neutral' },
  quoted: { label: 'Quote', tone: 'neutral' },
  reserved: { label: 'Confirmed', tone: 'positive' },
  out: { label: 'Delivered', tone: 'positive' },
  returned: { label: 'Picked up', tone: 'neutral' },
  closed: { label: 'Complete', tone: 'neutral' },
  cancelled: { label: 'Cancelled', tone: 'negative' },
};

export const bookingStatusWords = (status: string) => BOOKING_STATUS_WORDS[status] ?? { label: status, tone: 'neutral' as BadgeTone };

export const INVOICE_KIND_WORDS: Record<InvoiceKind, string> = {
  deposit: 'Deposit',
  balance: 'Balance',
  additional: 'Additional charges',
  credit_note: 'Credit note',
};

export const INVOICE_STATUS_WORDS: Record<InvoiceStatus, { label: string; tone: BadgeTone }> = {
  draft: { label: 'Not sent yet', tone: 'neutral' },
  open: { label: 'To pay', tone: 'caution' },
  partly_paid: { label: 'Part paid', tone: 'caution' },
  paid: { label: 'Paid', tone: 'positive' },
  void: { label: 'Cancelled', tone: 'neutral' },
};

/** "Deposit INV-2027-0004". */
export const invoiceTitle = (invoice: Pick<PortalInvoice, 'kind' | 'number'>) => `${INVOICE_KIND_WORDS[invoice.kind] ?? 'Invoice'} ${invoice.number}`;

export const money = (cents: number, currency: string) => formatMoney(cents, currency);

/** Issue and due dates are calendar dates; an instant is shown on the company's calendar. */
export const formatDay = (value: string | null | undefined, timeZone?: string) =>
  !value ? '' : /^\d{4}-\d{2}-\d{2}$/.test(value) ? formatCalendarDate(value) : formatZoned(value, timeZone ?? browserZone(), false);

export const browserZone = () => Intl.DateTimeFormat().resolvedOptions().timeZone;

/**
 * A span of time on the company's clock, said once: "Sat, Jun 12, 2027, 2:00 – 6:00 PM" on one
 * day, both ends in full across days.
 */
export function formatSpan(start: string, end: string, timeZone: string): string {
  const a = new Date(start);
  const b = new Date(end);
  if (Number.isNaN(a.getTime()) || Number.isNaN(b.getTime())) return `${start} – ${end}`;
  const f = new Intl.DateTimeFormat('en-US', { weekday: 'short', month: 'short', day: 'numeric', year: 'numeric', hour: 'numeric', minute: '2-digit', timeZone });
  return f.formatRange(a, b);
}

/** The days of a span only: "Sat, Jun 12 – Sun, Jun 13, 2027". */
export function formatDays(start: string, end: string, timeZone: string): string {
  const a = new Date(start);
  const b = new Date(end);
  if (Number.isNaN(a.getTime()) || Number.isNaN(b.getTime())) return `${start} – ${end}`;
  const f = new Intl.DateTimeFormat('en-US', { weekday: 'short', month: 'short', day: 'numeric', year: 'numeric', timeZone });
  return f.formatRange(a, b);
}

/** "Central Daylight Time", to say whose clock the times are on. */
export function zoneName(timeZone: string, at: string): string {
  const d = new Date(at);
  const part = new Intl.DateTimeFormat('en-US', { timeZone, timeZoneName: 'long' }).formatToParts(Number.isNaN(d.getTime()) ? new Date() : d).find((p) => p.type === 'timeZoneName');
  return part?.value ?? timeZone;
}
