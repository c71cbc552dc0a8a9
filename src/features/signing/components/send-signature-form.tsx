import { SignatureRequestInput, type SigningRequestRow } from '@shared/schemas/signing';
import { Alert, FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { isApiError } from '@/lib/api';
import { useZodForm } from '@/lib/form';
import { formatZoned } from '@/lib/zoned-time';
import { useCreateSignatureRequest } from '../api/create-signature-request';

interface SendSignatureFormProps {
  documentId: string;
  /** "Rental agreement RA-0007, version 2" */
  name: string;
  customerEmail: string;
  /** A link still out for this booking: the new one replaces it. */
  pending: SigningRequestRow | null;
  timeZone: string;
  onDone: (row: SigningRequestRow) => void;
  onCancel: () => void;
}

/** Where to e-mail the signing link: the customer's address, or another typed here. */
export function SendSignatureForm({ documentId, name, customerEmail, pending, timeZone, onDone, onCancel }: SendSignatureFormProps) {
  const form = useZodForm(SignatureRequestInput, { to: customerEmail });
  const send = useCreateSignatureRequest();

  const submit = form.handleSubmit((data) => {
    form.setFormError(null);
    send.mutate(
      { documentId, to: data.to },
      {
        onSuccess: onDone,
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
    <form
      ref={form.formRef}
      onSubmit={submit}
      noValidate
      aria-label={`Send ${name} for signature`}
      className="mt-3 space-y-3 rounded-md border border-canvas-200 bg-canvas-50 p-3"
    >
      <FormMessage message={form.formError} />
      {pending ? (
        <Alert tone="warning">
          The link sent to {pending.sentTo} on {formatZoned(pending.createdAt, timeZone)} stops working when this one goes out.
        </Alert>
      ) : null}
      <TextField
        label="Send the signing link to (e-mail)"
        type="email"
        autoComplete="off"
        hint={customerEmail ? 'The customer’s address; change it to send elsewhere.' : 'The customer has no e-mail address on file: type one.'}
        {...form.field('to')}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" size="sm" isLoading={send.isPending}>
          {send.isPending ? 'Sending…' : 'E-mail the signing link'}
        </Button>
        <Button size="sm" variant="ghost" onClick={onCancel} disabled={send.isPending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
