import { formatMoney } from '@shared/money';
import { ApplyCreditRequest, type InvoiceRow } from '@shared/schemas/invoices';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { TextField } from '@/components/ui/text-field';
import { centsToInput, collector, parseDollars } from '@/lib/amounts';
import { useZodForm } from '@/lib/form';
import { useApplyCredit } from '../api/apply-credit';
import { invoiceNumber } from './invoice-labels';

function toInput(v: Record<string, string>) {
  const c = collector();
  c.put('amountCents', parseDollars(v.amountCents, null));
  return c;
}

interface ApplyCreditFormProps {
  invoice: InvoiceRow;
  /** The customer's account credit now. */
  creditCents: number;
  onDone: (invoice: InvoiceRow, amountCents: number) => void;
  onCancel: () => void;
  applying: ReturnType<typeof useApplyCredit>;
}

function ApplyCreditForm({ invoice: i, creditCents, onDone, onCancel, applying }: ApplyCreditFormProps) {
  const most = Math.max(0, Math.min(creditCents, i.balanceCents));
  const form = useZodForm(ApplyCreditRequest, { amountCents: most > 0 ? centsToInput(most) : '' }, { toInput });
  const money = (cents: number) => formatMoney(cents, i.currency);
  const submit = form.handleSubmit((body) => {
    if (body.amountCents > most) {
      form.setErrors({ amountCents: `At most ${money(most)}: ${most === creditCents ? 'that is all the credit the customer has' : `the balance of ${invoiceNumber(i)}`}.` });
      form.setFormError('Check the highlighted fields.');
      requestAnimationFrame(() => form.formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
      return;
    }
    form.setFormError(null);
    applying.mutate({ invoiceId: i.id, body }, { onSuccess: (row) => onDone(row, body.amountCents), onError: form.showError });
  });

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate aria-label="Pay from account credit" className="space-y-4">
      <p className="text-sm text-canvas-700">
        {i.customer.name} has {money(creditCents)} of account credit. Using it pays {invoiceNumber(i)} without new money: it shows as a payment from account credit and the credit goes
        down by as much.
      </p>
      <FormMessage message={form.formError} />
      <fieldset disabled={applying.isPending}>
        <TextField
          label="Amount"
          inputMode="decimal"
          autoComplete="off"
          required
          hint={`In dollars and cents, like 125.00. The balance is ${money(i.balanceCents)}.`}
          {...form.field('amountCents')}
        />
      </fieldset>
      <div className="flex flex-wrap justify-end gap-2 pt-2">
        <Button variant="secondary" onClick={onCancel} disabled={applying.isPending}>
          Cancel
        </Button>
        <Button type="submit" isLoading={applying.isPending}>
          Pay from credit
        </Button>
      </div>
    </form>
  );
}

/** The h2 "Pay from account credit" dialog of an invoice page; it starts afresh each time it opens. */
export function ApplyCreditDialog({ open, onCancel, ...rest }: Omit<ApplyCreditFormProps, 'applying'> & { open: boolean }) {
  const applying = useApplyCredit();
  const close = () => {
    applying.reset();
    onCancel();
  };
  return (
    <Dialog open={open} title="Pay from account credit" busy={applying.isPending} onClose={close}>
      <ApplyCreditForm {...rest} applying={applying} onCancel={close} />
    </Dialog>
  );
}
