import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useParams, type LoaderFunctionArgs } from 'react-router';
import { formatMoney } from '@shared/money';
import { INVOICE_KIND_LABELS, type InvoiceRow } from '@shared/schemas/invoices';
import { Alert, LiveRegion } from '@/components/ui/alert';
import { Button, buttonClasses } from '@/components/ui/button';
import { SectionCard } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner, Spinner } from '@/components/ui/spinner';
import { linkClasses, TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage, isApiError } from '@/lib/api';
import { useMe } from '@/features/auth/api/get-me';
import { documentPdfInlineUrl, documentPdfUrl } from '@/features/documents/api/get-document-pdf';
import { useBookingPayments } from '@/features/invoices/api/get-booking-payments';
import { useCustomerCredit } from '@/features/invoices/api/get-customer-credit';
import { invoiceQueryOptions, useInvoice } from '@/features/invoices/api/get-invoice';
import { useInvoices } from '@/features/invoices/api/get-invoices';
import { useIssueInvoice } from '@/features/invoices/api/issue-invoice';
import { ApplyCreditDialog } from '@/features/invoices/components/apply-credit-dialog';
import { CreditNoteDialog, splitCredit } from '@/features/invoices/components/credit-note-dialog';
import { formatInvoiceDate, InvoiceStatusBadges, invoiceName, invoiceStatusLabel } from '@/features/invoices/components/invoice-labels';
import { InvoiceLines } from '@/features/invoices/components/invoice-lines';
import { PaymentsTable } from '@/features/invoices/components/payments-table';
import { RecordPaymentDialog } from '@/features/invoices/components/record-payment-dialog';
import { PayLink } from '@/features/invoices/components/pay-link';
import { VoidInvoiceDialog } from '@/features/invoices/components/void-invoice-dialog';
import { useOrganization } from '@/features/organization/api/get-organization';
import { requireArea } from '../../../guards';

export const clientLoader = (queryClient: QueryClient) => async ({ request, params }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'invoices');
  void queryClient.prefetchQuery(invoiceQueryOptions(params.id ?? ''));
  return null;
};

function InvoicePayments({ invoice, timeZone }: { invoice: InvoiceRow; timeZone: string }) {
  const payments = useBookingPayments(invoice.bookingId, { enabled: invoice.number !== null });
  if (invoice.number === null) return <p className="text-sm text-canvas-700">Payments are taken once the invoice is issued.</p>;
  if (payments.isPending) return <Spinner className="text-sm text-canvas-600" label="Loading payments…" />;
  if (payments.isError)
    return (
      <Alert tone="danger" title="The payments could not be loaded.">
        {errorMessage(payments.error)}
      </Alert>
    );
  const here = payments.data.data.filter((p) => p.allocations.some((a) => a.invoiceId === invoice.id));
  if (here.length === 0) return <p className="text-sm text-canvas-700">Nothing received on this invoice yet.</p>;
  return <PaymentsTable payments={here} invoiceId={invoice.id} currency={invoice.currency} timeZone={timeZone} caption={`Payments on invoice ${invoice.number}`} />;
}

/** The credit notes that lowered this invoice, from the booking's invoices. */
function InvoiceCreditNotes({ invoice, timeZone }: { invoice: InvoiceRow; timeZone: string }) {
  const invoices = useInvoices({ bookingId: invoice.bookingId, pageSize: 200 });
  if (invoices.isPending) return <Spinner className="text-sm text-canvas-600" label="Loading credit notes…" />;
  if (invoices.isError)
    return (
      <Alert tone="danger" title="The credit notes could not be loaded.">
        {errorMessage(invoices.error)}
      </Alert>
    );
  const notes = invoices.data.data.filter((n) => n.kind === 'credit_note' && n.creditsInvoice?.id === invoice.id);
  if (notes.length === 0) return <p className="text-sm text-canvas-700">No credit notes on this invoice.</p>;
  return (
    <ul className="space-y-2 text-sm">
      {notes.map((n) => (
        <li key={n.id} className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 rounded-md border border-canvas-200 px-3 py-2">
          <span>
            <TextLink to={paths.app.invoice.getHref(n.id)}>{invoiceName(n)}</TextLink>
            <span className="text-canvas-700">
              {' '}
              · {formatInvoiceDate(n.issueDate, timeZone)}
              {n.reason ? ` · ${n.reason}` : ''}
            </span>
          </span>
          <span className="font-semibold tabular-nums">{formatMoney(n.totalCents, n.currency)}</span>
        </li>
      ))}
    </ul>
  );
}

