import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListResponse } from '@shared/schemas/common';
import type { CustomerListQuery, CustomerRow } from '@shared/schemas/customers';
import { api } from '@/lib/api';

export type CustomersFilter = Partial<CustomerListQuery>;

/** q searches name, e-mail and phone. */
export const getCustomers = (filter: CustomersFilter, signal?: AbortSignal) =>
  api.get<ListResponse<CustomerRow>>('/api/customers', { query: { ...filter }, signal });

export const customersBaseKey = ['customers'] as const;

export const customersQueryOptions = (filter: CustomersFilter) =>
  queryOptions({
    queryKey: ['customers', 'list', filter] as const,
    queryFn: ({ signal }) => getCustomers(filter, signal),
    placeholderData: keepPreviousData,
  });

export const useCustomers = (filter: CustomersFilter, options: { enabled?: boolean } = {}) => useQuery({ ...customersQueryOptions(filter), ...options });
