import { useState } from 'react';
import { formatMoney } from '@shared/money';
import { CreditRefundRequest, type CustomerCredit } from '@shared/schemas/invoices';
import { Alert, FormMessage, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { Select } from '@/components/ui/select';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { TextArea } from '@/components/ui/textarea';
import { TextField } from '@/components/ui/text-field';
import { centsToInput, collector, parseDollars } from '@/lib/amounts';
import { useZodForm } from '@/lib/form';
import { formatZoned } from '@/lib/zoned-time';
import { useRefundCustomerCredit } from '../api/refund-customer-credit';
import { moneyMethodOptions } from './invoice-labels';
import { kindText } from './ledger-labels';

function toInput(v: Record<string, string>) {
  const c = collector();
  c.put('amountCents', parseDollars(v.amountCents, null));
  c.input.method = v.method || undefined;
  c.input.reason = v.reason;
  return c;
}

interface PayBackFormProps {
  customerId: string;
  creditCents: number;
  currency: string;
  onDone: (amountCents: number) => void;
  onCancel: () => void;
  paying: ReturnType<typeof useRefundCustomerCredit>;
}

function PayBackForm({ customerId, creditCents, currency, onDone, onCancel, paying }: PayBackFormProps) {
  const form = useZodForm(CreditRefundRequest, { amountCents: creditCents > 0 ? centsToInput(creditCents) : '', method: '', reason: '' }, { toInput });
  const money = (cents: number) => formatMoney(cents, currency);
  const submit = form.handleSubmit((body) => {
    if (body.amountCents > creditCents) {
      form.setErrors({ amountCents: `At most ${money(creditCents)}: that is all the credit the customer has.` });
      form.setFormError('Check the highlighted fields.');
      requestAnimationFrame(() => form.formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
      return;
    }
    form.setFormError(null);
    paying.mutate({ customerId, body }, { onSuccess: () => onDone(body.amountCents), onError: form.showError });
  });
  return (
    <form ref={form.formRef} onSubmit={submit} noValidate aria-label="Pay credit back" className="space-y-4">
      <p className="text-sm text-canvas-700">Give the customer their credit back in money. Record it once the money has gone out; the credit goes down by as much.</p>
      <FormMessage message={form.formError} />
      <fieldset disabled={paying.isPending} className="space-y-4">
        <TextField
          label="Amount"
          inputMode="decimal"
          autoComplete="off"
          required
          hint={`In dollars and cents, like 125.00. The customer has ${money(creditCents)} of credit.`}
          {...form.field('amountCents')}
        />
        <Select label="Method" options={moneyMethodOptions} placeholder="Choose how it goes back" required {...form.field('method')} />
        <TextArea label="Reason" required maxLength={500} hint="Kept on the ledger entry." {...form.field('reason')} />
      </fieldset>
      <div className="flex flex-wrap justify-end gap-2 pt-2">
        <Button variant="secondary" onClick={onCancel} disabled={paying.isPending}>
          Cancel
        </Button>
        <Button type="submit" variant="danger" isLoading={paying.isPending}>
          Pay it back
        </Button>
      </div>
    </form>
  );
}

function CreditMoves({ credit, customerName, timeZone }: { credit: CustomerCredit; customerName: string; timeZone: string }) {
  const money = (cents: number) => (cents ? formatMoney(cents, credit.currency) : '');
  return (
    <Table caption={`Account credit moves of ${customerName}, newest first`}>
      <THead>
        <Tr>
          <Th>Date</Th>
          <Th>Booking</Th>
          <Th>What</Th>
          <Th className="text-right">Added</Th>
          <Th className="text-right">Used or paid back</Th>
        </Tr>
      </THead>
      <TBody>
        {credit.moves.map((move) => {
          const kind = kindText(move.kind);
          return (
            <Tr key={move.entryId}>
              <Th scope="row" className="py-3 font-normal whitespace-nowrap">
                {formatZoned(move.occurredAt, timeZone, false)}
              </Th>
              <Td className="whitespace-nowrap">{move.bookingReference ?? '—'}</Td>
              <Td className="min-w-48">
                <span className="font-semibold text-canvas-900">{kind}</span>
                {move.memo && move.memo !== kind ? <span className="block text-canvas-700">{move.memo}</span> : null}
              </Td>
              <Td className="text-right whitespace-nowrap tabular-nums">{money(move.inCents)}</Td>
              <Td className="text-right whitespace-nowrap tabular-nums">{money(move.outCents)}</Td>
            </Tr>
          );
        })}
      </TBody>
    </Table>
  );
}

interface CustomerCreditPanelProps {
  customerId: string;
  customerName: string;
  credit: CustomerCredit;
  timeZone: string;
  /** The owner's (the server answers 403 to others). */
  canPayBack: boolean;
}

/**
 * What the company owes the customer as account credit (overpayments kept, credit notes beyond
 * an invoice's balance), how it moved, and for the owner a way to pay it back.
 */
export function CustomerCreditPanel({ customerId, customerName, credit, timeZone, canPayBack }: CustomerCreditPanelProps) {
  const paying = useRefundCustomerCredit();
  const [open, setOpen] = useState(false);
  const [paidBack, setPaidBack] = useState<number | null>(null);
  const money = (cents: number) => formatMoney(cents, credit.currency);
  const close = () => {
    paying.reset();
    setOpen(false);
  };
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <dl className="rounded-md border border-pine-300 bg-pine-50 px-3 py-2">
          <dt className="text-sm text-canvas-700">Credit now</dt>
          <dd className="text-lg font-semibold text-canvas-900 tabular-nums" data-testid="customer-credit">
            {money(credit.creditCents)}
          </dd>
        </dl>
        {canPayBack && credit.creditCents > 0 ? (
          <Button
            variant="secondary"
            onClick={() => {
              setPaidBack(null);
              paying.reset();
              setOpen(true);
            }}
          >
            Pay credit back
          </Button>
        ) : null}
      </div>
      <p className="text-sm text-canvas-700">
        {credit.creditCents > 0
          ? 'Usable on any of this customer’s invoices: open the invoice and choose Pay from credit.'
          : 'Nothing to use now; the moves below show where earlier credit went.'}
      </p>
      <LiveRegion>{paidBack !== null ? <Alert tone="success">{money(paidBack)} of credit paid back to {customerName}.</Alert> : null}</LiveRegion>
      {credit.moves.length > 0 ? <CreditMoves credit={credit} customerName={customerName} timeZone={timeZone} /> : null}
      <Dialog open={open} title="Pay credit back" busy={paying.isPending} onClose={close}>
        <PayBackForm
          customerId={customerId}
          creditCents={credit.creditCents}
          currency={credit.currency}
          paying={paying}
          onCancel={close}
          onDone={(amountCents) => {
            setPaidBack(amountCents);
            setOpen(false);
          }}
        />
      </Dialog>
    </div>
  );
}
