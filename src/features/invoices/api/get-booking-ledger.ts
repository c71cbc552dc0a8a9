import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BookingLedger } from '@shared/schemas/invoices';
import { api } from '@/lib/api';

/** The booking's journal entries and the balances summed from them. */
export const getBookingLedger = (bookingId: string, signal?: AbortSignal) =>
  api.get<BookingLedger>(`/api/bookings/${encodeURIComponent(bookingId)}/ledger`, { signal });

export const bookingLedgerQueryOptions = (bookingId: string) =>
  queryOptions({
    queryKey: ['invoices', 'ledger', bookingId] as const,
    queryFn: ({ signal }) => getBookingLedger(bookingId, signal),
  });

export const useBookingLedger = (bookingId: string) => useQuery(bookingLedgerQueryOptions(bookingId));
