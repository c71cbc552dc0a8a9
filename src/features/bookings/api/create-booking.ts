import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BookingInput, BookingRow } from '@shared/schemas/bookings';
import { api } from '@/lib/api';
import { bookingQueryOptions } from './get-booking';
import { bookingsBaseKey } from './get-bookings';

export const createBooking = (body: BookingInput) => api.post<BookingRow>('/api/bookings', body);

export function useCreateBooking() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createBooking,
    onSuccess: (booking) => {
      queryClient.setQueryData(bookingQueryOptions(booking.id).queryKey, booking);
      void queryClient.invalidateQueries({ queryKey: [...bookingsBaseKey, 'list'] });
    },
  });
}
