import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DocumentRow } from '@shared/schemas/documents';
import { api } from '@/lib/api';

export const getDocument = (id: string, signal?: AbortSignal) => api.get<DocumentRow>(`/api/documents/${encodeURIComponent(id)}`, { signal });

export const documentQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ['documents', 'detail', id] as const,
    queryFn: ({ signal }) => getDocument(id, signal),
  });

export const useDocument = (id: string) => useQuery(documentQueryOptions(id));
