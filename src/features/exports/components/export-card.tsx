import { EXPORT_FORMATS, EXPORT_LABELS, isRangeExport, type ExportKind } from '@shared/schemas/exports';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SectionCard } from '@/components/ui/card';
import { formatBytes } from '@/lib/format';
import { errorMessage } from '@/lib/api';
import { useExportDownload, type DownloadProgress } from '../api/download-export';
import type { DateRange } from './date-ranges';

const numberFormat = new Intl.NumberFormat('en-US');

function progressText(p: DownloadProgress) {
  if (p.unit === 'rows') return `${numberFormat.format(p.done)} of ${numberFormat.format(p.total ?? 0)} rows (${formatBytes(p.bytes)})`;
  if (p.total) return `${formatBytes(p.done)} of about ${formatBytes(p.total)}`;
  return `${formatBytes(p.bytes)} so far`;
}

/** Share done, 0-100, while the total is known; null for a bar that cannot know (the UBL ZIP). */
function percent(p: DownloadProgress): number | null {
  if (!p.total) return p.unit === 'rows' ? 100 : null;
  return Math.min(100, Math.floor((p.done / p.total) * 100));
}

interface ExportCardProps {
  kind: ExportKind;
  /** The range to export; null while the dates above are not valid. */
  range: DateRange | null;
  onInvalidRange: () => void;
}

/** One export: what it holds, a Download button, the progress while it streams, and a way to stop it. */
export function ExportCard({ kind, range, onInvalidRange }: ExportCardProps) {
  const { state, start, cancel } = useExportDownload(kind);
  const label = EXPORT_LABELS[kind];
  const running = state.status === 'counting' || state.status === 'downloading';
  const headingId = `export-${kind}`;
  const pct = state.status === 'downloading' ? percent(state.progress) : state.status === 'counting' ? 0 : null;

  return (
    <section aria-labelledby={headingId} data-testid={`export-${kind}`}>
      <SectionCard
        title={<span id={headingId}>{label.title}</span>}
        description={label.description}
        className="h-full"
        actions={<span className="rounded bg-canvas-100 px-2 py-0.5 text-xs font-semibold uppercase text-canvas-700">{EXPORT_FORMATS[kind]}</span>}
      >
        <div className="flex flex-wrap items-center gap-3">
          <Button
            onClick={() => (range ? void start(range.from, range.to) : onInvalidRange())}
            disabled={running}
            isLoading={running}
            aria-describedby={`${headingId}-status`}
          >
            Download
          </Button>
          {running ? (
            <Button variant="secondary" onClick={cancel}>
              Cancel
            </Button>
          ) : null}
          {range && !isRangeExport(kind) ? <span className="text-sm text-canvas-600">At the end of {range.to}</span> : null}
        </div>

        {running ? (
          <div className="mt-4">
            <div
              role="progressbar"
              aria-label={`${label.title} download`}
              aria-valuemin={0}
              aria-valuemax={100}
              aria-valuenow={pct ?? undefined}
              aria-valuetext={state.status === 'downloading' ? progressText(state.progress) : 'Counting what to send'}
              className="h-2 w-full overflow-hidden rounded-full bg-canvas-200"
            >
              <div className={pct === null ? 'h-full w-1/3 animate-pulse rounded-full bg-pine-600' : 'h-full rounded-full bg-pine-600 transition-[width]'} style={pct === null ? undefined : { width: `${pct}%` }} />
            </div>
          </div>
        ) : null}

        <div id={`${headingId}-status`} aria-live="polite" className="mt-3 min-h-5 text-sm text-canvas-700">
          {state.status === 'counting' ? 'Counting what to send…' : null}
          {state.status === 'downloading' ? progressText(state.progress) : null}
          {state.status === 'saved' ? (
            <span>
              Saved <span className="font-semibold">{state.file.filename}</span> ({formatBytes(state.file.bytes)}, {numberFormat.format(state.file.rows)}{' '}
              {EXPORT_FORMATS[kind] === 'csv' ? (state.file.rows === 1 ? 'row' : 'rows') : state.file.rows === 1 ? 'file' : 'files'}).
            </span>
          ) : null}
          {state.status === 'cancelled' ? 'Cancelled: nothing was saved.' : null}
        </div>
        {state.status === 'failed' ? (
          <Alert tone="danger" title="The file could not be made." className="mt-2">
            {errorMessage(state.error)}
          </Alert>
        ) : null}
      </SectionCard>
    </section>
  );
}
