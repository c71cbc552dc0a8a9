import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { DepositsReport } from '@shared/schemas/reports';
import { api } from '@/lib/api';
import { reportsBaseKey } from './keys';

/** Customer deposits, security deposits and account credit held at the end of a day, by booking. */
export const getDeposits = (query: { at?: string }, signal?: AbortSignal) => api.get<DepositsReport>('/api/reports/deposits', { query: { ...query }, signal });

export const depositsQueryOptions = (query: { at?: string }) =>
  queryOptions({
    queryKey: [...reportsBaseKey, 'deposits', query] as const,
    queryFn: ({ signal }) => getDeposits(query, signal),
    // Another date keeps the last figures on screen until the new ones arrive.
    placeholderData: keepPreviousData,
  });

export const useDeposits = (query: { at?: string }) => useQuery(depositsQueryOptions(query));
