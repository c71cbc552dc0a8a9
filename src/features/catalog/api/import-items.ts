import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ImportReport } from '@shared/schemas/items';
import { isApiError, uploadFile } from '@/lib/api';
import { itemsBaseKey } from './get-items';

export const IMPORT_MAX_BYTES = 1024 * 1024;

/** POST /api/items/import: a dry run checks the file and saves nothing. */
export const importItems = ({ file, dryRun }: { file: File; dryRun: boolean }) =>
  uploadFile<ImportReport>('POST', '/api/items/import', file, { query: { dryRun } });

/** A 422 "import_rejected" carries the row-by-row report: nothing was saved. */
export function rejectedReport(error: unknown): ImportReport | null {
  if (!isApiError(error, 'import_rejected')) return null;
  const report = (error.body as { report?: ImportReport } | null)?.report;
  return report ?? null;
}

export function useImportItems() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: importItems,
    onSuccess: (report) => {
      if (!report.dryRun) void queryClient.invalidateQueries({ queryKey: itemsBaseKey });
    },
  });
}
