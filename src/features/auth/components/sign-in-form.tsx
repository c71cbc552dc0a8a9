import { LoginRequest, type MeResponse } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { FormMessage } from '@/components/ui/alert';
import { TextField } from '@/components/ui/text-field';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { useZodForm } from '@/lib/form';
import { useLogin } from '../api/login';

export function SignInForm({ onSuccess }: { onSuccess: (me: MeResponse) => void }) {
  const form = useZodForm(LoginRequest, { email: '', password: '' });
  const login = useLogin();

  const submit = form.handleSubmit((data) => {
    form.setFormError(null);
    login.mutate(data, { onSuccess, onError: form.showError });
  });

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate className="space-y-4">
      <FormMessage message={form.formError} />
      <TextField label="E-mail" type="email" autoComplete="username" inputMode="email" required {...form.field('email')} />
      <TextField label="Password" type="password" autoComplete="current-password" required {...form.field('password')} />
      <div className="flex flex-wrap items-center justify-between gap-3">
        <Button type="submit" isLoading={login.isPending}>
          {login.isPending ? 'Signing in…' : 'Sign in'}
        </Button>
        <TextLink to={paths.auth.forgotPassword.getHref()}>Forgot your password?</TextLink>
      </div>
    </form>
  );
}
