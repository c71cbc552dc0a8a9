import { queryOptions } from '@tanstack/react-query';
import { isRangeExport, type ExportCount, type ExportKind } from '@shared/schemas/exports';
import { api } from '@/lib/api';

/** What a download will hold (rows of a CSV, files of a ZIP, and the PDF ZIP's size), for its progress bar. */
export const getExportCount = (kind: ExportKind, from: string, to: string, signal?: AbortSignal) =>
  api.get<ExportCount>(`/api/exports/${kind}/count`, { query: isRangeExport(kind) ? { from, to } : { at: to }, signal });

// Never cached: each download counts the books as they are at that moment.
export const exportCountQueryOptions = (kind: ExportKind, from: string, to: string) =>
  queryOptions({
    queryKey: ['exports', 'count', kind, from, to] as const,
    queryFn: ({ signal }) => getExportCount(kind, from, to, signal),
    staleTime: 0,
    gcTime: 0,
  });
