import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { EntriesTrace, TracedEntries } from '@shared/schemas/reports';
import { api } from '@/lib/api';
import { reportsBaseKey } from './keys';

/** A figure's trace as the query of GET /api/reports/entries. */
export function traceQuery(trace: EntriesTrace, page = 1) {
  return {
    accountIds: trace.accountIds.join(','),
    from: trace.from,
    to: trace.to,
    bookingId: trace.bookingId,
    customerId: trace.customerId,
    taxRateBp: trace.taxRateBp,
    page,
    pageSize: 50,
  };
}

/** The journal entries behind a figure, oldest first, a page at a time, with what they add up to. */
export const getEntries = (trace: EntriesTrace, page: number, signal?: AbortSignal) =>
  api.get<TracedEntries>('/api/reports/entries', { query: traceQuery(trace, page), signal });

export const entriesQueryOptions = (trace: EntriesTrace, page = 1) =>
  queryOptions({
    queryKey: [...reportsBaseKey, 'entries', trace, page] as const,
    queryFn: ({ signal }) => getEntries(trace, page, signal),
    placeholderData: keepPreviousData,
  });

export const useEntries = (trace: EntriesTrace | null, page = 1) =>
  useQuery({ ...entriesQueryOptions(trace ?? { accountIds: [] }, page), enabled: trace !== null });
