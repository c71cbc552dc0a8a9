import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { StockReport } from '@shared/schemas/reports';
import { api } from '@/lib/api';
import { reportsBaseKey } from './keys';

/** Stock utilization and payback per item over a period of days. */
export const getStock = (query: { from?: string; to?: string }, signal?: AbortSignal) => api.get<StockReport>('/api/reports/stock', { query: { ...query }, signal });

export const stockQueryOptions = (query: { from?: string; to?: string }) =>
  queryOptions({
    queryKey: [...reportsBaseKey, 'stock', query] as const,
    queryFn: ({ signal }) => getStock(query, signal),
    // Another date keeps the last figures on screen until the new ones arrive.
    placeholderData: keepPreviousData,
  });

export const useStock = (query: { from?: string; to?: string }) => useQuery(stockQueryOptions(query));
