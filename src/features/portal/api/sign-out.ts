import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { portalBaseKey } from './keys';

export const signOut = () => api.post<void>('/api/portal/sign-out');

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    // Signed out either way on this device: nothing of theirs stays in memory.
    onSettled: () => queryClient.removeQueries({ queryKey: portalBaseKey }),
  });
}
