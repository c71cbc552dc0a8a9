import { PASSWORD_MAX_BYTES, SignupRequest, type SignupAccepted } from '@shared/schemas/auth';
import { PASSWORD_MIN_LENGTH } from '@shared/types';
import { Button } from '@/components/ui/button';
import { FormMessage } from '@/components/ui/alert';
import { TextField } from '@/components/ui/text-field';
import { useZodForm } from '@/lib/form';
import { useSignup } from '../api/signup';

export function SignUpForm({ onSuccess }: { onSuccess: (answer: SignupAccepted, email: string) => void }) {
  const form = useZodForm(SignupRequest, { organizationName: '', name: '', email: '', password: '' });
  const signup = useSignup();

  const submit = form.handleSubmit((data) => {
    form.setFormError(null);
    signup.mutate(data, { onSuccess: (answer) => onSuccess(answer, data.email), onError: form.showError });
  });

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate className="space-y-4">
      <FormMessage message={form.formError} />
      <TextField label="Company name" autoComplete="organization" required hint="The rental company as your customers know it." {...form.field('organizationName')} />
      <TextField label="Your name" autoComplete="name" required {...form.field('name')} />
      <TextField label="E-mail" type="email" autoComplete="email" inputMode="email" required {...form.field('email')} />
      <TextField
        label="Password"
        type="password"
        autoComplete="new-password"
        required
        hint={`At least ${PASSWORD_MIN_LENGTH} characters, at most ${PASSWORD_MAX_BYTES} plain letters. A few unrelated words work well.`}
        {...form.field('password')}
      />
      <Button type="submit" isLoading={signup.isPending} className="w-full sm:w-auto">
        {signup.isPending ? 'Sending…' : 'Create account'}
      </Button>
    </form>
  );
}
