import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ShortfallsReport } from '@shared/schemas/reports';
import { api } from '@/lib/api';
import { reportsBaseKey } from './keys';

/** The requests the stock could not meet, by item. */
export const getShortfalls = (query: { from?: string; to?: string }, signal?: AbortSignal) => api.get<ShortfallsReport>('/api/reports/shortfalls', { query: { ...query }, signal });

export const shortfallsQueryOptions = (query: { from?: string; to?: string }) =>
  queryOptions({
    queryKey: [...reportsBaseKey, 'shortfalls', query] as const,
    queryFn: ({ signal }) => getShortfalls(query, signal),
    // Another date keeps the last figures on screen until the new ones arrive.
    placeholderData: keepPreviousData,
  });

export const useShortfalls = (query: { from?: string; to?: string }) => useQuery(shortfallsQueryOptions(query));
