import { Link } from 'react-router';
import { BOOKING_STATUSES, BOOKING_STATUS_LABELS, type BookingListRow } from '@shared/schemas/bookings';
import { MonthGrid } from '@/components/ui/month-grid';
import { paths } from '@/config/paths';
import { cn } from '@/lib/cn';
import { addCalendarDays, monthLabel, zonedDate } from '@/lib/zoned-time';
import { STATUS_STYLES } from './status';

/** Each booking on every day its event touches, on the company's calendar. */
function byDay(bookings: readonly BookingListRow[], timeZone: string): Map<string, BookingListRow[]> {
  const days = new Map<string, BookingListRow[]>();
  for (const b of bookings) {
    const first = zonedDate(b.eventStart, timeZone);
    const last = zonedDate(b.eventEnd, timeZone);
    // A runaway range (bad data) must not freeze the page: at most 62 days are placed.
    for (let d = first, n = 0; d <= last && n < 62; d = addCalendarDays(d, 1), n += 1) {
      const list = days.get(d) ?? [];
      list.push(b);
      days.set(d, list);
    }
  }
  for (const list of days.values()) list.sort((a, b) => a.eventStart.localeCompare(b.eventStart));
  return days;
}

export function StatusLegend() {
  return (
    <ul aria-label="Legend" className="flex flex-wrap gap-2 text-sm">
      {BOOKING_STATUSES.map((s) => (
        <li key={s} className={cn('rounded-full px-2 py-0.5 text-xs font-semibold ring-1 ring-inset', STATUS_STYLES[s])}>
          {BOOKING_STATUS_LABELS[s]}
        </li>
      ))}
    </ul>
  );
}

export function BookingsCalendar({ bookings, month, timeZone }: { bookings: readonly BookingListRow[]; month: string; timeZone: string }) {
  const days = byDay(bookings, timeZone);
  return (
    <MonthGrid
      month={month}
      today={zonedDate(Date.now(), timeZone)}
      caption={`Bookings in ${monthLabel(month)}, by event day`}
      renderDay={(date) => {
        const list = days.get(date);
        if (!list?.length) return null;
        return (
          <ul className="space-y-1">
            {list.map((b) => (
              <li key={b.id}>
                <Link
                  to={paths.app.booking.getHref(b.id)}
                  className={cn('block truncate rounded px-1.5 py-0.5 text-xs font-semibold ring-1 ring-inset hover:underline', STATUS_STYLES[b.status])}
                  title={`${b.reference} · ${b.customer.name} · ${BOOKING_STATUS_LABELS[b.status]}`}
                >
                  {b.reference} {b.customer.name}
                  <span className="sr-only">, {BOOKING_STATUS_LABELS[b.status]}</span>
                </Link>
              </li>
            ))}
          </ul>
        );
      }}
    />
  );
}
