import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { BookingListRow, BookingStatus } from '@shared/schemas/bookings';
import type { ListResponse } from '@shared/schemas/common';
import { api } from '@/lib/api';

export interface BookingsFilter {
  status?: BookingStatus[];
  /** Bookings whose event overlaps from..to. */
  from?: string;
  to?: string;
  customerId?: string;
  q?: string;
  page?: number;
  pageSize?: number;
}

export const getBookings = ({ status, ...rest }: BookingsFilter, signal?: AbortSignal) =>
  api.get<ListResponse<BookingListRow>>('/api/bookings', { query: { ...rest, status: status?.length ? status.join(',') : undefined }, signal });

export const bookingsBaseKey = ['bookings'] as const;

export const bookingsQueryOptions = (filter: BookingsFilter) =>
  queryOptions({
    queryKey: ['bookings', 'list', filter] as const,
    queryFn: ({ signal }) => getBookings(filter, signal),
    placeholderData: keepPreviousData,
  });

export const useBookings = (filter: BookingsFilter) => useQuery(bookingsQueryOptions(filter));
