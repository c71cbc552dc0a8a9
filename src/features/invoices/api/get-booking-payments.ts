import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListResponse } from '@shared/schemas/common';
import type { PaymentRow } from '@shared/schemas/invoices';
import { api } from '@/lib/api';

/** Every payment received on a booking, with the invoices each one paid. */
export const getBookingPayments = (bookingId: string, signal?: AbortSignal) =>
  api.get<ListResponse<PaymentRow>>(`/api/bookings/${encodeURIComponent(bookingId)}/payments`, { signal });

export const bookingPaymentsQueryOptions = (bookingId: string) =>
  queryOptions({
    queryKey: ['invoices', 'payments', bookingId] as const,
    queryFn: ({ signal }) => getBookingPayments(bookingId, signal),
  });

export const useBookingPayments = (bookingId: string, options: { enabled?: boolean } = {}) => useQuery({ ...bookingPaymentsQueryOptions(bookingId), ...options });
