import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { InvoiceRow, VoidInvoiceRequest } from '@shared/schemas/invoices';
import { api } from '@/lib/api';
import { documentsBaseKey } from '@/features/documents/api/get-booking-documents';
import { moneyBaseKey } from './get-invoices';

/** Owner only; writes the reversing entry. 409 `has_payments` once money was received on it. */
export const voidInvoice = ({ id, body }: { id: string; body: z.input<typeof VoidInvoiceRequest> }) =>
  api.post<InvoiceRow>(`/api/invoices/${encodeURIComponent(id)}/void`, body);

export function useVoidInvoice() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: voidInvoice,
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: moneyBaseKey });
      void queryClient.invalidateQueries({ queryKey: documentsBaseKey });
    },
  });
}
