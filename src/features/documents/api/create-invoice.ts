import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DocumentRow } from '@shared/schemas/documents';
import { api } from '@/lib/api';
import { bookingDocumentsQueryOptions } from './get-booking-documents';

/** Issues the booking's invoice; when one exists this is its next version and the old one is marked replaced. */
export const createInvoice = (bookingId: string) => api.post<DocumentRow>(`/api/bookings/${encodeURIComponent(bookingId)}/invoice`);

export function useCreateInvoice() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createInvoice,
    onSuccess: (document) => void queryClient.invalidateQueries({ queryKey: bookingDocumentsQueryOptions(document.bookingId).queryKey }),
  });
}
