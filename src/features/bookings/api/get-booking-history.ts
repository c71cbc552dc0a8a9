import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api';

export interface BookingHistoryEntry {
  id: string;
  action: string;
  at: string;
  actorName: string | null;
  data: Record<string, unknown> | null;
}

export const getBookingHistory = (id: string, signal?: AbortSignal) =>
  api.get<{ data: BookingHistoryEntry[] }>(`/api/bookings/${encodeURIComponent(id)}/history`, { signal });

export const bookingHistoryQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ['bookings', 'history', id] as const,
    queryFn: ({ signal }) => getBookingHistory(id, signal),
  });

export const useBookingHistory = (id: string) => useQuery(bookingHistoryQueryOptions(id));
