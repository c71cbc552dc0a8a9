import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BookingDocumentList, DocumentRow } from '@shared/schemas/documents';
import { api } from '@/lib/api';

/** Every document of a booking, every kind and version, newest first, and where its agreement stands. */
export const getBookingDocuments = (bookingId: string, signal?: AbortSignal) =>
  api.get<BookingDocumentList>(`/api/bookings/${encodeURIComponent(bookingId)}/documents`, { signal });

export const documentsBaseKey = ['documents'] as const;

/** How often to ask again while an e-mail is still queued, so it turns sent or failed on screen. */
export const SEND_POLL_MS = 2000;

export const hasQueuedSend = (documents: readonly DocumentRow[] | undefined) =>
  Boolean(documents?.some((d) => d.sends.some((s) => s.status === 'queued')));

export const bookingDocumentsQueryOptions = (bookingId: string) =>
  queryOptions({
    queryKey: ['documents', 'booking', bookingId] as const,
    queryFn: ({ signal }) => getBookingDocuments(bookingId, signal),
    refetchInterval: (query) => (hasQueuedSend(query.state.data?.data) ? SEND_POLL_MS : false),
  });

export const useBookingDocuments = (bookingId: string, options: { enabled?: boolean } = {}) =>
  useQuery({ ...bookingDocumentsQueryOptions(bookingId), ...options });
