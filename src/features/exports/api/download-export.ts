import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useRef, useState } from 'react';
import { EXPORT_FORMATS, exportFilename, exportUrl, type ExportKind } from '@shared/schemas/exports';
import type { ApiErrorBody } from '@shared/schemas/errors';
import { api, ApiError } from '@/lib/api';
import { exportCountQueryOptions } from './get-export-count';
import { exportsBaseKey } from './get-export-history';

export interface DownloadProgress {
  /** CSV data rows (or bytes for the PDF ZIP) read so far, and the total expected; total null when unknown ahead. */
  done: number;
  total: number | null;
  unit: 'rows' | 'bytes';
  bytes: number;
}

export interface SavedFile {
  filename: string;
  bytes: number;
  /** Data rows (CSV) or files (ZIP) the server counted before sending. */
  rows: number;
}

const LF = 0x0a;

/** Turns a failed download's JSON error (or none) into the app's ApiError. */
async function downloadError(response: Response): Promise<ApiError> {
  let body: Partial<ApiErrorBody> | null = null;
  try {
    body = (await response.json()) as Partial<ApiErrorBody>;
  } catch {
    body = null;
  }
  const e = body?.error;
  if (e && typeof e.message === 'string') return new ApiError(response.status, e.code ?? 'error', e.message, e.fields ?? {}, body);
  return new ApiError(response.status, 'server', 'The server could not make that file. Try again in a moment.');
}

/** "paid-invoices_2026-01-01_2026-01-31.csv" from `attachment; filename="…"`, or our own name for it. */
function filenameOf(response: Response, fallback: string) {
  const m = /filename="([^"]+)"/.exec(response.headers.get('Content-Disposition') ?? '');
  return m ? m[1] : fallback;
}

/**
 * Downloads one export as a stream: counts what to expect, reads the response body chunk by
 * chunk (fetch + ReadableStream) reporting rows or bytes as they arrive, then hands the file to
 * the browser to save (a Blob, an object URL and a download link). `signal` cancels at any point;
 * the hook then tells the server, so the history says cancelled even if every byte had been sent.
 */
export async function downloadExport(
  opts: {
    kind: ExportKind; from: string; to: string; signal: AbortSignal;
    count: () => Promise<{ rows: number; bytes: number | null }>;
    onProgress: (p: DownloadProgress) => void;
    /** The server's history row for this download (the X-Export-Run header), once the answer begins. */
    onRun?: (runId: string) => void;
  },
): Promise<SavedFile> {
  const { kind, from, to, signal } = opts;
  const expected = await opts.count();
  const csv = EXPORT_FORMATS[kind] === 'csv';
  const unit = csv ? 'rows' : 'bytes';
  const total = csv ? expected.rows : expected.bytes;
  let response: Response;
  try {
    response = await fetch(exportUrl(kind, from, to), { credentials: 'same-origin', signal });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(0, 'network', 'Could not reach Guyline. Check your connection and try again.');
  }
  if (!response.ok || !response.body) throw await downloadError(response);
  const runId = response.headers.get('X-Export-Run');
  if (runId) opts.onRun?.(runId);

  const reader = response.body.getReader();
  const chunks: Uint8Array[] = [];
  let bytes = 0;
  let lines = 0;
  opts.onProgress({ done: 0, total, unit, bytes: 0 });
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      chunks.push(value);
      bytes += value.length;
      // A CSV record ends in CRLF: counting line feeds counts rows (the header is the first).
      if (csv) for (let i = 0; i < value.length; i++) if (value[i] === LF) lines++;
      opts.onProgress({ done: csv ? Math.max(0, lines - 1) : bytes, total, unit, bytes });
    }
  } catch (cause) {
    if (signal.aborted) throw new DOMException('The download was cancelled.', 'AbortError');
    throw new ApiError(0, 'network', 'The download broke off before the end. Try again; the history below shows what was sent.', {}, cause);
  }
  const filename = filenameOf(response, exportFilename(kind, from, to));
  const blob = new Blob(chunks as BlobPart[], { type: response.headers.get('Content-Type') ?? 'application/octet-stream' });
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = filename;
  link.rel = 'noopener';
  document.body.appendChild(link);
  link.click();
  link.remove();
  // The browser has taken the file once the click's task is done.
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
  return { filename, bytes, rows: expected.rows };
}

export type DownloadState =
  | { status: 'idle' }
  | { status: 'counting' }
  | { status: 'downloading'; progress: DownloadProgress }
  | { status: 'saved'; file: SavedFile }
  | { status: 'cancelled' }
  | { status: 'failed'; error: ApiError };

/** Marks a started download as cancelled in the history; a failure here only leaves the history as the server saw it. */
const reportCancelled = (runId: string) => api.post<void>(`/api/exports/history/${encodeURIComponent(runId)}/cancel`).catch(() => undefined);

/** One export card's download: start, progress, cancel; the history refreshes when it ends. */
export function useExportDownload(kind: ExportKind) {
  const queryClient = useQueryClient();
  const [state, setState] = useState<DownloadState>({ status: 'idle' });
  const controller = useRef<AbortController | null>(null);

  // Leaving the page stops a download in progress.
  useEffect(() => () => controller.current?.abort(), []);

  const start = useCallback(
    async (from: string, to: string) => {
      controller.current?.abort();
      const mine = new AbortController();
      controller.current = mine;
      setState({ status: 'counting' });
      let runId: string | null = null;
      try {
        const file = await downloadExport({
          kind, from, to, signal: mine.signal,
          count: () => queryClient.fetchQuery(exportCountQueryOptions(kind, from, to)),
          onProgress: (progress) => {
            if (!mine.signal.aborted) setState({ status: 'downloading', progress });
          },
          onRun: (id) => {
            runId = id;
          },
        });
        if (!mine.signal.aborted) setState({ status: 'saved', file });
      } catch (error) {
        if (mine.signal.aborted || (error instanceof DOMException && error.name === 'AbortError')) {
          setState({ status: 'cancelled' });
          if (runId) await reportCancelled(runId);
        } else setState({ status: 'failed', error: error instanceof ApiError ? error : new ApiError(0, 'error', 'The download did not work. Try again in a moment.') });
      } finally {
        if (controller.current === mine) controller.current = null;
        void queryClient.invalidateQueries({ queryKey: exportsBaseKey });
      }
    },
    [kind, queryClient],
  );

  const cancel = useCallback(() => controller.current?.abort(), []);
  return { state, start, cancel };
}
