import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreditNoteRequest, DocumentRow } from '@shared/schemas/documents';
import { api } from '@/lib/api';
import { bookingDocumentsQueryOptions } from './get-booking-documents';

/** Issues a credit note against the booking; each credit note is its own numbered document. */
export const createCreditNote = ({ bookingId, body }: { bookingId: string; body: CreditNoteRequest }) =>
  api.post<DocumentRow>(`/api/bookings/${encodeURIComponent(bookingId)}/credit-note`, body);

export function useCreateCreditNote() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createCreditNote,
    onSuccess: (document) => void queryClient.invalidateQueries({ queryKey: bookingDocumentsQueryOptions(document.bookingId).queryKey }),
  });
}
