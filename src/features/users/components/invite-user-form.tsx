import { useState } from 'react';
import { InviteUserRequest } from '@shared/schemas/users';
import { ROLE_LABELS, ROLES } from '@shared/types';
import { Alert, FormMessage, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Select } from '@/components/ui/select';
import { TextField } from '@/components/ui/text-field';
import { useZodForm } from '@/lib/form';
import { useInviteUser } from '../api/invite-user';

export const roleOptions = ROLES.map((role) => ({ value: role, label: ROLE_LABELS[role] }));

export function InviteUserForm() {
  const form = useZodForm(InviteUserRequest, { name: '', email: '', role: 'office' });
  const invite = useInviteUser();
  const [sentTo, setSentTo] = useState<string | null>(null);

  const submit = form.handleSubmit((data) => {
    form.setFormError(null);
    setSentTo(null);
    invite.mutate(data, {
      onSuccess: (user) => {
        setSentTo(user.email);
        form.reset();
      },
      onError: form.showError,
    });
  });

  return (
    <form ref={form.formRef} onSubmit={submit} noValidate className="space-y-4" aria-label="Invite a user">
      <LiveRegion>{sentTo ? <Alert tone="success">Invitation sent to {sentTo}.</Alert> : null}</LiveRegion>
      <FormMessage message={form.formError} />
      <div className="grid gap-4 sm:grid-cols-3">
        <TextField label="Name" autoComplete="off" required {...form.field('name')} />
        <TextField label="E-mail" type="email" autoComplete="off" inputMode="email" required {...form.field('email')} />
        <Select label="Role" options={roleOptions} {...form.field('role')} />
      </div>
      <Button type="submit" isLoading={invite.isPending}>
        {invite.isPending ? 'Sending invitation…' : 'Send invitation'}
      </Button>
    </form>
  );
}
