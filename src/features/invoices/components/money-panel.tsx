import { useId, useState } from 'react';
import { Link } from 'react-router';
import { formatMoney } from '@shared/money';
import type { BookingLedger, InvoiceRow, PaymentRow } from '@shared/schemas/invoices';
import { Alert, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Spinner } from '@/components/ui/spinner';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage, isApiError } from '@/lib/api';
import { cn } from '@/lib/cn';
import { useMe } from '@/features/auth/api/get-me';
import { useCreateBookingInvoice } from '../api/create-booking-invoice';
import { useBookingLedger } from '../api/get-booking-ledger';
import { useBookingPayments } from '../api/get-booking-payments';
import { useInvoices } from '../api/get-invoices';
import { AdditionalChargesDialog } from './additional-charges-dialog';
import { formatInvoiceDate, InvoiceStatusBadges, invoiceName, refundableCents } from './invoice-labels';
import { LedgerEntries } from './ledger-entries';
import { PaymentsTable } from './payments-table';
import { RecordPaymentDialog } from './record-payment-dialog';
import { RefundPaymentDialog } from './refund-payment-dialog';
import { SecurityDepositSection } from './security-deposit-section';

interface MoneyPanelProps {
  booking: { id: string; reference: string; customerEmail: string; securityDepositCents: number };
  timeZone: string;
  currency: string;
  /** From the booking's `can.issueDocuments`: who may bill; others read. */
  canBill: boolean;
  /** The owner's: refunds and returning a security deposit (the server answers 403 to others). */
  canGiveMoneyBack: boolean;
  /** Unsaved edits in the booking: invoices are made from the saved quote. */
  dirty: boolean;
  onChanged?: () => void;
}

/** Money that may still come in on an invoice, as the server allows it. */
const payable = (i: InvoiceRow) => i.kind !== 'credit_note' && i.can.recordPayment && i.balanceCents > 0;

