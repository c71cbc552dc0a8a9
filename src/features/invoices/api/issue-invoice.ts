import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvoiceRow } from '@shared/schemas/invoices';
import { api } from '@/lib/api';
import { documentsBaseKey } from '@/features/documents/api/get-booking-documents';
import { moneyBaseKey } from './get-invoices';

/** Gives a draft its number and due date and makes its PDF; it posts to the ledger. */
export const issueInvoice = (id: string) => api.post<InvoiceRow>(`/api/invoices/${encodeURIComponent(id)}/issue`);

export function useIssueInvoice() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: issueInvoice,
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: moneyBaseKey });
      // The PDF joins the booking's documents.
      void queryClient.invalidateQueries({ queryKey: documentsBaseKey });
    },
  });
}
