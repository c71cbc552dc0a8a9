import { useState } from 'react';
import { PasswordResetRequest } from '@shared/schemas/auth';
import { Alert, FormMessage, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { useZodForm } from '@/lib/form';
import { useRequestPasswordReset } from '../api/request-password-reset';

/** The same words whether or not the address has an account, so nobody can probe for accounts. */
export const RESET_REQUESTED_MESSAGE = 'If that address has an account, a link is on its way.';

export function ForgotPasswordForm() {
  const form = useZodForm(PasswordResetRequest, { email: '' });
  const request = useRequestPasswordReset();
  const [sentTo, setSentTo] = useState<string | null>(null);

  const submit = form.handleSubmit((data) => {
    form.setFormError(null);
    request.mutate(data, { onSuccess: () => setSentTo(data.email), onError: form.showError });
  });

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate className="space-y-4">
      <LiveRegion>
        {sentTo ? (
          <Alert tone="success" title={RESET_REQUESTED_MESSAGE}>
            Check your spam folder if nothing arrives in a few minutes.
          </Alert>
        ) : null}
      </LiveRegion>
      <FormMessage message={form.formError} />
      <TextField label="E-mail" type="email" autoComplete="email" inputMode="email" required {...form.field('email')} />
      <Button type="submit" isLoading={request.isPending}>
        {request.isPending ? 'Sending…' : sentTo ? 'Send another link' : 'Send reset link'}
      </Button>
    </form>
  );
}
