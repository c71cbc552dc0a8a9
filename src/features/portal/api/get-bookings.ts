import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PortalBookingSummary } from '@shared/schemas/portal';
import { api } from '@/lib/api';
import { portalBaseKey } from './keys';

interface BookingList {
  data: PortalBookingSummary[];
  total: number;
}

/** Every booking of the signed-in customer, with every company that has their e-mail address. */
export async function getPortalBookings(signal?: AbortSignal): Promise<BookingList> {
  const answer = await api.get<BookingList | PortalBookingSummary[]>('/api/portal/bookings', { signal, query: { pageSize: 100 } });
  // Lists come as { data, total }; a bare array is read the same way.
  return Array.isArray(answer) ? { data: answer, total: answer.length } : answer;
}

export const portalBookingsQueryOptions = () =>
  queryOptions({
    queryKey: [...portalBaseKey, 'bookings'] as const,
    queryFn: ({ signal }) => getPortalBookings(signal),
  });

export const usePortalBookings = () => useQuery(portalBookingsQueryOptions());
