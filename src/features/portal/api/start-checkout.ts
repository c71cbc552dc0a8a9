import { useMutation } from '@tanstack/react-query';
import type { CheckoutRequest, CheckoutResponse } from '@shared/schemas/portal';
import { api } from '@/lib/api';

/**
 * Starts a card payment of an invoice (the whole balance, or `amountCents` of it) and answers the
 * secure payment page's address. The caller leaves for it with `window.location.assign`.
 */
export const startInvoiceCheckout = ({ invoiceId, body }: { invoiceId: string; body: CheckoutRequest }) =>
  api.post<CheckoutResponse>(`/api/invoices/${encodeURIComponent(invoiceId)}/checkout`, body);

export const useStartInvoiceCheckout = () => useMutation({ mutationFn: startInvoiceCheckout });
