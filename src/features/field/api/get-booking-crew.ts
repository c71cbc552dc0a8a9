import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CrewMember } from '@shared/schemas/field';
import { api } from '@/lib/api';
import { fieldBaseKey } from './get-day-sheet';

export interface BookingCrew {
  data: CrewMember[];
  total: number;
  can: { assign: boolean };
}

export const getBookingCrew = (bookingId: string, signal?: AbortSignal) => api.get<BookingCrew>(`/api/field/bookings/${encodeURIComponent(bookingId)}/crew`, { signal });

export const bookingCrewQueryOptions = (bookingId: string) =>
  queryOptions({ queryKey: [...fieldBaseKey, 'crew', bookingId] as const, queryFn: ({ signal }) => getBookingCrew(bookingId, signal) });

export const useBookingCrew = (bookingId: string) => useQuery(bookingCrewQueryOptions(bookingId));
