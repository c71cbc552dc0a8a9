import { Link } from 'react-router';
import type { DaySheet } from '@shared/schemas/field';
import { buttonClasses } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { paths } from '@/config/paths';
import { daySheetPdfUrl } from '../api/get-day-sheet';
import { shiftDate } from './labels';
import { StopCard } from './stop-card';

/** The day's stops: the viewer's own first, then the rest, each in time order. */
export function DaySheetView({ sheet }: { sheet: DaySheet }) {
  const mine = sheet.stops.filter((s) => s.mine);
  const others = sheet.stops.filter((s) => !s.mine);
  const outgoing = sheet.loadList.outgoing.groups.reduce((n, g) => n + g.total, 0);
  return (
    <div className="space-y-6">
      <nav aria-label="Days" className="flex flex-wrap items-center gap-2 print:hidden">
        <Link className={buttonClasses('secondary', 'sm')} to={paths.app.fieldDay.getHref(shiftDate(sheet.date, -1))}>
          Previous day
        </Link>
        <Link className={buttonClasses('secondary', 'sm')} to={paths.app.fieldDay.getHref(shiftDate(sheet.date, 1))}>
          Next day
        </Link>
        <Link className={buttonClasses('secondary', 'sm')} to={paths.app.fieldLoadList.getHref(sheet.date)}>
          Load list{outgoing ? ` (${outgoing} out)` : ''}
        </Link>
        <a className={buttonClasses('secondary', 'sm')} href={daySheetPdfUrl(sheet.date)} target="_blank" rel="noopener">
          Print (PDF)
        </a>
      </nav>

      <p className="rounded-md border border-ochre-200 bg-ochre-50 px-4 py-3 text-sm text-ochre-800">
        No stake goes in until the utility locate (811, or the local one-call center) is recorded on the stop’s site checklist, or the site is a hard surface held with
        ballast. The tent maker’s instructions, the fire code official and licensed practice come first.
      </p>

      {sheet.stops.length === 0 ? (
        <EmptyState title="No deliveries or pickups on this day.">Reserved bookings show here on their delivery and pickup days.</EmptyState>
      ) : null}

      {mine.length ? (
        <section aria-labelledby="mine-heading" className="space-y-3">
          <h2 id="mine-heading" className="text-lg font-semibold text-canvas-900">
            Your stops ({mine.length})
          </h2>
          {mine.map((s) => (
            <StopCard key={`${s.bookingId}-${s.stop}`} stop={s} timeZone={sheet.timeZone} />
          ))}
        </section>
      ) : null}
      {others.length ? (
        <section aria-labelledby="others-heading" className="space-y-3">
          <h2 id="others-heading" className="text-lg font-semibold text-canvas-900">
            {mine.length ? 'Other stops' : 'Stops'} ({others.length})
          </h2>
          {others.map((s) => (
            <StopCard key={`${s.bookingId}-${s.stop}`} stop={s} timeZone={sheet.timeZone} />
          ))}
        </section>
      ) : null}
    </div>
  );
}
