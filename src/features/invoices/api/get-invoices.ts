import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListResponse } from '@shared/schemas/common';
import type { InvoiceRow, InvoiceStatus } from '@shared/schemas/invoices';
import { api } from '@/lib/api';

/** The list's status filter: the invoice statuses, and "overdue" across open and partly paid. */
export type InvoiceStatusFilter = InvoiceStatus | 'overdue';

export interface InvoicesFilter {
  status?: InvoiceStatusFilter[];
  bookingId?: string;
  /** Number, customer or booking reference. */
  q?: string;
  page?: number;
  pageSize?: number;
}

export const getInvoices = ({ status, ...rest }: InvoicesFilter, signal?: AbortSignal) =>
  api.get<ListResponse<InvoiceRow>>('/api/invoices', { query: { ...rest, status: status?.length ? status.join(',') : undefined }, signal });

/**
 * Everything money-related sits under this key (invoices, a booking's payments and ledger), so a
 * payment, an issue or a void refreshes every balance on screen with one invalidation.
 */
export const moneyBaseKey = ['invoices'] as const;

export const invoicesQueryOptions = (filter: InvoicesFilter) =>
  queryOptions({
    queryKey: ['invoices', 'list', filter] as const,
    queryFn: ({ signal }) => getInvoices(filter, signal),
    placeholderData: keepPreviousData,
  });

export const useInvoices = (filter: InvoicesFilter, options: { enabled?: boolean } = {}) => useQuery({ ...invoicesQueryOptions(filter), ...options });
