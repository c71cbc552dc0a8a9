import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvoiceRow } from '@shared/schemas/invoices';
import { api } from '@/lib/api';
import { moneyBaseKey } from './get-invoices';

/** Every pay link of the invoice made so far stops working; the answer carries a fresh one (owner and office). */
export const revokePayLinks = (id: string) => api.post<InvoiceRow>(`/api/invoices/${encodeURIComponent(id)}/pay-links/revoke`);

export function useRevokePayLinks() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokePayLinks,
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: moneyBaseKey });
      // The booking's history records the withdrawal.
      void queryClient.invalidateQueries({ queryKey: ['bookings'] });
    },
  });
}
