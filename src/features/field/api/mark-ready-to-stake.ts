import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FieldBooking } from '@shared/schemas/field';
import { api } from '@/lib/api';
import { rememberFieldBooking } from './get-field-booking';

/** 409 `locate_required` until a locate ticket number is recorded or a hard surface with ballast is declared. */
export const markReadyToStake = (bookingId: string) => api.post<FieldBooking>(`/api/field/bookings/${encodeURIComponent(bookingId)}/ready-to-stake`);

export function useMarkReadyToStake(bookingId: string) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: () => markReadyToStake(bookingId), onSuccess: (data) => rememberFieldBooking(queryClient, bookingId, data) });
}
