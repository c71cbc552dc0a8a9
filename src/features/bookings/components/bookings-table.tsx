import { Link } from 'react-router';
import { formatMoney } from '@shared/money';
import type { BookingListRow } from '@shared/schemas/bookings';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { formatZoned } from '@/lib/zoned-time';
import { StatusBadge } from './status';

export function BookingsTable({ bookings, timeZone, caption = 'Bookings', hideCustomer = false }: { bookings: readonly BookingListRow[]; timeZone: string; caption?: string; hideCustomer?: boolean }) {
  // Crew get no totals: the column goes when no row carries prices.
  const showTotals = bookings.some((b) => b.totalCents !== null);
  return (
    <Table caption={caption}>
      <THead>
        <Tr>
          <Th>Booking</Th>
          {hideCustomer ? null : <Th>Customer</Th>}
          <Th>Event</Th>
          <Th>Site</Th>
          <Th className="text-right">Guests</Th>
          <Th>Status</Th>
          {showTotals ? <Th className="text-right">Total</Th> : null}
        </Tr>
      </THead>
      <TBody>
        {bookings.map((b) => (
          <Tr key={b.id}>
            <Th scope="row" className="py-3">
              <Link className={linkClasses} to={paths.app.booking.getHref(b.id)}>
                {b.reference}
              </Link>
            </Th>
            {hideCustomer ? null : <Td>{b.customer.name}</Td>}
            <Td className="whitespace-nowrap">
              {formatZoned(b.eventStart, timeZone)}
              <span className="block text-xs text-canvas-600">to {formatZoned(b.eventEnd, timeZone)}</span>
            </Td>
            <Td>{[b.siteLine1, b.siteCity].filter(Boolean).join(', ') || '—'}</Td>
            <Td className="text-right tabular-nums">{b.guestCount || '—'}</Td>
            <Td>
              <StatusBadge status={b.status} />
            </Td>
            {showTotals ? <Td className="text-right whitespace-nowrap tabular-nums">{b.totalCents !== null ? formatMoney(b.totalCents, b.currency) : '—'}</Td> : null}
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}
