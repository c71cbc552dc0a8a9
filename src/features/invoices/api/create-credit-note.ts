import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreditNoteRequest, InvoiceRow } from '@shared/schemas/invoices';
import { api } from '@/lib/api';
import { documentsBaseKey } from '@/features/documents/api/get-booking-documents';
import { moneyBaseKey } from './get-invoices';

/**
 * Lowers an issued invoice (its `can.creditNote`). The answer is the credit note itself, already
 * numbered and applied; what it could not take off the invoice's balance became the customer's
 * credit. 409 on `amountCents` when it is more than the invoice can still be credited.
 */
export const createCreditNote = ({ invoiceId, body }: { invoiceId: string; body: CreditNoteRequest }) =>
  api.post<InvoiceRow>(`/api/invoices/${encodeURIComponent(invoiceId)}/credit-notes`, body);

export function useCreateCreditNote() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createCreditNote,
    onSuccess: () => {
      // The invoice, the booking's balances and the customer's credit all move.
      void queryClient.invalidateQueries({ queryKey: moneyBaseKey });
      // The credit note's PDF joins the booking's documents.
      void queryClient.invalidateQueries({ queryKey: documentsBaseKey });
    },
  });
}
