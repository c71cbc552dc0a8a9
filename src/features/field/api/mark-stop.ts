import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FieldBooking, FieldMark } from '@shared/schemas/field';
import { api } from '@/lib/api';
import { rememberFieldBooking } from './get-field-booking';

export const markStop = ({ bookingId, mark }: { bookingId: string; mark: FieldMark }) =>
  api.post<FieldBooking>(`/api/field/bookings/${encodeURIComponent(bookingId)}/marks`, { mark });

export function useMarkStop(bookingId: string) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: (mark: FieldMark) => markStop({ bookingId, mark }), onSuccess: (data) => rememberFieldBooking(queryClient, bookingId, data) });
}
