import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BookingInput, BookingRow } from '@shared/schemas/bookings';
import { api } from '@/lib/api';
import { bookingHistoryQueryOptions } from './get-booking-history';
import { bookingQueryOptions } from './get-booking';
import { bookingsBaseKey } from './get-bookings';

/** PUT takes the whole booking with all its lines. */
export const updateBooking = ({ id, body }: { id: string; body: BookingInput }) => api.put<BookingRow>(`/api/bookings/${encodeURIComponent(id)}`, body);

export function useUpdateBooking() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateBooking,
    onSuccess: (booking) => {
      queryClient.setQueryData(bookingQueryOptions(booking.id).queryKey, booking);
      void queryClient.invalidateQueries({ queryKey: [...bookingsBaseKey, 'list'] });
      void queryClient.invalidateQueries({ queryKey: bookingHistoryQueryOptions(booking.id).queryKey });
    },
  });
}
