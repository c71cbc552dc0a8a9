import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateInvoiceRequest, InvoiceRow } from '@shared/schemas/invoices';
import { api } from '@/lib/api';
import { moneyBaseKey } from './get-invoices';

/**
 * A draft invoice: deposit or balance with its lines copied from the booking's quote (409
 * `nothing_to_invoice` when all is invoiced), or additional charges line by line, taxed by the
 * server at the booking's rate. Errors name the line: `lines.0.amountCents`.
 */
export const createBookingInvoice = ({ bookingId, body }: { bookingId: string; body: CreateInvoiceRequest }) =>
  api.post<InvoiceRow>(`/api/bookings/${encodeURIComponent(bookingId)}/invoices`, body);

export function useCreateBookingInvoice() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createBookingInvoice,
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: moneyBaseKey }),
  });
}
