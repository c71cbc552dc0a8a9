import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CalendarFeedCreated, CalendarFeedState } from '@shared/schemas/field';
import { api } from '@/lib/api';
import { fieldBaseKey } from './get-day-sheet';

export const getCalendarFeed = (signal?: AbortSignal) => api.get<CalendarFeedState>('/api/field/calendar-feed', { signal });
export const calendarFeedQueryOptions = () => queryOptions({ queryKey: [...fieldBaseKey, 'calendar-feed'] as const, queryFn: ({ signal }) => getCalendarFeed(signal) });
export const useCalendarFeed = () => useQuery(calendarFeedQueryOptions());

/** A new secret address (shown once); any older one stops working. */
export const createCalendarFeed = () => api.post<CalendarFeedCreated>('/api/field/calendar-feed');
export const revokeCalendarFeed = () => api.delete<CalendarFeedState>('/api/field/calendar-feed');

export function useCreateCalendarFeed() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createCalendarFeed,
    onSuccess: ({ url: _url, ...state }) => queryClient.setQueryData(calendarFeedQueryOptions().queryKey, state),
  });
}

export function useRevokeCalendarFeed() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: revokeCalendarFeed, onSuccess: (state) => queryClient.setQueryData(calendarFeedQueryOptions().queryKey, state) });
}
