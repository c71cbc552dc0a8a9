import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListResponse } from '@shared/schemas/common';
import type { ClauseRow, LibraryPermissions } from '@shared/schemas/documents';
import { api } from '@/lib/api';

/** The company's clause library, in position order; `can.update` says whether this user may change it. */
export const getClauses = (signal?: AbortSignal) => api.get<ListResponse<ClauseRow> & LibraryPermissions>('/api/clauses', { signal });

export const clausesQueryOptions = () =>
  queryOptions({
    queryKey: ['clauses'] as const,
    queryFn: ({ signal }) => getClauses(signal),
  });

export const useClauses = () => useQuery(clausesQueryOptions());
