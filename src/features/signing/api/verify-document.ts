import { queryOptions, useQuery } from '@tanstack/react-query';
import type { VerifyResult } from '@shared/schemas/signing';
import { api } from '@/lib/api';

/** Hashes the stored bytes again and, for a signed copy, checks its digital signature. */
export const verifyDocument = (documentId: string, signal?: AbortSignal) =>
  api.get<VerifyResult>(`/api/documents/${encodeURIComponent(documentId)}/verify`, { signal });

export const verifyDocumentQueryOptions = (documentId: string) =>
  queryOptions({
    queryKey: ['signing', 'verify', documentId] as const,
    queryFn: ({ signal }) => verifyDocument(documentId, signal),
    // Every click is a fresh check of the stored file, never an old answer.
    staleTime: 0,
    gcTime: 0,
    retry: false,
  });

/** Runs only when asked (`enabled`), then again on each `refetch()`. */
export const useVerifyDocument = (documentId: string, options: { enabled?: boolean } = {}) =>
  useQuery({ ...verifyDocumentQueryOptions(documentId), ...options });