function BookingInvoices({ invoices, timeZone, reference }: { invoices: readonly InvoiceRow[]; timeZone: string; reference: string }) {
  return (
    <Table caption={`Invoices of booking ${reference}`}>
      <THead>
        <Tr>
          <Th>Invoice</Th>
          <Th>Status</Th>
          <Th>Due</Th>
          <Th className="text-right">Total</Th>
          <Th className="text-right">Balance</Th>
        </Tr>
      </THead>
      <TBody>
        {invoices.map((i) => (
          <Tr key={i.id}>
            <Th scope="row" className="py-3">
              <Link className={linkClasses} to={paths.app.invoice.getHref(i.id)}>
                {invoiceName(i)}
              </Link>
            </Th>
            <Td>
              <InvoiceStatusBadges invoice={i} />
            </Td>
            <Td className={cn('whitespace-nowrap', i.overdue && 'font-semibold text-rust-700')}>{formatInvoiceDate(i.dueDate, timeZone) || '—'}</Td>
            {/* A credit note lowers what is owed: its total reads as minus, and it has no balance of its own. */}
            <Td className="text-right whitespace-nowrap tabular-nums">{formatMoney(i.kind === 'credit_note' ? -i.totalCents : i.totalCents, i.currency)}</Td>
            <Td className="text-right font-semibold whitespace-nowrap tabular-nums">{i.kind === 'credit_note' ? '—' : formatMoney(i.balanceCents, i.currency)}</Td>
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}

/**
 * The booking's money: its invoices, the payments received, the balances, and the ledger entries
 * they are summed from.
 */
export function MoneyPanel({ booking, timeZone, currency, canBill, canGiveMoneyBack, dirty, onChanged }: MoneyPanelProps) {
  const invoices = useInvoices({ bookingId: booking.id, pageSize: 200 });
  const payments = useBookingPayments(booking.id);
  const ledger = useBookingLedger(booking.id);
  const create = useCreateBookingInvoice();
  // The invoices as they stood when the dialog opened, so a refetch does not reshape its fields.
  const [paying, setPaying] = useState<InvoiceRow[] | null>(null);
  const ids = useId();
  const [created, setCreated] = useState<InvoiceRow | null>(null);
  const [paid, setPaid] = useState<PaymentRow | null>(null);
  const [refunding, setRefunding] = useState<PaymentRow | null>(null);
  const [refunded, setRefunded] = useState<{ amountCents: number; status: 'pending' | 'succeeded' | 'failed' } | null>(null);
  const [charging, setCharging] = useState(false);
  const me = useMe().data;

  const rows = invoices.data?.data ?? [];
  const open = rows.filter(payable);
  const money = (cents: number) => formatMoney(cents, currency);
  const paymentRows = payments.data?.data ?? [];
  // The customer is the same on every invoice of the booking.
  const customer = rows[0]?.customer;

  const clearNotices = () => {
    setCreated(null);
    setPaid(null);
    setRefunded(null);
  };
  const createInvoice = (kind: 'deposit' | 'balance') => {
    clearNotices();
    create.mutate({ bookingId: booking.id, body: { kind } }, { onSuccess: (invoice) => (setCreated(invoice), onChanged?.()) });
  };
  const creating = create.isPending ? create.variables?.body.kind : null;
  // Everything already invoiced is a fact to tell, not a failure.
  const nothingLeft = isApiError(create.error, 'nothing_to_invoice');

  return (
    <div className="space-y-6">
      {canBill || open.length > 0 ? (
        <div className="space-y-2">
          {canBill && dirty ? <Alert tone="warning">Save your changes first: invoices are made from the saved quote.</Alert> : null}
          <div className="flex flex-wrap gap-2">
            {canBill ? (
              <>
                <Button size="sm" variant="secondary" disabled={dirty || create.isPending} isLoading={creating === 'deposit'} onClick={() => createInvoice('deposit')}>
                  Create deposit invoice
                </Button>
                <Button size="sm" variant="secondary" disabled={dirty || create.isPending} isLoading={creating === 'balance'} onClick={() => createInvoice('balance')}>
                  Create balance invoice
                </Button>
                {/* Charges are typed line by line, not taken from the quote, so unsaved edits do not matter. */}
                <Button
                  size="sm"
                  variant="secondary"
                  disabled={create.isPending}
                  onClick={() => {
                    clearNotices();
                    create.reset();
                    setCharging(true);
                  }}
                >
                  Additional charges
                </Button>
              </>
            ) : null}
            {/* Shown from the invoices' own can.recordPayment, not from the booking. */}
            {open.length > 0 ? (
              <Button
                size="sm"
                onClick={() => {
                  clearNotices();
                  create.reset();
                  setPaying(open);
                }}
              >
                Record a payment
              </Button>
            ) : null}
          </div>
        </div>
      ) : null}

      <LiveRegion>
        {created ? (
          <Alert tone="success">
            {invoiceName(created)} created {created.kind === 'additional' ? `for ${money(created.totalCents)}` : 'from the quote'}.{' '}
            <Link className={linkClasses} to={paths.app.invoice.getHref(created.id)}>
              Open it to check the lines and issue it
            </Link>
            .
          </Alert>
        ) : paid ? (
          <Alert tone="success">
            Payment of {money(paid.amountCents)} recorded{paid.creditCents > 0 ? `, ${money(paid.creditCents)} of it kept as the customer’s credit` : ''}. The receipt is on its way to{' '}
            {booking.customerEmail}.
          </Alert>
        ) : refunded ? (
          refunded.status === 'pending' ? (
            <Alert tone="info">
              Refund of {money(refunded.amountCents)} sent to the card processor. The balances change when it confirms the refund, usually within a minute; the customer
              gets an e-mail then.
            </Alert>
          ) : (
            <Alert tone="success">Refund of {money(refunded.amountCents)} recorded. The invoices it paid are owed again by that much.</Alert>
          )
        ) : nothingLeft ? (
          <Alert tone="info">{create.error?.message}</Alert>
        ) : null}
      </LiveRegion>
      {create.isError && !nothingLeft ? (
        <Alert tone="danger" title="The invoice was not made.">
          {errorMessage(create.error)}
        </Alert>
      ) : null}

      <section aria-labelledby={`${ids}-invoices`}>
        <h3 id={`${ids}-invoices`} className="mb-2 font-semibold text-canvas-900">
          Invoices
        </h3>
        {invoices.isPending ? (
          <Spinner className="text-sm text-canvas-600" label="Loading invoices…" />
        ) : invoices.isError ? (
          <Alert tone="danger" title="The invoices could not be loaded.">
            {errorMessage(invoices.error)}
          </Alert>
        ) : rows.length === 0 ? (
          <p className="text-sm text-canvas-700">No invoices yet.{canBill ? ' Create the deposit invoice once the quote is agreed.' : ''}</p>
        ) : (
          <BookingInvoices invoices={rows} timeZone={timeZone} reference={booking.reference} />
        )}
      </section>

      <section aria-labelledby={`${ids}-payments`}>
        <h3 id={`${ids}-payments`} className="mb-2 font-semibold text-canvas-900">
          Payments
        </h3>
        {payments.isPending ? (
          <Spinner className="text-sm text-canvas-600" label="Loading payments…" />
        ) : payments.isError ? (
          <Alert tone="danger" title="The payments could not be loaded.">
            {errorMessage(payments.error)}
          </Alert>
        ) : payments.data.data.length === 0 ? (
          <p className="text-sm text-canvas-700">No payments received yet.</p>
        ) : (
          <PaymentsTable
            payments={payments.data.data}
            currency={currency}
            timeZone={timeZone}
            caption={`Payments on booking ${booking.reference}`}
            onRefund={
              canGiveMoneyBack
                ? (payment) => {
                    clearNotices();
                    setRefunding(payment);
                  }
                : undefined
            }
          />
        )}
      </section>

      <SecurityDepositSection
        bookingId={booking.id}
        agreedCents={booking.securityDepositCents}
        heldCents={ledger.data?.securityDepositHeldCents}
        ledgerError={ledger.isError}
        currency={currency}
        openInvoices={open}
        canMove={canBill}
        canReturn={canGiveMoneyBack}
        onChanged={onChanged}
      />

      <section aria-labelledby={`${ids}-totals`}>
        <h3 id={`${ids}-totals`} className="font-semibold text-canvas-900">
          Totals
        </h3>
        {ledger.isPending ? (
          <Spinner className="mt-1 text-sm text-canvas-600" label="Loading the balances…" />
        ) : ledger.isError ? (
          <Alert tone="danger" title="The ledger could not be loaded." className="mt-1">
            {errorMessage(ledger.error)}
          </Alert>
        ) : (
          <>
            <dl className="mt-2 grid grid-cols-2 gap-3 sm:grid-cols-4">
              {(
                [
                  ['Invoiced', ledger.data.invoicedCents, 'invoiced'],
                  ['Credited', ledger.data.creditedCents, 'credited'],
                  ['Paid', ledger.data.paidCents, 'paid'],
                  ['Balance', ledger.data.balanceCents, 'balance'],
                ] as const
              ).map(([label, cents, id]) => (
                <div key={label} className={cn('rounded-md border px-3 py-2', label === 'Balance' ? 'border-pine-300 bg-pine-50' : 'border-canvas-200 bg-canvas-50')}>
                  <dt className="text-sm text-canvas-700">{label}</dt>
                  <dd className="text-lg font-semibold text-canvas-900 tabular-nums" data-testid={`booking-${id}`}>
                    {money(cents)}
                  </dd>
                </div>
              ))}
            </dl>
            <p className="mt-2 text-sm text-canvas-700">
              The balance is what was invoiced, less what credit notes took off, less what was paid (net of refunds). A credit note on an invoice that was
              already paid becomes the customer’s account credit instead.
            </p>
            {ledger.data.customerCreditCents !== 0 ? (
              <Alert tone="info" className="mt-3" title="The customer has account credit.">
                <span data-testid="booking-customer-credit">{money(ledger.data.customerCreditCents)}</span>, usable on any of their invoices: open an invoice with a balance and choose Pay
                from credit.
                {customer && me?.areas.includes('customers') ? (
                  <>
                    {' '}
                    <Link className={linkClasses} to={paths.app.customer.getHref(customer.id)}>
                      See {customer.name}’s credit
                    </Link>
                    .
                  </>
                ) : null}
              </Alert>
            ) : null}
            <details className="mt-3">
              <summary className="cursor-pointer text-sm font-semibold text-pine-700 underline hover:text-pine-900">
                Ledger entries ({ledger.data.entries.length})
              </summary>
              <p className="mt-2 text-sm text-canvas-700">Every balance above is the sum of these entries; each one’s debits equal its credits.</p>
              <LedgerEntries entries={ledger.data.entries} currency={currency} timeZone={timeZone} />
            </details>
          </>
        )}
      </section>

      <RecordPaymentDialog
        open={paying !== null}
        invoices={paying ?? []}
        split
        timeZone={timeZone}
        onCancel={() => setPaying(null)}
        onDone={(payment) => {
          setPaying(null);
          setPaid(payment);
          onChanged?.();
        }}
      />
      <AdditionalChargesDialog
        open={charging}
        bookingId={booking.id}
        currency={currency}
        onCancel={() => setCharging(false)}
        onDone={(invoice) => {
          setCharging(false);
          setCreated(invoice);
          onChanged?.();
        }}
      />
      <RefundPaymentDialog
        payment={refunding}
        currency={currency}
        timeZone={timeZone}
        refundableCents={refunding ? refundableCents(refunding) : null}
        onCancel={() => setRefunding(null)}
        onDone={(refund) => {
          setRefunding(null);
          setRefunded(refund);
          onChanged?.();
        }}
      />
    </div>
  );
}
