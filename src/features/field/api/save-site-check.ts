import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FieldBooking, SiteCheckInput } from '@shared/schemas/field';
import { api } from '@/lib/api';
import { rememberFieldBooking } from './get-field-booking';

export const saveSiteCheck = ({ bookingId, ...body }: SiteCheckInput & { bookingId: string }) =>
  api.put<FieldBooking>(`/api/field/bookings/${encodeURIComponent(bookingId)}/site-check`, body);

export function useSaveSiteCheck(bookingId: string) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: saveSiteCheck, onSuccess: (data) => rememberFieldBooking(queryClient, bookingId, data) });
}
