import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AgingReport } from '@shared/schemas/reports';
import { api } from '@/lib/api';
import { reportsBaseKey } from './keys';

/** Receivables aging at the end of a day (today when left out), with its reconciliation to accounts receivable. */
export const getAging = (query: { at?: string }, signal?: AbortSignal) => api.get<AgingReport>('/api/reports/aging', { query: { ...query }, signal });

export const agingQueryOptions = (query: { at?: string }) =>
  queryOptions({
    queryKey: [...reportsBaseKey, 'aging', query] as const,
    queryFn: ({ signal }) => getAging(query, signal),
    // Another date keeps the last figures on screen until the new ones arrive.
    placeholderData: keepPreviousData,
  });

export const useAging = (query: { at?: string }) => useQuery(agingQueryOptions(query));
