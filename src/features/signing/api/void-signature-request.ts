import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SigningRequestRow } from '@shared/schemas/signing';
import { api } from '@/lib/api';
import { signatureRequestsQueryOptions } from './get-signature-requests';

/** The link stops working at once; the customer who opens it is told to ask for a new one. */
export const voidSignatureRequest = (id: string) => api.post<SigningRequestRow>(`/api/signature-requests/${encodeURIComponent(id)}/void`);

export function useVoidSignatureRequest() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: voidSignatureRequest,
    onSuccess: (row) => queryClient.invalidateQueries({ queryKey: signatureRequestsQueryOptions(row.documentId).queryKey }),
  });
}
