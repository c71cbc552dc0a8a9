import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InviteAccept, MeResponse } from '@shared/schemas/auth';
import { api } from '@/lib/api';
import { rememberSignedIn } from './get-me';

/** Sets the invited user's password and signs them in. */
export const acceptInvite = (body: InviteAccept) => api.post<MeResponse>('/api/auth/invites/accept', body);

export function useAcceptInvite() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: acceptInvite, onSuccess: (me) => rememberSignedIn(queryClient, me) });
}
