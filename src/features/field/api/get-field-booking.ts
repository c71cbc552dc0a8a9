import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import type { FieldBooking } from '@shared/schemas/field';
import { api } from '@/lib/api';
import { fieldBaseKey } from './get-day-sheet';

export const getFieldBooking = (bookingId: string, signal?: AbortSignal) => api.get<FieldBooking>(`/api/field/bookings/${encodeURIComponent(bookingId)}`, { signal });

export const fieldBookingQueryOptions = (bookingId: string) =>
  queryOptions({
    queryKey: [...fieldBaseKey, 'bookings', bookingId] as const,
    queryFn: ({ signal }) => getFieldBooking(bookingId, signal),
  });

export const useFieldBooking = (bookingId: string) => useQuery(fieldBookingQueryOptions(bookingId));

/** Every field write answers with the booking's field page: keep it, and let day sheets and the booking reload. */
export function rememberFieldBooking(queryClient: QueryClient, bookingId: string, data: FieldBooking) {
  queryClient.setQueryData(fieldBookingQueryOptions(bookingId).queryKey, data);
  void queryClient.invalidateQueries({ queryKey: [...fieldBaseKey, 'days'] });
  void queryClient.invalidateQueries({ queryKey: ['bookings', 'detail', bookingId] });
  void queryClient.invalidateQueries({ queryKey: [...fieldBaseKey, 'charges', bookingId] });
}
