import { useMutation } from '@tanstack/react-query';
import type { CheckoutRequest, CheckoutResponse } from '@shared/schemas/portal';
import { api } from '@/lib/api';
import { payLinkPath } from './get-pay-link';

/** Starts a card payment of the pay link's invoice; the answer is the secure payment page's address. */
export const startPayLinkCheckout = ({ token, body }: { token: string; body: CheckoutRequest }) => api.post<CheckoutResponse>(`${payLinkPath(token)}/checkout`, body);

export const useStartPayLinkCheckout = () => useMutation({ mutationFn: startPayLinkCheckout });
