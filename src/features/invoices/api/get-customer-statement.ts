import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CustomerStatement } from '@shared/schemas/invoices';
import { api } from '@/lib/api';

/** Every ledger entry that touched what the customer owes, oldest first, with the running balance (not for crew: 403). */
export const getCustomerStatement = (customerId: string, signal?: AbortSignal) =>
  api.get<CustomerStatement>(`/api/customers/${encodeURIComponent(customerId)}/statement`, { signal });

export const customerStatementQueryOptions = (customerId: string) =>
  queryOptions({
    // Under the money key: a payment or refund anywhere refreshes the statement too.
    queryKey: ['invoices', 'statement', customerId] as const,
    queryFn: ({ signal }) => getCustomerStatement(customerId, signal),
  });

export const useCustomerStatement = (customerId: string) => useQuery(customerStatementQueryOptions(customerId));
