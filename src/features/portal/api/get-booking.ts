import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PortalBooking } from '@shared/schemas/portal';
import { api } from '@/lib/api';
import { portalBaseKey } from './keys';

/** One of the customer's bookings; another customer's is a 404, as if it did not exist. */
export const getPortalBooking = (id: string, signal?: AbortSignal) => api.get<PortalBooking>(`/api/portal/bookings/${encodeURIComponent(id)}`, { signal });

export const portalBookingQueryOptions = (id: string) =>
  queryOptions({
    queryKey: [...portalBaseKey, 'bookings', id] as const,
    queryFn: ({ signal }) => getPortalBooking(id, signal),
  });

export const usePortalBooking = (id: string) => useQuery({ ...portalBookingQueryOptions(id), enabled: id.length > 0 });
