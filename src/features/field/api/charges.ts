import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ChargesInput, ProposedCharges } from '@shared/schemas/field';
import { api } from '@/lib/api';
import { fieldBaseKey } from './get-day-sheet';

/** The office's proposed damage and missing charges from the pickup check-in. */
export const getCharges = (bookingId: string, signal?: AbortSignal) => api.get<ProposedCharges>(`/api/field/bookings/${encodeURIComponent(bookingId)}/charges`, { signal });
export const chargesQueryOptions = (bookingId: string) =>
  queryOptions({ queryKey: [...fieldBaseKey, 'charges', bookingId] as const, queryFn: ({ signal }) => getCharges(bookingId, signal) });
export const useCharges = (bookingId: string, enabled = true) => useQuery({ ...chargesQueryOptions(bookingId), enabled });

/** Makes the draft additional-charges invoice from the reviewed amounts. */
export const invoiceCharges = ({ bookingId, ...body }: ChargesInput & { bookingId: string }) =>
  api.post<ProposedCharges>(`/api/field/bookings/${encodeURIComponent(bookingId)}/charges`, body);

export function useInvoiceCharges(bookingId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: invoiceCharges,
    onSuccess: (data) => {
      queryClient.setQueryData(chargesQueryOptions(bookingId).queryKey, data);
      // The Money panel and the invoice list show the new draft.
      void queryClient.invalidateQueries({ queryKey: ['invoices'] });
      void queryClient.invalidateQueries({ queryKey: ['bookings'] });
    },
  });
}
