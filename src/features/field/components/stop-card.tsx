import { Link } from 'react-router';
import type { FieldStop } from '@shared/schemas/field';
import { Badge } from '@/components/ui/badge';
import { paths } from '@/config/paths';
import { ANCHORING_LABELS, SEATING_WORDS, SURFACE_LABELS, stopState, timeWindow } from './labels';
import { MapLink } from './map-link';

/**
 * One delivery or pickup on the day sheet, readable on a phone and on paper. Its heading is an h3
 * under the day sheet's h2 groups, and an h2 on the stop's own page (`headingLevel`).
 */
export function StopCard({ stop, timeZone, showOpen = true, headingLevel = 3 }: { stop: FieldStop; timeZone: string; showOpen?: boolean; headingLevel?: 2 | 3 }) {
  const Heading = headingLevel === 2 ? 'h2' : 'h3';
  const state = stopState(stop);
  const kind = stop.stop === 'delivery' ? 'Delivery' : 'Pickup';
  const items = stop.items.filter((i) => i.quantity > 0);
  return (
    <article aria-labelledby={`stop-${stop.bookingId}-${stop.stop}`} className="rounded-lg border border-canvas-200 bg-white p-4 shadow-sm print:break-inside-avoid print:shadow-none">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div>
          <p className="text-sm font-semibold text-canvas-700">{timeWindow(stop.windowStart, stop.windowEnd, timeZone)}</p>
          <Heading id={`stop-${stop.bookingId}-${stop.stop}`} className="text-lg font-semibold text-canvas-900">
            {kind} {stop.reference}: {stop.customer.name}
          </Heading>
        </div>
        <div className="flex flex-wrap gap-1">
          {stop.mine ? <Badge tone="positive">Your stop</Badge> : null}
          <Badge tone={state.tone}>{state.label}</Badge>
        </div>
      </div>
      <MapLink site={stop.site} className="mt-2" />
      <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
        {stop.customer.phone ? (
          <>
            <dt className="font-semibold text-canvas-700">Phone</dt>
            <dd>
              <a className="text-pine-700 underline" href={`tel:${stop.customer.phone.replace(/[^\d+]/g, '')}`}>
                {stop.customer.phone}
              </a>
            </dd>
          </>
        ) : null}
        <dt className="font-semibold text-canvas-700">Ground</dt>
        <dd>
          {SURFACE_LABELS[stop.site.surface]}, {ANCHORING_LABELS[stop.site.anchoring].toLowerCase()}
        </dd>
        {stop.guestCount ? (
          <>
            <dt className="font-semibold text-canvas-700">Guests</dt>
            <dd>
              {stop.guestCount} {SEATING_WORDS[stop.seating]}
              {stop.afterDark ? ', after dark' : ''}
            </dd>
          </>
        ) : null}
        <dt className="font-semibold text-canvas-700">Crew</dt>
        <dd>{stop.crew.length ? stop.crew.map((c) => c.name).join(', ') : 'Not assigned yet'}</dd>
        {stop.site.notes ? (
          <>
            <dt className="font-semibold text-canvas-700">Site notes</dt>
            <dd className="whitespace-pre-line">{stop.site.notes}</dd>
          </>
        ) : null}
      </dl>
      {items.length ? (
        <ul className="mt-3 divide-y divide-canvas-100 border-t border-canvas-100 text-sm" aria-label={`Items for ${stop.reference}`}>
          {items.map((i) => (
            <li key={`${i.itemId ?? i.name}`} className="flex justify-between gap-3 py-1">
              <span>{i.name}</span>
              <span className="font-semibold tabular-nums">{i.quantity}</span>
            </li>
          ))}
        </ul>
      ) : (
        <p className="mt-3 text-sm text-canvas-600">No stock on this booking.</p>
      )}
      {showOpen ? (
        <p className="mt-3 print:hidden">
          <Link
            to={paths.app.fieldBooking.getHref(stop.bookingId)}
            className="inline-flex min-h-10 items-center rounded-md bg-pine-700 px-4 font-semibold text-white hover:bg-pine-800"
            aria-label={`Open ${kind.toLowerCase()} ${stop.reference}`}
          >
            Open {kind.toLowerCase()}
          </Link>
        </p>
      ) : null}
    </article>
  );
}
