import { BOOKING_STATUS_LABELS, type BookingStatus } from '@shared/schemas/bookings';
import { DOCUMENT_KIND_LABELS, type DocumentKind } from '@shared/schemas/documents';
import { Alert } from '@/components/ui/alert';
import { Spinner } from '@/components/ui/spinner';
import { errorMessage } from '@/lib/api';
import { formatZoned } from '@/lib/zoned-time';
import { useBookingHistory, type BookingHistoryEntry } from '../../api/get-booking-history';

const label = (s: unknown) => BOOKING_STATUS_LABELS[s as BookingStatus] ?? String(s);

/** "Rental agreement RA-0007 (version 2)", from whatever of kind, number and version the entry holds. */
function documentOf(d: Record<string, unknown>): string {
  const kind = DOCUMENT_KIND_LABELS[d.kind as DocumentKind] ?? 'Document';
  const number = typeof d.number === 'string' && d.number ? ` ${d.number}` : '';
  const version = typeof d.version === 'number' ? ` (version ${d.version})` : '';
  return `${kind}${number}${version}`;
}

const to = (d: Record<string, unknown>) => (typeof d.to === 'string' && d.to ? ` to ${d.to}` : '');

function describe(entry: BookingHistoryEntry): string {
  const d = entry.data ?? {};
  switch (entry.action) {
    case 'booking.created':
      return 'Created the booking';
    case 'booking.updated':
      return 'Changed the booking';
    case 'booking.status_changed':
      return `Status: ${label(d.from)} → ${label(d.to)}`;
    case 'booking.shortfall':
      return 'Tried to reserve, but stock was short';
    case 'document.issued':
      return `Issued ${documentOf(d)}${typeof d.replaced === 'string' && d.replaced ? `, replacing ${d.replaced}` : ''}`;
    case 'document.send_queued':
      return `Queued ${documentOf(d)} for e-mail${to(d)}`;
    case 'document.sent':
      return `E-mailed ${documentOf(d)}${to(d)}`;
    case 'document.send_failed':
      return `Could not e-mail ${documentOf(d)}${to(d)}${typeof d.error === 'string' && d.error ? `: ${d.error}` : ''}`;
    case 'invoice.pay_links_revoked':
      return `Withdrew the pay links of invoice ${typeof d.number === 'string' ? d.number : ''}`.trimEnd();
    default:
      return entry.action.replace(/^(booking|document)\./, '').replaceAll('_', ' ');
  }
}

export function HistoryList({ bookingId, timeZone }: { bookingId: string; timeZone: string }) {
  const history = useBookingHistory(bookingId);
  if (history.isPending) return <Spinner className="text-canvas-600" label="Loading history…" />;
  if (history.isError) return <Alert tone="danger">{errorMessage(history.error)}</Alert>;
  if (history.data.data.length === 0) return <p className="text-sm text-canvas-700">Nothing yet.</p>;
  return (
    <ol className="space-y-3 text-sm">
      {history.data.data.map((e) => (
        <li key={e.id} className="border-l-2 border-canvas-300 pl-3">
          <p className="font-semibold text-canvas-900">{describe(e)}</p>
          {typeof e.data?.note === 'string' && e.data.note ? <p className="text-canvas-800">“{e.data.note}”</p> : null}
          <p className="text-canvas-600">
            {e.actorName ?? 'System'} · {formatZoned(e.at, timeZone)}
          </p>
        </li>
      ))}
    </ol>
  );
}
