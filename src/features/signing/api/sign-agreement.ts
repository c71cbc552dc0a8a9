import { useMutation } from '@tanstack/react-query';
import type { SignRequest } from '@shared/schemas/signing';
import { api } from '@/lib/api';

export interface SignedResult {
  signedDocumentId: string;
  signedPdfUrl: string;
}

/**
 * Signs: typed name, the drawn signature (or none when signing with the typed name) and the
 * initials by clause key. The server takes the name, IP and time for the trail from the request.
 */
export const signAgreement = ({ token, body }: { token: string; body: SignRequest }) =>
  api.post<SignedResult>(`/api/sign/${encodeURIComponent(token)}`, body);

export const useSignAgreement = () => useMutation({ mutationFn: signAgreement });
