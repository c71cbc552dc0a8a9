import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CheckoutState } from '@shared/schemas/portal';
import { api } from '@/lib/api';
import { payLinkPath } from './get-pay-link';
import { payLinkBaseKey } from './keys';
import { CONFIRM_POLL_MS, keepPolling } from './polling';

/** Where a card payment started from a pay link stands. */
export const getPayLinkCheckout = (token: string, checkoutId: string, signal?: AbortSignal) =>
  api.get<CheckoutState>(`${payLinkPath(token)}/checkouts/${encodeURIComponent(checkoutId)}`, { signal });

export const payLinkCheckoutQueryOptions = (token: string, checkoutId: string) =>
  queryOptions({
    queryKey: [...payLinkBaseKey, token, 'checkouts', checkoutId] as const,
    queryFn: ({ signal }) => getPayLinkCheckout(token, checkoutId, signal),
    staleTime: 0,
    retry: false,
  });

/** Asks every second while the payment is `open`, until `pollUntil` (ms since epoch). */
export const usePayLinkCheckout = (token: string, checkoutId: string, pollUntil: number) =>
  useQuery({
    ...payLinkCheckoutQueryOptions(token, checkoutId),
    refetchInterval: (query) => (keepPolling(query.state.data, pollUntil) ? CONFIRM_POLL_MS : false),
    refetchIntervalInBackground: true,
  });
