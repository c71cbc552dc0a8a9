import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DaySheet } from '@shared/schemas/field';
import { api } from '@/lib/api';

export const fieldBaseKey = ['field'] as const;

/** A day's stops and load list; `today` is today on the company's calendar. */
export const getDaySheet = (date: string | 'today', signal?: AbortSignal) =>
  api.get<DaySheet>(date === 'today' ? '/api/field/today' : `/api/field/days/${encodeURIComponent(date)}`, { signal });

export const daySheetQueryOptions = (date: string | 'today') =>
  queryOptions({
    queryKey: [...fieldBaseKey, 'days', date] as const,
    queryFn: ({ signal }) => getDaySheet(date, signal),
  });

export const useDaySheet = (date: string | 'today') => useQuery(daySheetQueryOptions(date));

export const daySheetPdfUrl = (date: string) => `/api/field/days/${encodeURIComponent(date)}/pdf`;
