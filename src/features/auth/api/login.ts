import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LoginRequest, MeResponse } from '@shared/schemas/auth';
import { api } from '@/lib/api';
import { rememberSignedIn } from './get-me';

export const login = (body: LoginRequest) => api.post<MeResponse>('/api/auth/login', body);

export function useLogin() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: login, onSuccess: (me) => rememberSignedIn(queryClient, me) });
}
