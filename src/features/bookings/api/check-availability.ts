import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ShortfallDetail } from '@shared/schemas/bookings';
import { api } from '@/lib/api';

export interface AvailabilityCheck {
  from: string;
  to: string;
  excludeBookingId?: string;
  lines: { itemId: string; quantity: number }[];
}

/** A question, not a write: POST only because the lines do not fit a query string. */
export const checkAvailability = (body: AvailabilityCheck, signal?: AbortSignal) =>
  api.post<{ data: ShortfallDetail[] }>('/api/availability/check', body, { signal });

export const availabilityCheckQueryOptions = (body: AvailabilityCheck) =>
  queryOptions({
    queryKey: ['items', 'availability', 'check', body] as const,
    queryFn: ({ signal }) => checkAvailability(body, signal),
    placeholderData: keepPreviousData,
    staleTime: 10_000,
  });

export const useAvailabilityCheck = (body: AvailabilityCheck | null) =>
  useQuery({ ...availabilityCheckQueryOptions(body ?? { from: '', to: '', lines: [] }), enabled: body !== null && body.lines.length > 0 });
