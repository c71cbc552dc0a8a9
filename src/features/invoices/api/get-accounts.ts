import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListResponse } from '@shared/schemas/common';
import type { AccountRow } from '@shared/schemas/invoices';
import { api } from '@/lib/api';

export type AccountsResponse = ListResponse<AccountRow> & { can: { update: boolean } };

/** The company's chart of accounts, by code; `can.update` is the owner's. */
export const getAccounts = (signal?: AbortSignal) => api.get<AccountsResponse>('/api/ledger/accounts', { signal });

export const accountsQueryOptions = () =>
  queryOptions({
    // Account codes and names show in every ledger entry, so they live under the money key.
    queryKey: ['invoices', 'accounts'] as const,
    queryFn: ({ signal }) => getAccounts(signal),
  });

export const useAccounts = () => useQuery(accountsQueryOptions());
