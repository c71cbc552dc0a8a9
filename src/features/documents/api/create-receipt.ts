import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DocumentRow, ReceiptRequest } from '@shared/schemas/documents';
import { api } from '@/lib/api';
import { bookingDocumentsQueryOptions } from './get-booking-documents';

/** Issues a receipt for money received on the booking; each receipt is its own numbered document. */
export const createReceipt = ({ bookingId, body }: { bookingId: string; body: ReceiptRequest }) =>
  api.post<DocumentRow>(`/api/bookings/${encodeURIComponent(bookingId)}/receipt`, body);

export function useCreateReceipt() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createReceipt,
    onSuccess: (document) => void queryClient.invalidateQueries({ queryKey: bookingDocumentsQueryOptions(document.bookingId).queryKey }),
  });
}
