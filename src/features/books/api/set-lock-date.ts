import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LockDateRequest, LockDateRow } from '@shared/schemas/books';
import { api } from '@/lib/api';
import { lockDateKey } from './get-lock-date';

/**
 * Closes the books through a day (owner and bookkeeper), or moves the date back or clears it (the
 * owner; a bookkeeper gets 403 naming the current date). 400 on `closedThrough` for today or later.
 */
export const setLockDate = (body: LockDateRequest) => api.put<LockDateRow>('/api/ledger/lock-date', body);

export function useSetLockDate() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: setLockDate,
    onSuccess: (row) => queryClient.setQueryData(lockDateKey, row),
  });
}
