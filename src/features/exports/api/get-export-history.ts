import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListResponse } from '@shared/schemas/common';
import type { ExportRunRow } from '@shared/schemas/exports';
import { api } from '@/lib/api';

/** Who exported what and when, newest first (bookkeeper and owner; others 403). */
export const getExportHistory = (page: number, pageSize: number, signal?: AbortSignal) =>
  api.get<ListResponse<ExportRunRow>>('/api/exports/history', { query: { page, pageSize }, signal });

/** Every export query sits under this key: a finished or cancelled download refreshes the history. */
export const exportsBaseKey = ['exports'] as const;

export const exportHistoryQueryOptions = (page: number, pageSize: number) =>
  queryOptions({
    queryKey: [...exportsBaseKey, 'history', { page, pageSize }] as const,
    queryFn: ({ signal }) => getExportHistory(page, pageSize, signal),
    placeholderData: keepPreviousData,
  });

export const useExportHistory = (page: number, pageSize: number) => useQuery(exportHistoryQueryOptions(page, pageSize));
