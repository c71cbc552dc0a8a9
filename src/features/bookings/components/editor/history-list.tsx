import { BOOKING_STATUS_LABELS, type BookingStatus } from '@shared/schemas/bookings';
import { Alert } from '@/components/ui/alert';
import { Spinner } from '@/components/ui/spinner';
import { errorMessage } from '@/lib/api';
import { formatZoned } from '@/lib/zoned-time';
import { useBookingHistory, type BookingHistoryEntry } from '../../api/get-booking-history';

const label = (s: unknown) => BOOKING_STATUS_LABELS[s as BookingStatus] ?? String(s);

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
    default:
      return entry.action.replace(/^booking\./, '').replaceAll('_', ' ');
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
