import { useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { PortalInvoice } from '@shared/schemas/portal';
import { Badge } from '@/components/ui/badge';
import { isApiError } from '@/lib/api';
import { useStartInvoiceCheckout } from '../api/start-checkout';
import { portalBaseKey } from '../api/keys';
import { DocumentLink } from './document-link';
import { formatDay, INVOICE_STATUS_WORDS, invoiceTitle, money } from './labels';
import { goToPaymentPage, PayForm } from './pay-form';

/** The figures of an invoice, as a short list a phone shows in one column. */
export function InvoiceFigures({ invoice, currency, timeZone }: { invoice: PortalInvoice; currency: string; timeZone?: string }) {
  const rows: [string, string][] = [
    ['Issued', formatDay(invoice.issueDate, timeZone)],
    ...(invoice.dueDate && invoice.kind !== 'credit_note' ? ([['Due', formatDay(invoice.dueDate, timeZone)]] as [string, string][]) : []),
    ['Total', money(invoice.totalCents, currency)],
    ...(invoice.paidCents > 0 ? ([['Paid', money(invoice.paidCents, currency)]] as [string, string][]) : []),
    ...(invoice.creditedCents > 0 ? ([['Credited', money(invoice.creditedCents, currency)]] as [string, string][]) : []),
  ];
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm sm:grid-cols-[auto_1fr_auto_1fr]">
      {rows.map(([term, value]) => (
        <div key={term} className="contents">
          <dt className="text-canvas-600">{term}</dt>
          <dd className="text-canvas-900 tabular-nums">{value}</dd>
        </div>
      ))}
    </dl>
  );
}

export function InvoiceStatus({ invoice }: { invoice: PortalInvoice }) {
  const words = INVOICE_STATUS_WORDS[invoice.status] ?? { label: invoice.status, tone: 'neutral' as const };
  return (
    <span className="inline-flex flex-wrap gap-1" data-testid="invoice-status">
      <Badge tone={words.tone}>{invoice.kind === 'credit_note' && invoice.status === 'paid' ? 'Applied' : words.label}</Badge>
      {invoice.overdue && invoice.balanceCents > 0 ? <Badge tone="negative">Overdue</Badge> : null}
    </span>
  );
}

/** One invoice on the customer's booking: where it stands, its PDF, and paying it by card. */
export function InvoiceCard({
  invoice,
  bookingId,
  currency,
  timeZone,
  companyName,
}: {
  invoice: PortalInvoice;
  bookingId: string;
  currency: string;
  timeZone: string;
  companyName: string;
}) {
  const queryClient = useQueryClient();
  const checkout = useStartInvoiceCheckout();
  const [leaving, setLeaving] = useState(false);
  const title = invoiceTitle(invoice);
  const owing = invoice.balanceCents > 0 && invoice.status !== 'void' && invoice.kind !== 'credit_note';

  return (
    <li className="rounded-lg border border-canvas-200 bg-white p-4 shadow-sm sm:p-5">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <h3 className="font-semibold text-canvas-900">{title}</h3>
        <InvoiceStatus invoice={invoice} />
      </div>
      <div className="mt-3">
        <InvoiceFigures invoice={invoice} currency={currency} timeZone={timeZone} />
      </div>
      {owing ? (
        <p className="mt-3 text-base font-semibold text-canvas-900">
          Left to pay: <span className="tabular-nums">{money(invoice.balanceCents, currency)}</span>
        </p>
      ) : null}
      {invoice.documentId ? (
        <div className="mt-3">
          <DocumentLink documentId={invoice.documentId} label={`Download ${title} (PDF)`} />
        </div>
      ) : null}
      {owing && invoice.canPay ? (
        <div className="mt-4 border-t border-canvas-200 pt-4">
          <PayForm
            balanceCents={invoice.balanceCents}
            currency={currency}
            what={title}
            companyName={companyName}
            isPending={checkout.isPending}
            leaving={leaving}
            error={checkout.error}
            onPay={(body) =>
              checkout.mutate(
                { invoiceId: invoice.id, body },
                {
                  onSuccess: ({ url }) => setLeaving(goToPaymentPage(url)),
                  // Paid meanwhile, or card payments switched off: show the booking as it is now.
                  onError: (error) => {
                    if (isApiError(error) && (error.status === 409 || error.status === 422)) {
                      void queryClient.invalidateQueries({ queryKey: [...portalBaseKey, 'bookings', bookingId] });
                    }
                  },
                },
              )
            }
          />
        </div>
      ) : owing ? (
        <p className="mt-3 text-sm text-canvas-700">Card payment isn’t available online for this invoice. Contact {companyName} to pay it another way.</p>
      ) : null}
    </li>
  );
}
