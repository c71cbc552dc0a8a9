import { queryOptions, useQuery } from '@tanstack/react-query';
import type { StockReport } from '@shared/schemas/reports';
import { api } from '@/lib/api';
import { reportsBaseKey } from './keys';

/** One item's utilization and payback over a period, with the bookings behind its figures. */
export const getStockItem = (itemId: string, query: { from: string; to: string }, signal?: AbortSignal) =>
  api.get<StockReport>(`/api/reports/stock/items/${encodeURIComponent(itemId)}`, { query, signal });

export const stockItemQueryOptions = (itemId: string, query: { from: string; to: string }) =>
  queryOptions({
    queryKey: [...reportsBaseKey, 'stock-item', itemId, query] as const,
    queryFn: ({ signal }) => getStockItem(itemId, query, signal),
  });

export const useStockItem = (itemId: string, query: { from: string; to: string }) => useQuery(stockItemQueryOptions(itemId, query));
