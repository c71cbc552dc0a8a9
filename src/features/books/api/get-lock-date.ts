import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LockDateRow } from '@shared/schemas/books';
import { api } from '@/lib/api';

/** The day the books are closed through, who closed them, and what the viewer may do (owner and bookkeeper; others 403). */
export const getLockDate = (signal?: AbortSignal) => api.get<LockDateRow>('/api/ledger/lock-date', { signal });

export const lockDateKey = ['books', 'lock-date'] as const;

export const lockDateQueryOptions = () =>
  queryOptions({
    queryKey: lockDateKey,
    queryFn: ({ signal }) => getLockDate(signal),
  });

export const useLockDate = () => useQuery(lockDateQueryOptions());
