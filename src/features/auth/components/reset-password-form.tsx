import { z } from 'zod';
import { PasswordResetConfirm } from '@shared/schemas/auth';
import { PASSWORD_MIN_LENGTH } from '@shared/types';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api';
import { useZodForm } from '@/lib/form';
import { useConfirmPasswordReset } from '../api/confirm-password-reset';

const ResetForm = PasswordResetConfirm.extend({ repeatPassword: z.string() }).refine((v) => v.password === v.repeatPassword, {
  message: 'The two passwords are not the same.',
  path: ['repeatPassword'],
});

export function ResetPasswordForm({ token, onSuccess }: { token: string; onSuccess: () => void }) {
  const form = useZodForm(ResetForm, { token, password: '', repeatPassword: '' });
  const confirm = useConfirmPasswordReset();
  const expired = isApiError(confirm.error, 'invalid_token') || Boolean(form.errors.token);

  const submit = form.handleSubmit(({ token, password }) => {
    form.setFormError(null);
    confirm.mutate({ token, password }, { onSuccess, onError: form.showError });
  });

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate className="space-y-4">
      <FormMessage message={form.errors.token ?? form.formError} />
      {expired ? (
        <p className="text-sm">
          <TextLink to={paths.auth.forgotPassword.getHref()}>Ask for a new link</TextLink>
        </p>
      ) : null}
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        required
        hint={`At least ${PASSWORD_MIN_LENGTH} characters.`}
        {...form.field('password')}
      />
      <TextField label="Confirm password" type="password" autoComplete="new-password" required {...form.field('repeatPassword')} />
      <Button type="submit" isLoading={confirm.isPending}>
        {confirm.isPending ? 'Saving…' : 'Set new password'}
      </Button>
    </form>
  );
}
