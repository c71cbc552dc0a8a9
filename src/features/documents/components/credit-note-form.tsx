import { CreditNoteRequest, type DocumentRow } from '@shared/schemas/documents';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextArea } from '@/components/ui/textarea';
import { TextField } from '@/components/ui/text-field';
import { collector, parseDollars } from '@/lib/amounts';
import { useZodForm } from '@/lib/form';
import { useCreateCreditNote } from '../api/create-credit-note';

type Values = { amountCents: string; reason: string };

function toInput(v: Values) {
  const c = collector();
  c.put('amountCents', parseDollars(v.amountCents, null));
  if (c.input.amountCents === null) delete c.input.amountCents;
  c.input.reason = v.reason;
  return c;
}

interface CreditNoteFormProps {
  bookingId: string;
  /** Unsaved edits in the booking: the document would be made from the saved one, so it waits. */
  blocked: boolean;
  onDone: (document: DocumentRow) => void;
  onCancel: () => void;
}

/** An amount taken off what the customer owes, with the reason printed on the note. */
export function CreditNoteForm({ bookingId, blocked, onDone, onCancel }: CreditNoteFormProps) {
  const form = useZodForm(CreditNoteRequest, { amountCents: '', reason: '' }, { toInput });
  const create = useCreateCreditNote();

  const submit = form.handleSubmit((body) => {
    form.setFormError(null);
    create.mutate({ bookingId, body }, { onSuccess: onDone, onError: form.showError });
  });

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate aria-label="Issue a credit note" className="space-y-4 rounded-md border border-canvas-200 bg-canvas-50 p-3 sm:p-4">
      <div>
        <h3 className="font-semibold text-canvas-900">Issue a credit note</h3>
        <p className="mt-1 text-sm text-canvas-700">
          A credit note takes an amount off what the customer owes on this booking, with your reason printed on it. It joins the list below, where you
          preview, download and send it.
        </p>
      </div>
      <FormMessage message={form.formError} />
      <fieldset disabled={create.isPending} className="space-y-4">
        <TextField label="Amount credited" inputMode="decimal" autoComplete="off" required hint="In dollars and cents, like 125.00." className="sm:max-w-xs" {...form.field('amountCents')} />
        <TextArea label="Reason" required maxLength={500} hint="The customer reads it on the credit note, like “Two sidewalls not delivered”." {...form.field('reason')} />
      </fieldset>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" size="sm" isLoading={create.isPending} disabled={blocked}>
          Create credit note
        </Button>
        <Button size="sm" variant="ghost" onClick={onCancel} disabled={create.isPending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
