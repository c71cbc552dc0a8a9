import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvoiceRow } from '@shared/schemas/invoices';
import { api } from '@/lib/api';

export const getInvoice = (id: string, signal?: AbortSignal) => api.get<InvoiceRow>(`/api/invoices/${encodeURIComponent(id)}`, { signal });

export const invoiceQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ['invoices', 'detail', id] as const,
    queryFn: ({ signal }) => getInvoice(id, signal),
  });

export const useInvoice = (id: string) => useQuery(invoiceQueryOptions(id));
