import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClauseRow } from '@shared/schemas/documents';
import { api } from '@/lib/api';

/** The company's clause library, in position order. */
export const getClauses = (signal?: AbortSignal) => api.get<{ data: ClauseRow[] }>('/api/clauses', { signal });

export const clausesQueryOptions = () =>
  queryOptions({
    queryKey: ['clauses'] as const,
    queryFn: ({ signal }) => getClauses(signal),
  });

export const useClauses = () => useQuery(clausesQueryOptions());
