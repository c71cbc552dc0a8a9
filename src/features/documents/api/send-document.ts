import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DocumentSendRow, SendDocumentRequest } from '@shared/schemas/documents';
import { api } from '@/lib/api';
import { bookingDocumentsQueryOptions } from './get-booking-documents';

/**
 * Queues the e-mail (202); `to` empty means the customer's own address. A second call within a
 * minute answers with the same send, so a double click sends once.
 */
export const sendDocument = ({ id, ...body }: SendDocumentRequest & { id: string; bookingId: string }) =>
  api.post<{ send: DocumentSendRow }>(`/api/documents/${encodeURIComponent(id)}/send`, { to: body.to });

export function useSendDocument() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: sendDocument,
    // The list then shows the send as queued and keeps asking until it is sent or failed.
    onSuccess: (_, { bookingId }) => queryClient.invalidateQueries({ queryKey: bookingDocumentsQueryOptions(bookingId).queryKey }),
  });
}
