import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MeResponse, SignupConfirm } from '@shared/schemas/auth';
import { api } from '@/lib/api';
import { rememberSignedIn } from './get-me';

/** The e-mailed sign-up link: makes the company and signs its owner in. */
export const confirmSignup = (body: SignupConfirm) => api.post<MeResponse>('/api/auth/signup/confirm', body);

export function useConfirmSignup() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: confirmSignup, onSuccess: (me) => rememberSignedIn(queryClient, me) });
}
