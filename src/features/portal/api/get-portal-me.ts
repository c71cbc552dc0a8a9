import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PortalMe } from '@shared/schemas/portal';
import { api, isApiError } from '@/lib/api';
import { portalBaseKey } from './keys';

/** The signed-in customer, or null when nobody is (a 401 is an answer here, not an error). */
export async function getPortalMe(signal?: AbortSignal): Promise<PortalMe | null> {
  try {
    return await api.get<PortalMe>('/api/portal/me', { signal });
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export const portalMeQueryOptions = () =>
  queryOptions({
    queryKey: [...portalBaseKey, 'me'] as const,
    queryFn: ({ signal }) => getPortalMe(signal),
    staleTime: 5 * 60_000,
    retry: false,
  });

export const usePortalMe = () => useQuery(portalMeQueryOptions());
