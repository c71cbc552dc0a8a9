import { InviteAccept, type InvitePreview, type MeResponse } from '@shared/schemas/auth';
import { PASSWORD_MIN_LENGTH, ROLE_LABELS } from '@shared/types';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { useZodForm } from '@/lib/form';
import { useAcceptInvite } from '../api/accept-invite';

export function AcceptInviteForm({ token, invite, onSuccess }: { token: string; invite: InvitePreview; onSuccess: (me: MeResponse) => void }) {
  const form = useZodForm(InviteAccept, { token, name: invite.name, password: '' });
  const accept = useAcceptInvite();

  const submit = form.handleSubmit((data) => {
    form.setFormError(null);
    accept.mutate(data, { onSuccess, onError: form.showError });
  });

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate className="space-y-4">
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 rounded-md bg-canvas-100 px-4 py-3 text-sm">
        <dt className="font-semibold text-canvas-700">Company</dt>
        <dd>{invite.organizationName}</dd>
        <dt className="font-semibold text-canvas-700">E-mail</dt>
        <dd className="break-all">{invite.email}</dd>
        <dt className="font-semibold text-canvas-700">Role</dt>
        <dd>{ROLE_LABELS[invite.role]}</dd>
      </dl>
      <FormMessage message={form.formError} />
      <TextField label="Your name" autoComplete="name" required {...form.field('name')} />
      <TextField
        label="Choose a password"
        type="password"
        autoComplete="new-password"
        required
        hint={`At least ${PASSWORD_MIN_LENGTH} characters.`}
        {...form.field('password')}
      />
      <Button type="submit" isLoading={accept.isPending}>
        {accept.isPending ? 'Joining…' : 'Accept invitation'}
      </Button>
    </form>
  );
}
