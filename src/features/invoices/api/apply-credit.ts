import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ApplyCreditRequest, InvoiceRow } from '@shared/schemas/invoices';
import { api } from '@/lib/api';
import { invoiceQueryOptions } from './get-invoice';
import { moneyBaseKey } from './get-invoices';

/**
 * Pays an invoice from the customer's account credit; answers the invoice as it is now. 409 on
 * `amountCents` when that is more than the credit or the invoice's balance.
 */
export const applyCredit = ({ invoiceId, body }: { invoiceId: string; body: ApplyCreditRequest }) =>
  api.post<InvoiceRow>(`/api/invoices/${encodeURIComponent(invoiceId)}/apply-credit`, body);

export function useApplyCredit() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: applyCredit,
    onSuccess: (invoice) => {
      queryClient.setQueryData(invoiceQueryOptions(invoice.id).queryKey, invoice);
      void queryClient.invalidateQueries({ queryKey: moneyBaseKey });
    },
  });
}
