import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { usersBaseKey } from './get-users';

export const resendInvite = (id: string) => api.post<void>(`/api/users/${encodeURIComponent(id)}/resend-invite`);

export function useResendInvite() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: resendInvite, onSuccess: () => queryClient.invalidateQueries({ queryKey: usersBaseKey }) });
}
