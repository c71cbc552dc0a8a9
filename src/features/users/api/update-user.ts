import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateUserRequest, UserRow } from '@shared/schemas/users';
import { api } from '@/lib/api';
import { usersBaseKey } from './get-users';

export const updateUser = ({ id, ...body }: UpdateUserRequest & { id: string }) =>
  api.patch<UserRow>(`/api/users/${encodeURIComponent(id)}`, body);

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: updateUser, onSettled: () => queryClient.invalidateQueries({ queryKey: usersBaseKey }) });
}
