import { Link } from 'react-router';
import type { PortalBookingSummary, PortalCompany } from '@shared/schemas/portal';
import { Badge } from '@/components/ui/badge';
import { paths } from '@/config/paths';
import { bookingStatusWords, browserZone, formatDays, money } from './labels';

/**
 * The summary carries no time zone of its own (only the booking does); when the server adds one
 * it is used, otherwise the customer's own clock, which matches the company's for nearly everyone.
 */
const zoneOf = (b: PortalBookingSummary) => (b as PortalBookingSummary & { timeZone?: string }).timeZone ?? browserZone();

interface CompanyGroup {
  company: PortalCompany;
  upcoming: PortalBookingSummary[];
  earlier: PortalBookingSummary[];
}

/** By company (in the order their first booking comes), coming-up soonest first, then earlier ones latest first. */
export function groupByCompany(bookings: PortalBookingSummary[], now = Date.now()): CompanyGroup[] {
  const groups = new Map<string, CompanyGroup>();
  const sorted = [...bookings].sort((a, b) => Date.parse(a.eventStart) - Date.parse(b.eventStart));
  for (const b of sorted) {
    let group = groups.get(b.company.id);
    if (!group) {
      group = { company: b.company, upcoming: [], earlier: [] };
      groups.set(b.company.id, group);
    }
    if (Date.parse(b.eventEnd) >= now && b.status !== 'cancelled') group.upcoming.push(b);
    else group.earlier.unshift(b);
  }
  return [...groups.values()];
}

function BookingCard({ booking }: { booking: PortalBookingSummary }) {
  const status = bookingStatusWords(booking.status);
  return (
    <li>
      <Link
        to={paths.portal.booking.getHref(booking.id)}
        className="block rounded-lg border border-canvas-200 bg-white p-4 shadow-sm transition-colors hover:border-pine-400 hover:bg-pine-50/40 sm:p-5"
      >
        <div className="flex flex-wrap items-start justify-between gap-2">
          <div className="min-w-0">
            <p className="font-semibold text-canvas-900">{formatDays(booking.eventStart, booking.eventEnd, zoneOf(booking))}</p>
            <p className="mt-0.5 text-sm break-words text-canvas-700">{booking.siteAddress || 'Address to be confirmed'}</p>
          </div>
          <span className="flex flex-wrap gap-1">
            {booking.needsAction ? <Badge tone="caution">Needs your attention</Badge> : null}
            <Badge tone={status.tone}>{status.label}</Badge>
          </span>
        </div>
        <div className="mt-3 flex flex-wrap items-end justify-between gap-2 text-sm">
          <span className="text-canvas-600">Booking {booking.reference}</span>
          <span className={booking.balanceCents > 0 ? 'font-semibold text-canvas-900' : 'text-canvas-700'}>
            {booking.balanceCents > 0 ? `Balance ${money(booking.balanceCents, booking.currency)}` : 'Nothing to pay'}
          </span>
        </div>
        <span className="sr-only">Open booking {booking.reference}</span>
      </Link>
    </li>
  );
}

function BookingList({ bookings }: { bookings: PortalBookingSummary[] }) {
  return <ul className="space-y-3">{bookings.map((b) => <BookingCard key={b.id} booking={b} />)}</ul>;
}

/** Every booking, under the company it is with; with one company the company's name is already in the header. */
export function RentalsList({ bookings }: { bookings: PortalBookingSummary[] }) {
  const groups = groupByCompany(bookings);
  const several = groups.length > 1;
  return (
    <div className="space-y-8">
      {groups.map((g) => {
        const Sub = several ? 'h3' : 'h2';
        return (
          <section key={g.company.id} aria-label={several ? undefined : `Your rentals with ${g.company.name}`} aria-labelledby={several ? `company-${g.company.id}` : undefined}>
            {several ? (
              <h2 id={`company-${g.company.id}`} className="mb-3 text-xl font-semibold text-canvas-900">
                With {g.company.name}
              </h2>
            ) : null}
            {g.upcoming.length > 0 ? (
              <>
                <Sub className="mb-2 text-sm font-semibold tracking-wide text-canvas-700 uppercase">Coming up</Sub>
                <BookingList bookings={g.upcoming} />
              </>
            ) : null}
            {g.earlier.length > 0 ? (
              <>
                <Sub className={`mb-2 text-sm font-semibold tracking-wide text-canvas-700 uppercase ${g.upcoming.length > 0 ? 'mt-6' : ''}`}>Earlier</Sub>
                <BookingList bookings={g.earlier} />
              </>
            ) : null}
          </section>
        );
      })}
    </div>
  );
}
