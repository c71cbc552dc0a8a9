import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PayLink } from '@shared/schemas/portal';
import { api } from '@/lib/api';
import { payLinkBaseKey } from './keys';

/** An e-mailed pay link: no sign-in, the token in the address is the only key, and it opens one invoice. */
export const payLinkPath = (token: string) => `/api/pay/${encodeURIComponent(token)}`;

export const getPayLink = (token: string, signal?: AbortSignal) => api.get<PayLink>(payLinkPath(token), { signal });

export const payLinkQueryOptions = (token: string) =>
  queryOptions({
    queryKey: [...payLinkBaseKey, token] as const,
    queryFn: ({ signal }) => getPayLink(token, signal),
    // A 404 or 410 is an answer about the link, not a hiccup.
    retry: false,
  });

export const usePayLink = (token: string) => useQuery({ ...payLinkQueryOptions(token), enabled: token.length > 0 });

/** A document (invoice PDF, receipt) of the pay link's invoice. */
export const payLinkDocumentUrl = (token: string, documentId: string) => `${payLinkPath(token)}/documents/${encodeURIComponent(documentId)}/pdf`;
