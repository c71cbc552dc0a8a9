import { ReceiptRequest, type DocumentRow } from '@shared/schemas/documents';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Select } from '@/components/ui/select';
import { TextField } from '@/components/ui/text-field';
import { collector, parseDollars } from '@/lib/amounts';
import { useZodForm } from '@/lib/form';
import { isoToZonedInput, zonedInputToIso } from '@/lib/zoned-time';
import { useCreateReceipt } from '../api/create-receipt';
import { paymentMethodOptions } from './document-labels';

type Values = { amountCents: string; method: string; receivedAt: string; reference: string };

/** The typed strings as a ReceiptRequest: dollars to cents, the company's wall clock to an instant. */
function toInput(v: Values, timeZone: string) {
  const c = collector();
  // Empty stays missing, so the schema asks for the amount in its own words.
  c.put('amountCents', parseDollars(v.amountCents, null));
  if (c.input.amountCents === null) delete c.input.amountCents;
  c.input.method = v.method || undefined;
  c.input.receivedAt = v.receivedAt ? (zonedInputToIso(v.receivedAt, timeZone) ?? v.receivedAt) : undefined;
  c.input.reference = v.reference;
  return c;
}

interface ReceiptFormProps {
  bookingId: string;
  /** Unsaved edits in the booking: the document would be made from the saved one, so it waits. */
  blocked: boolean;
  timeZone: string;
  onDone: (document: DocumentRow) => void;
  onCancel: () => void;
}

/** Money the customer paid: how much, how, when, and the check or transfer number. */
export function ReceiptForm({ bookingId, blocked, timeZone, onDone, onCancel }: ReceiptFormProps) {
  const form = useZodForm(
    ReceiptRequest,
    { amountCents: '', method: '', receivedAt: isoToZonedInput(new Date().toISOString(), timeZone), reference: '' },
    { toInput: (v) => toInput(v, timeZone) },
  );
  const create = useCreateReceipt();

  const submit = form.handleSubmit((body) => {
    form.setFormError(null);
    create.mutate({ bookingId, body }, { onSuccess: onDone, onError: form.showError });
  });

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate aria-label="Record a receipt" className="space-y-4 rounded-md border border-canvas-200 bg-canvas-50 p-3 sm:p-4">
      <div>
        <h3 className="font-semibold text-canvas-900">Record a receipt</h3>
        <p className="mt-1 text-sm text-canvas-700">
          A receipt for money the customer paid, e-mailed as a PDF. It joins the list below, where you preview, download and send it.
        </p>
      </div>
      <FormMessage message={form.formError} />
      <fieldset disabled={create.isPending} className="grid gap-4 sm:grid-cols-2">
        <TextField label="Amount received" inputMode="decimal" autoComplete="off" required hint="In dollars and cents, like 125.00." {...form.field('amountCents')} />
        <Select label="Method" options={paymentMethodOptions} placeholder="Choose how it was paid" required {...form.field('method')} />
        <TextField label="Received at" type="datetime-local" required hint={`On your company’s clock (${timeZone.replaceAll('_', ' ')}).`} {...form.field('receivedAt')} />
        <TextField label="Reference" autoComplete="off" maxLength={80} hint="A check number, transfer or card reference; optional." {...form.field('reference')} />
      </fieldset>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" size="sm" isLoading={create.isPending} disabled={blocked}>
          Create receipt
        </Button>
        <Button size="sm" variant="ghost" onClick={onCancel} disabled={create.isPending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
