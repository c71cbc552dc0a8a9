import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RefundRequest } from '@shared/schemas/invoices';
import { api } from '@/lib/api';
import { moneyBaseKey } from './get-invoices';

export interface RefundRow {
  id: string;
  paymentId: string;
  amountCents: number;
  reason: string;
  /** A card refund is pending until the card processor confirms it. */
  status: 'pending' | 'succeeded' | 'failed';
  createdAt: string;
}

/**
 * Owner only (403 otherwise). The invoices the payment paid are owed again, so every balance
 * changes. 409 `refund_too_large` names on `amountCents` how much of the payment is left.
 */
export const refundPayment = ({ paymentId, body }: { paymentId: string; body: RefundRequest }) =>
  api.post<RefundRow>(`/api/payments/${encodeURIComponent(paymentId)}/refunds`, body);

export function useRefundPayment() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: refundPayment,
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: moneyBaseKey }),
  });
}
