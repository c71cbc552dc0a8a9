import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MeResponse, SignupRequest } from '@shared/schemas/auth';
import { api } from '@/lib/api';
import { rememberSignedIn } from './get-me';

export const signup = (body: SignupRequest) => api.post<MeResponse>('/api/auth/signup', body);

export function useSignup() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: signup, onSuccess: (me) => rememberSignedIn(queryClient, me) });
}
