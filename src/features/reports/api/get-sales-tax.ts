import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { SalesTaxReport } from '@shared/schemas/reports';
import { api } from '@/lib/api';
import { reportsBaseKey } from './keys';

/** Sales tax by month (YYYY-MM, both included) and rate, reconciled to sales tax payable. */
export const getSalesTax = (query: { from?: string; to?: string }, signal?: AbortSignal) => api.get<SalesTaxReport>('/api/reports/sales-tax', { query: { ...query }, signal });

export const salesTaxQueryOptions = (query: { from?: string; to?: string }) =>
  queryOptions({
    queryKey: [...reportsBaseKey, 'sales-tax', query] as const,
    queryFn: ({ signal }) => getSalesTax(query, signal),
    // Another date keeps the last figures on screen until the new ones arrive.
    placeholderData: keepPreviousData,
  });

export const useSalesTax = (query: { from?: string; to?: string }) => useQuery(salesTaxQueryOptions(query));
