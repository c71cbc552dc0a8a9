import { useState } from 'react';
import type { UserRow as UserRowData } from '@shared/schemas/users';
import { ROLE_LABELS, type Role } from '@shared/types';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { Select } from '@/components/ui/select';
import { Td, Th, Tr } from '@/components/ui/table';
import { errorMessage } from '@/lib/api';
import { formatDateTime } from '@/lib/format';
import { useResendInvite } from '../api/resend-invite';
import { useUpdateUser } from '../api/update-user';
import { roleOptions } from './invite-user-form';

const STATUS: Record<UserRowData['status'], { label: string; tone: BadgeTone }> = {
  invited: { label: 'Invited', tone: 'caution' },
  active: { label: 'Active', tone: 'positive' },
  disabled: { label: 'Disabled', tone: 'negative' },
};

/** One user: role select, status, and the actions the server allows on this row. */
export function UserRow({ user, isSelf }: { user: UserRowData; isSelf: boolean }) {
  const update = useUpdateUser();
  const resend = useResendInvite();
  const [confirming, setConfirming] = useState(false);
  const [message, setMessage] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const disabled = user.status === 'disabled';

  const changeRole = (role: Role) => {
    setMessage(null);
    update.mutate(
      { id: user.id, role },
      {
        onSuccess: (next) => setMessage({ tone: 'ok', text: `Role changed to ${ROLE_LABELS[next.role]}.` }),
        onError: (error) => setMessage({ tone: 'error', text: errorMessage(error) }),
      },
    );
  };

  const toggleDisabled = () => {
    update.mutate(
      { id: user.id, disabled: !disabled },
      {
        onSuccess: (next) => {
          setConfirming(false);
          setMessage({ tone: 'ok', text: next.status === 'disabled' ? 'Disabled: this user can no longer sign in.' : 'Enabled again.' });
        },
      },
    );
  };

  const pendingRole = update.isPending && update.variables?.role;
  return (
    <Tr>
      <Th scope="row" className="py-3 text-canvas-900">
        {user.name}
        {isSelf ? <span className="ml-1 font-normal text-canvas-600">(you)</span> : null}
      </Th>
      <Td className="whitespace-nowrap">{user.email}</Td>
      <Td className="min-w-40">
        {user.can.changeRole ? (
          <Select
            label={`Role for ${user.name}`}
            hideLabel
            options={roleOptions}
            value={pendingRole || user.role}
            disabled={update.isPending}
            onChange={(event) => changeRole(event.target.value as Role)}
          />
        ) : (
          ROLE_LABELS[user.role]
        )}
      </Td>
      <Td>
        <Badge tone={STATUS[user.status].tone}>{STATUS[user.status].label}</Badge>
      </Td>
      <Td className="whitespace-nowrap text-canvas-700">{user.lastSignInAt ? formatDateTime(user.lastSignInAt) : 'Never'}</Td>
      <Td className="min-w-56">
        <div className="flex flex-wrap items-center gap-2 whitespace-nowrap">
          {user.can.resendInvite ? (
            <Button
              size="sm"
              variant="secondary"
              isLoading={resend.isPending}
              onClick={() => {
                setMessage(null);
                resend.mutate(user.id, {
                  onSuccess: () => setMessage({ tone: 'ok', text: `Invitation sent again to ${user.email}.` }),
                  onError: (error) => setMessage({ tone: 'error', text: errorMessage(error) }),
                });
              }}
            >
              Resend invite<span className="sr-only"> to {user.name}</span>
            </Button>
          ) : null}
          {user.can.disable ? (
            <Button
              size="sm"
              variant={disabled ? 'secondary' : 'ghost'}
              className={disabled ? undefined : 'text-rust-700 hover:bg-rust-50'}
              onClick={() => {
                setMessage(null);
                update.reset();
                setConfirming(true);
              }}
            >
              {disabled ? 'Enable' : 'Disable'}
              <span className="sr-only"> {user.name}</span>
            </Button>
          ) : null}
        </div>
        <p aria-live="polite" className={message ? (message.tone === 'error' ? 'mt-1 text-sm font-semibold text-rust-700' : 'mt-1 text-sm text-pine-800') : 'sr-only'}>
          {message?.text}
        </p>
        <ConfirmDialog
          open={confirming}
          title={disabled ? `Enable ${user.name}?` : `Disable ${user.name}?`}
          confirmLabel={disabled ? 'Enable user' : 'Disable user'}
          confirmVariant={disabled ? 'primary' : 'danger'}
          isLoading={update.isPending}
          error={update.isError ? errorMessage(update.error) : null}
          onConfirm={toggleDisabled}
          onCancel={() => setConfirming(false)}
        >
          {disabled
            ? 'They can sign in again with their current password.'
            : 'They are signed out everywhere and cannot sign in until you enable them again. Their past work stays.'}
        </ConfirmDialog>
      </Td>
    </Tr>
  );
}
