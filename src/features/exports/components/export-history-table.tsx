import { EXPORT_LABELS, EXPORT_STATUS_LABELS, type ExportRunRow, type ExportStatus } from '@shared/schemas/exports';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { formatBytes } from '@/lib/format';
import { formatZoned } from '@/lib/zoned-time';

const STATUS_TONES: Record<ExportStatus, BadgeTone> = { running: 'caution', ok: 'positive', failed: 'negative', aborted: 'neutral' };
const numberFormat = new Intl.NumberFormat('en-US');

/** The company's exports, newest first: when, which, for what dates, by whom, how much, how it ended. */
export function ExportHistoryTable({ runs, timeZone }: { runs: readonly ExportRunRow[]; timeZone: string }) {
  return (
    <Table caption="Export history">
      <THead>
        <Tr>
          <Th>Started</Th>
          <Th>Export</Th>
          <Th>Dates</Th>
          <Th>By</Th>
          <Th className="text-right">Rows or files</Th>
          <Th className="text-right">Size</Th>
          <Th>Status</Th>
        </Tr>
      </THead>
      <TBody>
        {runs.map((r) => (
          <Tr key={r.id}>
            <Td className="whitespace-nowrap">{formatZoned(r.startedAt, timeZone)}</Td>
            <Th scope="row" className="py-3 font-normal">
              <span className="font-semibold">{EXPORT_LABELS[r.kind]?.title ?? r.kind}</span>
              <span className="block text-xs text-canvas-600">{r.filename}</span>
            </Th>
            <Td className="whitespace-nowrap">{r.from ? `${r.from} to ${r.to}` : `at ${r.to}`}</Td>
            <Td>{r.by ?? '—'}</Td>
            <Td className="text-right tabular-nums">{numberFormat.format(r.rows)}</Td>
            <Td className="text-right whitespace-nowrap tabular-nums">{formatBytes(r.bytes)}</Td>
            <Td>
              <Badge tone={STATUS_TONES[r.status]}>{EXPORT_STATUS_LABELS[r.status]}</Badge>
            </Td>
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}
