import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { RevenueReport } from '@shared/schemas/reports';
import { api } from '@/lib/api';
import { reportsBaseKey } from './keys';

/** Revenue by account and month, a year against the one before. */
export const getRevenue = (query: { year?: number }, signal?: AbortSignal) => api.get<RevenueReport>('/api/reports/revenue', { query: { ...query }, signal });

export const revenueQueryOptions = (query: { year?: number }) =>
  queryOptions({
    queryKey: [...reportsBaseKey, 'revenue', query] as const,
    queryFn: ({ signal }) => getRevenue(query, signal),
    // Another date keeps the last figures on screen until the new ones arrive.
    placeholderData: keepPreviousData,
  });

export const useRevenue = (query: { year?: number }) => useQuery(revenueQueryOptions(query));
