import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InviteUserRequest, UserRow } from '@shared/schemas/users';
import { api } from '@/lib/api';
import { usersBaseKey } from './get-users';

/** Creates the user as "invited" and e-mails them a link to choose a password. */
export const inviteUser = (body: InviteUserRequest) => api.post<UserRow>('/api/users/invite', body);

export function useInviteUser() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: inviteUser, onSuccess: () => queryClient.invalidateQueries({ queryKey: usersBaseKey }) });
}
