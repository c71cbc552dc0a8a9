import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BookingRow, BookingStatusChange, ShortfallDetail } from '@shared/schemas/bookings';
import { api, isApiError } from '@/lib/api';
import { bookingHistoryQueryOptions } from './get-booking-history';
import { bookingQueryOptions } from './get-booking';
import { bookingsBaseKey } from './get-bookings';

export const changeBookingStatus = ({ id, ...body }: BookingStatusChange & { id: string }) =>
  api.post<BookingRow>(`/api/bookings/${encodeURIComponent(id)}/status`, body);

/** A 409 "shortfall" on reserving names each item that is short and by how many. */
export function shortfallsOf(error: unknown): ShortfallDetail[] | null {
  if (!isApiError(error, 'shortfall')) return null;
  return (error.body as { shortfalls?: ShortfallDetail[] } | null)?.shortfalls ?? [];
}

export function useChangeBookingStatus() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: changeBookingStatus,
    onSuccess: (booking) => {
      queryClient.setQueryData(bookingQueryOptions(booking.id).queryKey, booking);
      void queryClient.invalidateQueries({ queryKey: [...bookingsBaseKey, 'list'] });
      void queryClient.invalidateQueries({ queryKey: bookingHistoryQueryOptions(booking.id).queryKey });
      // Reserving and releasing change what the catalog shows as free.
      void queryClient.invalidateQueries({ queryKey: ['items', 'availability'] });
    },
  });
}
