import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListResponse } from '@shared/schemas/common';
import type { SigningRequestRow } from '@shared/schemas/signing';
import { api } from '@/lib/api';

/** A document's signing requests, newest first, each with its trail. */
export const getSignatureRequests = (documentId: string, signal?: AbortSignal) =>
  api.get<ListResponse<SigningRequestRow>>(`/api/documents/${encodeURIComponent(documentId)}/signature-requests`, { signal });

/** While a link is out, ask now and then so "opened" and "signed" appear without reloading. */
export const SIGNING_POLL_MS = 10_000;

export const signatureRequestsQueryOptions = (documentId: string) =>
  queryOptions({
    queryKey: ['signing', 'requests', documentId] as const,
    queryFn: ({ signal }) => getSignatureRequests(documentId, signal),
    refetchInterval: (query) => (query.state.data?.data.some((r) => r.status === 'pending') ? SIGNING_POLL_MS : false),
  });

export const useSignatureRequests = (documentId: string, options: { enabled?: boolean } = {}) =>
  useQuery({ ...signatureRequestsQueryOptions(documentId), ...options });
