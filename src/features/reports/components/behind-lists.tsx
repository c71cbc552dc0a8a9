import { Link } from 'react-router';
import { BOOKING_STATUS_LABELS, type BookingStatus } from '@shared/schemas/bookings';
import type { ShortfallRequest, StockBookingRow } from '@shared/schemas/reports';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Spinner } from '@/components/ui/spinner';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { formatCalendarDate, formatZoned } from '@/lib/zoned-time';
import { useStockItem } from '../api/get-stock-item';
import { moneyIn } from './report-format';

const statusText = (s: string) => BOOKING_STATUS_LABELS[s as BookingStatus] ?? s;

/** The bookings behind an item's days out and revenue over a period, fetched when opened. */
export function BookingsBehind({ itemId, from, to, currency }: { itemId: string; from: string; to: string; currency: string }) {
  const detail = useStockItem(itemId, { from, to });
  if (detail.isPending) return <Spinner label="Loading the bookings…" />;
  if (detail.isError) {
    return (
      <Alert tone="danger" title="The bookings could not be loaded.">
        {errorMessage(detail.error)}{' '}
        <Button variant="secondary" size="sm" onClick={() => void detail.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }
  return <BookingsTable bookings={detail.data.items[0]?.bookings ?? []} currency={currency} />;
}

/** Each booking with its days out, revenue and invoices, each a link to its page (and its money panel). */
function BookingsTable({ bookings, currency }: { bookings: StockBookingRow[]; currency: string }) {
  const money = moneyIn(currency);
  if (bookings.length === 0) return <p className="text-sm text-canvas-700">No booking took this item out or earned from it in the period.</p>;
  return (
    <>
      <Table caption="Bookings behind these figures">
        <THead>
          <Tr>
            <Th>Booking</Th>
            <Th>Out</Th>
            <Th className="text-right">Units</Th>
            <Th className="text-right">
              <abbr title="Units × days out inside the period" className="no-underline">
                Unit-days
              </abbr>
            </Th>
            <Th className="text-right">Rental revenue</Th>
          </Tr>
        </THead>
        <TBody>
          {bookings.map((b) => (
            <Tr key={b.bookingId}>
              <Th scope="row" className="py-3">
                <Link className={linkClasses} to={paths.app.booking.getHref(b.bookingId)}>
                  {b.reference}
                </Link>
                <span className="block text-xs font-normal text-canvas-700">{statusText(b.status)}</span>
              </Th>
              <Td className="whitespace-nowrap">
                {formatCalendarDate(b.deliveryDate)} – {formatCalendarDate(b.pickupDate)}
                <span className="block text-xs text-canvas-700">Event {formatCalendarDate(b.eventDate)}</span>
              </Td>
              <Td className="text-right tabular-nums">{b.quantity}</Td>
              <Td className="text-right tabular-nums">{b.daysOutInPeriod}</Td>
              <Td className="text-right tabular-nums">
                <span className="whitespace-nowrap">{money(b.revenueCents)}</span>
                {b.invoices.length ? (
                  <span className="flex flex-wrap justify-end gap-x-2 text-xs whitespace-nowrap">
                    {b.invoices.map((i) => (
                      <Link key={i.id} className={linkClasses} to={paths.app.invoice.getHref(i.id)}>
                        {i.number ?? 'Draft'}
                      </Link>
                    ))}
                  </span>
                ) : null}
              </Td>
            </Tr>
          ))}
        </TBody>
      </Table>
      <p className="mt-3 text-sm text-canvas-700">
        Rental revenue is the rental billed on each booking’s deposit and balance invoices, less credit notes, split over its rental lines by their amounts after
        discounts.
      </p>
    </>
  );
}

/** Each time the stock could not meet a request for the item. */
export function RequestsBehind({ requests, timeZone }: { requests: ShortfallRequest[]; timeZone: string }) {
  return (
    <Table caption="Requests the stock could not meet">
      <THead>
        <Tr>
          <Th>Wanted</Th>
          <Th>Booking</Th>
          <Th className="text-right">Asked</Th>
          <Th className="text-right">Free</Th>
          <Th className="text-right">Short</Th>
          <Th>Refused on</Th>
        </Tr>
      </THead>
      <TBody>
        {requests.map((r) => (
          <Tr key={r.id}>
            <Th scope="row" className="py-3 font-normal whitespace-nowrap">
              {formatZoned(r.windowStart, timeZone, false)} – {formatZoned(r.windowEnd, timeZone, false)}
            </Th>
            <Td>
              {r.booking ? (
                <>
                  <Link className={linkClasses} to={paths.app.booking.getHref(r.booking.id)}>
                    {r.booking.reference}
                  </Link>
                  <span className="block text-xs text-canvas-700">{r.booking.customerName}</span>
                </>
              ) : (
                'No booking recorded'
              )}
            </Td>
            <Td className="text-right tabular-nums">{r.requested}</Td>
            <Td className="text-right tabular-nums">{r.available}</Td>
            <Td className="text-right font-semibold tabular-nums">{r.shortfall}</Td>
            <Td className="whitespace-nowrap">{formatZoned(r.recordedAt, timeZone)}</Td>
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}