function InvoicePdf({ invoice }: { invoice: InvoiceRow }) {
  if (!invoice.documentId || !invoice.number) return <p className="text-sm text-canvas-700">The PDF is made when the invoice is issued, with its number and due date.</p>;
  return (
    <div className="space-y-2">
      <a href={documentPdfUrl(invoice.documentId)} download className={buttonClasses('secondary', 'sm')}>
        Download PDF<span className="sr-only"> of invoice {invoice.number}</span>
      </a>
      <iframe
        title={`Preview of ${invoice.number}`}
        src={documentPdfInlineUrl(invoice.documentId)}
        className="h-[70vh] min-h-96 w-full rounded-md border border-canvas-300 bg-canvas-100"
      />
      <p className="text-sm text-canvas-700">
        No preview on your device?{' '}
        <a href={documentPdfInlineUrl(invoice.documentId)} target="_blank" rel="noopener" className={linkClasses}>
          Open the PDF in a new tab
        </a>
        .
      </p>
    </div>
  );
}

/** Keyed by the invoice: moving to another invoice (a credit note and the invoice it lowers) starts with no notice or dialog of the last one. */
export default function InvoiceRoute() {
  const { id = '' } = useParams();
  return <InvoicePage key={id} id={id} />;
}

function InvoicePage({ id }: { id: string }) {
  const invoice = useInvoice(id);
  const organization = useOrganization();
  const timeZone = organization.data?.timeZone ?? 'UTC';
  const { data: me } = useMe();
  const issue = useIssueInvoice();
  const [dialog, setDialog] = useState<'pay' | 'void' | 'creditNote' | 'fromCredit' | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  // The customer's credit, only where it could pay this invoice.
  const mayPay = invoice.data ? invoice.data.kind !== 'credit_note' && invoice.data.can.recordPayment && invoice.data.balanceCents > 0 : false;
  const credit = useCustomerCredit(invoice.data?.customer.id ?? '', { enabled: mayPay });

  if (invoice.isPending) return <PageSpinner label="Loading the invoice…" />;
  if (invoice.isError) {
    if (isApiError(invoice.error) && invoice.error.status === 404) throw invoice.error;
    return (
      <Alert tone="danger" title="The invoice could not be loaded.">
        {errorMessage(invoice.error)}
      </Alert>
    );
  }
  const i = invoice.data;
  const money = (cents: number) => formatMoney(cents, i.currency);
  const title = i.number ? `${i.kind === 'credit_note' ? 'Credit note' : 'Invoice'} ${i.number}` : invoiceName(i);
  const canPay = mayPay;
  const creditCents = (mayPay && credit.data?.creditCents) || 0;
  const isCreditNote = i.kind === 'credit_note';
  const act = (what: NonNullable<typeof dialog>) => {
    setNotice(null);
    issue.reset();
    setDialog(what);
  };

  return (
    <>
      <p className="mb-2 text-sm">
        <TextLink to={paths.app.invoices.getHref()}>Back to invoices</TextLink>
      </p>
      <PageHeader
        title={title}
        description={
          <span className="flex flex-wrap items-center gap-x-2 gap-y-1">
            <InvoiceStatusBadges invoice={i} />
            <span>{INVOICE_KIND_LABELS[i.kind]}</span>
            <span aria-hidden="true">·</span>
            {me?.areas.includes('customers') ? <TextLink to={paths.app.customer.getHref(i.customer.id)}>{i.customer.name}</TextLink> : <span>{i.customer.name}</span>}
            <span aria-hidden="true">·</span>
            {me?.areas.includes('bookings') ? (
              <TextLink to={paths.app.booking.getHref(i.bookingId)}>Booking {i.bookingReference}</TextLink>
            ) : (
              <span>Booking {i.bookingReference}</span>
            )}
          </span>
        }
        actions={
          <>
            {i.can.issue ? (
              <Button
                isLoading={issue.isPending}
                onClick={() => {
                  setNotice(null);
                  issue.mutate(i.id, { onSuccess: (row) => setNotice(`Invoice ${row.number} is issued${row.dueDate ? `, due ${formatInvoiceDate(row.dueDate, timeZone)}` : ''}. Its PDF is below.`) });
                }}
              >
                Issue invoice
              </Button>
            ) : null}
            {canPay ? <Button onClick={() => act('pay')}>Record a payment</Button> : null}
            {canPay && creditCents > 0 ? (
              <Button variant="secondary" onClick={() => act('fromCredit')}>
                Pay from credit
              </Button>
            ) : null}
            {i.can.creditNote ? (
              <Button variant="secondary" onClick={() => act('creditNote')}>
                Issue a credit note
              </Button>
            ) : null}
            {i.can.void ? (
              <Button variant="secondary" disabled={issue.isPending} onClick={() => act('void')}>
                Void invoice
              </Button>
            ) : null}
          </>
        }
      />

      <div className="mb-6 space-y-3">
        <LiveRegion>{notice ? <Alert tone="success">{notice}</Alert> : null}</LiveRegion>
        {issue.isError ? (
          <Alert tone="danger" title="The invoice was not issued.">
            {errorMessage(issue.error)}
          </Alert>
        ) : null}
        {i.status === 'void' ? (
          <Alert tone="warning" title="This invoice is void.">
            {i.voidReason ? `Reason: ${i.voidReason}` : null}
          </Alert>
        ) : null}
        {canPay && creditCents > 0 ? (
          <Alert tone="info" title="The customer has account credit.">
            {i.customer.name} has {money(creditCents)} of credit that can pay this invoice: choose Pay from credit.
          </Alert>
        ) : null}
        {isCreditNote && i.creditsInvoice ? (
          <Alert tone="info" title={`This credit note lowers invoice ${i.creditsInvoice.number ?? '(draft)'}.`}>
            It was applied when issued: {money(i.totalCents)} came off what the customer owes, and any part beyond that invoice’s balance became their account credit.{' '}
            <TextLink to={paths.app.invoice.getHref(i.creditsInvoice.id)}>Open the invoice it credits</TextLink>.
          </Alert>
        ) : null}
        {i.overdue ? (
          <Alert tone="danger" title="This invoice is overdue.">
            It was due {formatInvoiceDate(i.dueDate, timeZone)} and {money(i.balanceCents)} is still owed.
          </Alert>
        ) : null}
      </div>

      <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <div className="space-y-6">
          <SectionCard
            title="Lines"
            description={
              i.kind === 'additional'
                ? 'The charges billed after the event; sales tax on the taxable ones at the booking’s rate.'
                : isCreditNote
                  ? 'What this credit note takes off the invoice it credits.'
                  : 'Copied from the booking’s quote when the invoice was made.'
            }
          >
            <InvoiceLines invoice={i} />
          </SectionCard>
          {isCreditNote ? null : (
            <SectionCard title="Payments">
              <InvoicePayments invoice={i} timeZone={timeZone} />
            </SectionCard>
          )}
          {!isCreditNote && (i.creditedCents > 0 || i.can.creditNote) ? (
            <SectionCard title="Credit notes">
              <InvoiceCreditNotes invoice={i} timeZone={timeZone} />
            </SectionCard>
          ) : null}
        </div>
        <div className="space-y-6">
          <SectionCard title="Details">
            <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-2 text-sm">
              <dt className="text-canvas-600">Issued</dt>
              <dd className="text-canvas-900">{formatInvoiceDate(i.issueDate, timeZone) || 'Not yet'}</dd>
              {isCreditNote ? null : (
                <>
                  <dt className="text-canvas-600">Due</dt>
                  <dd className={i.overdue ? 'font-semibold text-rust-700' : 'text-canvas-900'}>
                    {formatInvoiceDate(i.dueDate, timeZone) || 'Set when issued'}
                    {i.overdue ? ' (overdue)' : null}
                  </dd>
                </>
              )}
              <dt className="text-canvas-600">Customer</dt>
              <dd className="break-all text-canvas-900">
                {i.customer.name}
                <span className="block text-canvas-700">{i.customer.email}</span>
              </dd>
              <dt className="text-canvas-600">Total</dt>
              <dd className="text-canvas-900 tabular-nums" data-testid="invoice-total">
                {money(i.totalCents)}
              </dd>
              {isCreditNote ? (
                <>
                  <dt className="text-canvas-600">Status</dt>
                  <dd className="text-canvas-900">{invoiceStatusLabel(i)}</dd>
                  <dt className="text-canvas-600">Credits</dt>
                  <dd className="text-canvas-900">
                    {i.creditsInvoice ? <TextLink to={paths.app.invoice.getHref(i.creditsInvoice.id)}>Invoice {i.creditsInvoice.number ?? '(draft)'}</TextLink> : '—'}
                  </dd>
                  <dt className="text-canvas-600">Reason</dt>
                  <dd className="break-words text-canvas-900">{i.reason || '—'}</dd>
                </>
              ) : (
                <>
                  <dt className="text-canvas-600">Credited</dt>
                  <dd className="text-canvas-900 tabular-nums" data-testid="invoice-credited">
                    {money(i.creditedCents)}
                  </dd>
                  <dt className="text-canvas-600">Paid</dt>
                  <dd className="text-canvas-900 tabular-nums" data-testid="invoice-paid">
                    {money(i.paidCents)}
                  </dd>
                  <dt className="text-canvas-600">Balance</dt>
                  <dd className="font-semibold text-canvas-900 tabular-nums" data-testid="invoice-balance">
                    {money(i.balanceCents)}
                  </dd>
                </>
              )}
            </dl>
          </SectionCard>
          <SectionCard title="PDF">
            <InvoicePdf invoice={i} />
          </SectionCard>
          {i.payUrl || i.can.revokePayLink ? (
            <SectionCard title="Pay by card">
              <PayLink invoice={i} timeZone={timeZone} />
            </SectionCard>
          ) : null}
        </div>
      </div>

      <RecordPaymentDialog
        open={dialog === 'pay'}
        invoices={[i]}
        split={false}
        timeZone={timeZone}
        onCancel={() => setDialog(null)}
        onDone={(payment) => {
          setDialog(null);
          setNotice(
            `Payment of ${money(payment.amountCents)} recorded${payment.creditCents > 0 ? `, ${money(payment.creditCents)} of it kept as the customer’s credit` : ''}. The receipt is on its way to ${i.customer.email}.`,
          );
        }}
      />
      <CreditNoteDialog
        open={dialog === 'creditNote'}
        invoice={i}
        onCancel={() => setDialog(null)}
        onDone={(note) => {
          setDialog(null);
          // The same split the dialog explained, from the balance before the credit note.
          const { offBalance, toCredit } = splitCredit(note.totalCents, i.balanceCents);
          const issued = `Credit note ${note.number ?? ''} for ${money(note.totalCents)} is issued.`;
          setNotice(
            toCredit === 0
              ? `${issued} ${money(offBalance)} came off the balance.`
              : offBalance === 0
                ? `${issued} The invoice had nothing left to pay, so all of it became ${i.customer.name}’s account credit.`
                : `${issued} ${money(offBalance)} came off the balance; ${money(toCredit)} became ${i.customer.name}’s account credit.`,
          );
        }}
      />
      {canPay && creditCents > 0 ? (
        <ApplyCreditDialog
          open={dialog === 'fromCredit'}
          invoice={i}
          creditCents={creditCents}
          onCancel={() => setDialog(null)}
          onDone={(row, amountCents) => {
            setDialog(null);
            setNotice(`${money(amountCents)} of account credit paid on invoice ${row.number ?? ''}. ${money(row.balanceCents)} is left to pay.`);
          }}
        />
      ) : null}
      <VoidInvoiceDialog
        open={dialog === 'void'}
        invoice={i}
        onCancel={() => setDialog(null)}
        onDone={(row) => {
          setDialog(null);
          setNotice(`Invoice ${row.number ?? ''} is void. A ledger entry reverses it.`.replace('  ', ' '));
        }}
      />
    </>
  );
}
