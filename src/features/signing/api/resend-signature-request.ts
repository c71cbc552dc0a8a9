import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SigningRequestRow } from '@shared/schemas/signing';
import { api } from '@/lib/api';
import { signatureRequestsQueryOptions } from './get-signature-requests';

/** A fresh link to the same address; the old link is marked replaced. */
export const resendSignatureRequest = (id: string) => api.post<SigningRequestRow>(`/api/signature-requests/${encodeURIComponent(id)}/resend`);

export function useResendSignatureRequest() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: resendSignatureRequest,
    onSuccess: (row) => queryClient.invalidateQueries({ queryKey: signatureRequestsQueryOptions(row.documentId).queryKey }),
  });
}
