import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CustomerCredit } from '@shared/schemas/invoices';
import { api } from '@/lib/api';

/** What the company owes the customer as account credit, and the entries that moved it. */
export const getCustomerCredit = (customerId: string, signal?: AbortSignal) =>
  api.get<CustomerCredit>(`/api/customers/${encodeURIComponent(customerId)}/credit`, { signal });

export const customerCreditQueryOptions = (customerId: string) =>
  queryOptions({
    // Under the money key: an overpayment, a credit note or a payment from credit anywhere refreshes it.
    queryKey: ['invoices', 'credit', customerId] as const,
    queryFn: ({ signal }) => getCustomerCredit(customerId, signal),
  });

export const useCustomerCredit = (customerId: string, options: { enabled?: boolean } = {}) => useQuery({ ...customerCreditQueryOptions(customerId), ...options });
