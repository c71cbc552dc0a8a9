import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import { bookingCrewQueryOptions, type BookingCrew } from './get-booking-crew';
import { fieldBaseKey } from './get-day-sheet';

export const assignCrew = ({ bookingId, userIds }: { bookingId: string; userIds: string[] }) =>
  api.put<BookingCrew>(`/api/field/bookings/${encodeURIComponent(bookingId)}/crew`, { userIds });

export function useAssignCrew(bookingId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userIds: string[]) => assignCrew({ bookingId, userIds }),
    onSuccess: (crew) => {
      queryClient.setQueryData(bookingCrewQueryOptions(bookingId).queryKey, crew);
      void queryClient.invalidateQueries({ queryKey: [...fieldBaseKey, 'days'] });
      void queryClient.invalidateQueries({ queryKey: [...fieldBaseKey, 'bookings', bookingId] });
    },
  });
}
