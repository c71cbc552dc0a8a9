import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import type { MeResponse } from '@shared/schemas/auth';
import { api, isApiError } from '@/lib/api';

/** Who is signed in, or null when nobody is (a 401 is an answer here, not an error). */
export async function getMe(signal?: AbortSignal): Promise<MeResponse | null> {
  try {
    return await api.get<MeResponse>('/api/auth/me', { signal });
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export const meQueryOptions = () =>
  queryOptions({
    queryKey: ['auth', 'me'] as const,
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 5 * 60_000,
    retry: false,
  });

export const useMe = () => useQuery(meQueryOptions());

/** After any sign-in: forget everything cached for the previous user, then remember the new one. */
export function rememberSignedIn(queryClient: QueryClient, me: MeResponse) {
  queryClient.removeQueries();
  queryClient.setQueryData(meQueryOptions().queryKey, me);
}

/** When the session has ended: the app shell sees nobody signed in and goes to sign in. */
export function forgetSignedIn(queryClient: QueryClient) {
  queryClient.setQueryData(meQueryOptions().queryKey, null);
}
