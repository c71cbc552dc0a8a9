import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SignatureRequestInput, SigningRequestRow } from '@shared/schemas/signing';
import { api } from '@/lib/api';
import { signatureRequestsQueryOptions } from './get-signature-requests';

/**
 * E-mails a signing link for the current rental agreement; `to` empty means the customer's own
 * address. A pending link for the booking stops working (the server marks it replaced).
 */
export const createSignatureRequest = ({ documentId, to }: SignatureRequestInput & { documentId: string }) =>
  api.post<SigningRequestRow>(`/api/documents/${encodeURIComponent(documentId)}/signature-request`, { to });

export function useCreateSignatureRequest() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createSignatureRequest,
    onSuccess: (row) => queryClient.invalidateQueries({ queryKey: signatureRequestsQueryOptions(row.documentId).queryKey }),
  });
}
