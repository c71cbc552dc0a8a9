import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CustomerRow } from '@shared/schemas/customers';
import { api } from '@/lib/api';

export const getCustomer = (id: string, signal?: AbortSignal) => api.get<CustomerRow>(`/api/customers/${encodeURIComponent(id)}`, { signal });

export const customerQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ['customers', 'detail', id] as const,
    queryFn: ({ signal }) => getCustomer(id, signal),
  });

export const useCustomer = (id: string, options: { enabled?: boolean } = {}) => useQuery({ ...customerQueryOptions(id), ...options });
