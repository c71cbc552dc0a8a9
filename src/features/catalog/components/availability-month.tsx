import { Link } from 'react-router';
import { BOOKING_STATUS_LABELS, type BookingStatus } from '@shared/schemas/bookings';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { MonthGrid } from '@/components/ui/month-grid';
import { Spinner } from '@/components/ui/spinner';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { formatZoned, monthLabel, monthRange, shiftMonth, zonedDate } from '@/lib/zoned-time';
import { useItemAvailability } from '../api/get-item-availability';

type Tightness = 'none' | 'tight' | 'free';

/** Out of stock; a quarter or less left; plenty. */
function tightness(free: number, owned: number): Tightness {
  if (free <= 0) return 'none';
  if (free * 4 <= owned) return 'tight';
  return 'free';
}

const TIGHTNESS: Record<Tightness, { cell: string; swatch: string; label: string }> = {
  free: { cell: 'bg-pine-50', swatch: 'bg-pine-50 border-pine-300', label: 'Plenty free' },
  tight: { cell: 'bg-ochre-50', swatch: 'bg-ochre-50 border-ochre-200', label: 'A quarter or less free' },
  none: { cell: 'bg-rust-50', swatch: 'bg-rust-50 border-rust-200', label: 'None free' },
};

export function AvailabilityMonth({
  itemId,
  month,
  timeZone,
  onMonthChange,
}: {
  itemId: string;
  month: string;
  timeZone: string;
  onMonthChange: (month: string) => void;
}) {
  const range = monthRange(month, timeZone);
  const availability = useItemAvailability(itemId, range);
  const days = new Map((availability.data?.days ?? []).map((d) => [d.date, d]));
  const owned = availability.data?.quantityOwned ?? 0;
  const today = zonedDate(Date.now(), timeZone);

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h3 className="text-base font-semibold text-canvas-900" aria-live="polite">
          {monthLabel(month)}
          {availability.isFetching ? <Spinner className="ml-2 text-canvas-600" label="Loading…" /> : null}
        </h3>
        <div className="flex gap-2">
          <Button size="sm" variant="secondary" onClick={() => onMonthChange(shiftMonth(month, -1))}>
            Previous month
          </Button>
          <Button size="sm" variant="secondary" onClick={() => onMonthChange(shiftMonth(month, 1))}>
            Next month
          </Button>
        </div>
      </div>

      {availability.isError ? (
        <Alert tone="danger" title="Availability could not be loaded.">
          {errorMessage(availability.error)}
        </Alert>
      ) : null}

      <ul aria-label="Legend" className="flex flex-wrap gap-4 text-sm text-canvas-800">
        {(['free', 'tight', 'none'] as const).map((t) => (
          <li key={t} className="flex items-center gap-2">
            <span aria-hidden="true" className={`inline-block size-4 rounded border ${TIGHTNESS[t].swatch}`} />
            {TIGHTNESS[t].label}
          </li>
        ))}
        <li className="text-canvas-600">Each day shows free / owned.</li>
      </ul>

      <MonthGrid
        month={month}
        today={today}
        caption={`Availability in ${monthLabel(month)}: free of ${owned} owned, by day`}
        dayClassName={(date) => {
          const day = days.get(date);
          return day ? TIGHTNESS[tightness(day.free, owned)].cell : undefined;
        }}
        renderDay={(date) => {
          const day = days.get(date);
          if (!day) return null;
          const t = tightness(day.free, owned);
          return (
            <p className="text-sm tabular-nums">
              <span className={t === 'none' ? 'font-bold text-rust-800' : t === 'tight' ? 'font-bold text-ochre-800' : 'font-semibold text-pine-800'}>{day.free}</span>
              <span className="text-canvas-600">/{owned}</span>
              <span className="sr-only"> free. {TIGHTNESS[t].label}.</span>
              {day.reserved > 0 ? <span className="block text-xs text-canvas-700">{day.reserved} out</span> : null}
            </p>
          );
        }}
      />

      <section aria-labelledby="holds-heading">
        <h3 id="holds-heading" className="mb-2 text-base font-semibold text-canvas-900">
          Bookings holding this item in {monthLabel(month)}
        </h3>
        {availability.data && availability.data.holds.length === 0 ? (
          <p className="text-sm text-canvas-700">No booking holds this item this month.</p>
        ) : availability.data ? (
          <Table caption={`Bookings holding this item in ${monthLabel(month)}`}>
            <THead>
              <Tr>
                <Th>Booking</Th>
                <Th>Status</Th>
                <Th className="text-right">Quantity</Th>
                <Th>Held from</Th>
                <Th>Until</Th>
              </Tr>
            </THead>
            <TBody>
              {availability.data.holds.map((hold) => (
                <Tr key={`${hold.bookingId}-${hold.start}`}>
                  <Th scope="row" className="py-3">
                    <Link className={linkClasses} to={paths.app.booking.getHref(hold.bookingId)}>
                      {hold.reference}
                    </Link>
                  </Th>
                  <Td>{BOOKING_STATUS_LABELS[hold.status as BookingStatus] ?? hold.status}</Td>
                  <Td className="text-right tabular-nums">{hold.quantity}</Td>
                  <Td className="whitespace-nowrap">{formatZoned(hold.start, timeZone)}</Td>
                  <Td className="whitespace-nowrap">{formatZoned(hold.end, timeZone)}</Td>
                </Tr>
              ))}
            </TBody>
          </Table>
        ) : null}
      </section>
    </div>
  );
}
