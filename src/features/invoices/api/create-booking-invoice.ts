import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateInvoiceRequest, InvoiceRow } from '@shared/schemas/invoices';
import { api } from '@/lib/api';
import { moneyBaseKey } from './get-invoices';

/** A draft deposit or balance invoice, its lines copied from the booking's quote. 409 `nothing_to_invoice` when all is invoiced. */
export const createBookingInvoice = ({ bookingId, body }: { bookingId: string; body: CreateInvoiceRequest }) =>
  api.post<InvoiceRow>(`/api/bookings/${encodeURIComponent(bookingId)}/invoices`, body);

export function useCreateBookingInvoice() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createBookingInvoice,
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: moneyBaseKey }),
  });
}
