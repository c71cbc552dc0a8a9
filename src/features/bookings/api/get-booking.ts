import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BookingRow } from '@shared/schemas/bookings';
import { api } from '@/lib/api';

export const getBooking = (id: string, signal?: AbortSignal) => api.get<BookingRow>(`/api/bookings/${encodeURIComponent(id)}`, { signal });

export const bookingQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ['bookings', 'detail', id] as const,
    queryFn: ({ signal }) => getBooking(id, signal),
  });

export const useBooking = (id: string) => useQuery(bookingQueryOptions(id));
