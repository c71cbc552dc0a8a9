import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AccountInput, AccountRow } from '@shared/schemas/invoices';
import { api } from '@/lib/api';
import { moneyBaseKey } from './get-invoices';

/** Owner only: the company's own code and name for an account. 409 `code_taken` on `code`. */
export const updateAccount = ({ id, body }: { id: string; body: AccountInput }) => api.put<AccountRow>(`/api/ledger/accounts/${encodeURIComponent(id)}`, body);

export function useUpdateAccount() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateAccount,
    // Ledger entries print the account's code and name.
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: moneyBaseKey }),
  });
}
