import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreditRefundRequest } from '@shared/schemas/invoices';
import { api } from '@/lib/api';
import { moneyBaseKey } from './get-invoices';

/** Owner only (403 otherwise): pays the customer's account credit back in money. 409 on `amountCents` when more than the credit. */
export const refundCustomerCredit = ({ customerId, body }: { customerId: string; body: CreditRefundRequest }) =>
  api.post<unknown>(`/api/customers/${encodeURIComponent(customerId)}/credit/refunds`, body);

export function useRefundCustomerCredit() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: refundCustomerCredit,
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: moneyBaseKey }),
  });
}
