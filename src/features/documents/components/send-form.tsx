import { SendDocumentRequest, type DocumentRow } from '@shared/schemas/documents';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { isApiError } from '@/lib/api';
import { useZodForm } from '@/lib/form';
import { useSendDocument } from '../api/send-document';
import { documentName } from './document-labels';

interface SendFormProps {
  document: DocumentRow;
  customerEmail: string;
  onDone: (message: string) => void;
  onCancel: () => void;
}

/** The address to send one document to: the customer's, or another typed here. */
export function SendForm({ document, customerEmail, onDone, onCancel }: SendFormProps) {
  const form = useZodForm(SendDocumentRequest, { to: customerEmail });
  const send = useSendDocument();
  const name = documentName(document);

  const submit = form.handleSubmit((data) => {
    form.setFormError(null);
    send.mutate(
      { id: document.id, bookingId: document.bookingId, to: data.to },
      {
        onSuccess: ({ send: s }) => onDone(`${name} is queued for ${s.to}.`),
        onError: (error) => {
          form.showError(error);
          // No address anywhere: the message belongs on the address field, where the fix is typed.
          if (isApiError(error, 'no_email')) {
            form.setErrors({ to: error.message });
            requestAnimationFrame(() => form.formRef.current?.querySelector<HTMLInputElement>('input[name="to"]')?.focus());
          }
        },
      },
    );
  });

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate aria-label={`Send ${name}`} className="mt-3 space-y-3 rounded-md border border-canvas-200 bg-canvas-50 p-3">
      <FormMessage message={form.formError} />
      <TextField
        label="Send to (e-mail)"
        type="email"
        autoComplete="off"
        hint={customerEmail ? 'The customer’s address; change it to send elsewhere.' : 'The customer has no e-mail address on file: type one.'}
        {...form.field('to')}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" size="sm" isLoading={send.isPending}>
          {send.isPending ? 'Sending…' : 'Send e-mail'}
        </Button>
        <Button size="sm" variant="ghost" onClick={onCancel} disabled={send.isPending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
