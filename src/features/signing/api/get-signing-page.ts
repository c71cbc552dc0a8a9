import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SigningPage } from '@shared/schemas/signing';
import { api } from '@/lib/api';

/** The public signing page's data; no account, the token in the address is the only key. */
export const getSigningPage = (token: string, signal?: AbortSignal) => api.get<SigningPage>(`/api/sign/${encodeURIComponent(token)}`, { signal });

export const signingPageQueryOptions = (token: string) =>
  queryOptions({
    queryKey: ['signing', 'page', token] as const,
    queryFn: ({ signal }) => getSigningPage(token, signal),
    // A 404 or 410 is an answer about the link, not a hiccup: asking again changes nothing.
    retry: false,
    // The customer's place in the steps lives on the page; a refetch on focus would only cost a request.
    refetchOnWindowFocus: false,
    staleTime: Infinity,
  });

export const useSigningPage = (token: string) => useQuery({ ...signingPageQueryOptions(token), enabled: token.length > 0 });
