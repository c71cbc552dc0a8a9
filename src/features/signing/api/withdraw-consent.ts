import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SigningPage } from '@shared/schemas/signing';
import { api } from '@/lib/api';
import { signingPageQueryOptions } from './get-signing-page';

/** The customer declines electronic signing: the request turns 'declined' and the office is told. */
export const withdrawConsent = (token: string) => api.post<SigningPage>(`/api/sign/${encodeURIComponent(token)}/withdraw-consent`);

export function useWithdrawConsent(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => withdrawConsent(token),
    onSuccess: (page) => queryClient.setQueryData(signingPageQueryOptions(token).queryKey, page),
  });
}
