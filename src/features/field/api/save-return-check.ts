import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FieldBooking, ReturnCheckInput } from '@shared/schemas/field';
import { api } from '@/lib/api';
import { rememberFieldBooking } from './get-field-booking';

/** Saves the pickup count; `submit: true` finishes the check-in and the booking becomes returned. */
export const saveReturnCheck = ({ bookingId, ...body }: ReturnCheckInput & { bookingId: string }) =>
  api.put<FieldBooking>(`/api/field/bookings/${encodeURIComponent(bookingId)}/return-check`, body);

export function useSaveReturnCheck(bookingId: string) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: saveReturnCheck, onSuccess: (data) => rememberFieldBooking(queryClient, bookingId, data) });
}
