import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SecurityDepositRequest } from '@shared/schemas/invoices';
import { api } from '@/lib/api';
import { bookingLedgerQueryOptions } from './get-booking-ledger';
import { moneyBaseKey } from './get-invoices';

export interface SecurityDepositMoveRow {
  id: string;
  kind: 'held' | 'refunded' | 'kept' | 'applied';
  amountCents: number;
  /** What the booking holds after this move. */
  heldCents: number;
}

/**
 * Collect, return (owner only), keep part for damage, or apply part to one of the booking's
 * invoices. 409 `more_than_held` on `amountCents` when moving more than the booking holds (or,
 * applying, more than the invoice's balance).
 */
export const moveSecurityDeposit = ({ bookingId, body }: { bookingId: string; body: SecurityDepositRequest }) =>
  api.post<SecurityDepositMoveRow>(`/api/bookings/${encodeURIComponent(bookingId)}/security-deposit`, body);

export function useMoveSecurityDeposit() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: moveSecurityDeposit,
    onSuccess: (move, { bookingId }) => {
      // The answer says what is held now: show it at once, so a return opened right after a
      // collect is prefilled with the new amount rather than the one before the refetch.
      queryClient.setQueryData(bookingLedgerQueryOptions(bookingId).queryKey, (ledger) => ledger && { ...ledger, securityDepositHeldCents: move.heldCents });
      void queryClient.invalidateQueries({ queryKey: moneyBaseKey });
    },
  });
}
