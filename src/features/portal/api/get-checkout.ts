import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CheckoutState } from '@shared/schemas/portal';
import { api } from '@/lib/api';
import { CONFIRM_POLL_MS, keepPolling } from './polling';
import { portalBaseKey } from './keys';

/** Where a card payment stands, as the signed-in customer sees it. */
export const getPortalCheckout = (id: string, signal?: AbortSignal) => api.get<CheckoutState>(`/api/portal/checkouts/${encodeURIComponent(id)}`, { signal });

export const portalCheckoutQueryOptions = (id: string) =>
  queryOptions({
    queryKey: [...portalBaseKey, 'checkouts', id] as const,
    queryFn: ({ signal }) => getPortalCheckout(id, signal),
    staleTime: 0,
  });

/** Asks every second while the payment is `open`, until `pollUntil` (ms since epoch). */
export const usePortalCheckout = (id: string, pollUntil: number) =>
  useQuery({
    ...portalCheckoutQueryOptions(id),
    refetchInterval: (query) => (keepPolling(query.state.data, pollUntil) ? CONFIRM_POLL_MS : false),
    refetchIntervalInBackground: true,
  });
