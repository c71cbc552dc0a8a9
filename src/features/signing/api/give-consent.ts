import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SigningPage } from '@shared/schemas/signing';
import { api } from '@/lib/api';
import { signingPageQueryOptions } from './get-signing-page';

/** Records the customer's consent to electronic records and signatures (time, IP and browser are the server's). */
export const giveConsent = (token: string) => api.post<SigningPage>(`/api/sign/${encodeURIComponent(token)}/consent`);

export function useGiveConsent(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => giveConsent(token),
    onSuccess: (page) => queryClient.setQueryData(signingPageQueryOptions(token).queryKey, page),
  });
}
