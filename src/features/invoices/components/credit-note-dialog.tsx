import { formatMoney, subtract } from '@shared/money';
import { CreditNoteRequest, type InvoiceRow } from '@shared/schemas/invoices';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { TextArea } from '@/components/ui/textarea';
import { TextField } from '@/components/ui/text-field';
import { centsToInput, collector, parseDollars } from '@/lib/amounts';
import { useZodForm } from '@/lib/form';
import { useCreateCreditNote } from '../api/create-credit-note';
import { invoiceNumber } from './invoice-labels';

/** What a credit note can still take off: the invoice's total less the credit notes before it. */
/** Credit notes on one invoice add up to its total at most, counting the parts that became account credit. */
export const creditableCents = (i: Pick<InvoiceRow, 'totalCents' | 'creditNotesCents'>) => Math.max(0, subtract(i.totalCents, i.creditNotesCents));

/**
 * How a credit of `amountCents` lands: first off what is still owed on the invoice, the rest as
 * the customer's account credit (money they already paid that we now owe them).
 */
export function splitCredit(amountCents: number, balanceCents: number) {
  const offBalance = Math.min(amountCents, Math.max(0, balanceCents));
  return { offBalance, toCredit: amountCents - offBalance };
}

function toInput(v: Record<string, string>) {
  const c = collector();
  c.put('amountCents', parseDollars(v.amountCents, null));
  c.input.reason = v.reason;
  return c;
}

interface CreditNoteFormProps {
  invoice: InvoiceRow;
  onDone: (creditNote: InvoiceRow) => void;
  onCancel: () => void;
  creating: ReturnType<typeof useCreateCreditNote>;
}

function CreditNoteForm({ invoice: i, onDone, onCancel, creating }: CreditNoteFormProps) {
  const form = useZodForm(CreditNoteRequest, { amountCents: i.balanceCents > 0 ? centsToInput(i.balanceCents) : '', reason: '' }, { toInput });
  const money = (cents: number) => formatMoney(cents, i.currency);
  const most = creditableCents(i);
  const submit = form.handleSubmit((body) => {
    if (body.amountCents > most) {
      form.setErrors({ amountCents: `At most ${money(most)} can still be credited on ${invoiceNumber(i)}.` });
      form.setFormError('Check the highlighted fields.');
      requestAnimationFrame(() => form.formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
      return;
    }
    form.setFormError(null);
    creating.mutate({ invoiceId: i.id, body }, { onSuccess: onDone, onError: form.showError });
  });

  const typed = parseDollars(form.values.amountCents, 0);
  const amount = typed.ok ? (typed.value ?? 0) : 0;
  const { offBalance, toCredit } = splitCredit(amount, i.balanceCents);
  const explanation =
    amount <= 0 || amount > most
      ? null
      : toCredit === 0
        ? `${money(offBalance)} comes off the balance of ${invoiceNumber(i)}, leaving ${money(i.balanceCents - offBalance)} to pay.`
        : offBalance > 0
          ? `${money(offBalance)} comes off the balance of ${invoiceNumber(i)}, which is then settled; the other ${money(toCredit)} becomes the customer’s account credit.`
          : `${invoiceNumber(i)} has nothing left to pay, so all ${money(toCredit)} becomes the customer’s account credit.`;

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate aria-label="Issue a credit note" className="space-y-4">
      <p className="text-sm text-canvas-700">
        A credit note lowers what the customer owes on {invoiceNumber(i)}. It is numbered and issued at once, its PDF kept with the booking’s documents. What it takes off beyond the open
        balance is money the customer has already paid: it becomes their account credit, to pay another invoice or be paid back.
      </p>
      <FormMessage message={form.formError} />
      <fieldset disabled={creating.isPending} className="space-y-4">
        <TextField
          label="Amount to credit"
          inputMode="decimal"
          autoComplete="off"
          required
          hint={`In dollars and cents, like 125.00. The balance is ${money(i.balanceCents)}; up to ${money(most)} can still be credited.`}
          {...form.field('amountCents')}
        />
        <p className="text-sm font-semibold text-canvas-800" aria-live="polite" data-testid="credit-note-explanation">
          {explanation}
        </p>
        <TextArea label="Reason" required maxLength={500} hint="Printed on the credit note and kept on its ledger entry." {...form.field('reason')} />
      </fieldset>
      <div className="flex flex-wrap justify-end gap-2 pt-2">
        <Button variant="secondary" onClick={onCancel} disabled={creating.isPending}>
          Cancel
        </Button>
        <Button type="submit" isLoading={creating.isPending}>
          Issue the credit note
        </Button>
      </div>
    </form>
  );
}

/** For those the invoice's `can.creditNote` allows: the h2 "Issue a credit note" dialog; it starts afresh each time it opens. */
export function CreditNoteDialog({ open, invoice, onDone, onCancel }: { open: boolean; invoice: InvoiceRow; onDone: (creditNote: InvoiceRow) => void; onCancel: () => void }) {
  const creating = useCreateCreditNote();
  const close = () => {
    creating.reset();
    onCancel();
  };
  return (
    <Dialog open={open} title="Issue a credit note" busy={creating.isPending} onClose={close}>
      <CreditNoteForm invoice={invoice} creating={creating} onDone={onDone} onCancel={close} />
    </Dialog>
  );
}
