import { Link } from 'react-router';
import type { DashboardSummary } from '@shared/schemas/dashboard';
import { addDays } from '@shared/dates';
import { formatMoney } from '@shared/money';
import { paths } from '@/config/paths';
import { cn } from '@/lib/cn';

interface Figure {
  label: string;
  value: string;
  /** A second line: what the number means, or the amount behind a count. */
  note?: string;
  /** The list it counts; none where no list shows exactly those (a link must not show something else). */
  to?: string;
  /** Something to act on today. */
  attention?: boolean;
}

const plural = (n: number, one: string, many: string) => `${n.toLocaleString('en-US')} ${n === 1 ? one : many}`;

/** The figures behind Home's "Today" panel, each a link to the list it counts where there is one. */
export function todayFigures(d: DashboardSummary, opts: { deskWork: boolean }): Figure[] {
  const out: Figure[] = [];
  if (d.stops) {
    out.push({
      label: 'Stops today',
      value: String(d.stops.deliveries + d.stops.pickups),
      note: `${plural(d.stops.deliveries, 'delivery', 'deliveries')}, ${plural(d.stops.pickups, 'pickup', 'pickups')}${d.stops.mine ? `; ${d.stops.mine} of them yours` : ''}`,
      to: paths.app.fieldDay.getHref(d.today),
    });
  }
  out.push({
    label: 'Events in the next 7 days',
    value: String(d.bookings.startingThisWeek),
    note: 'Reserved or out',
    to: `${paths.app.bookings.getHref()}?status=reserved,out&from=${d.today}&to=${addDays(d.today, 6)}`,
  });
  // Quotes and signatures are the office's to chase.
  if (opts.deskWork) {
    out.push(
    { label: 'Quotes waiting', value: String(d.bookings.quoted), note: 'Sent, not yet reserved', to: `${paths.app.bookings.getHref()}?status=quoted` },
    { label: 'Agreements to be signed', value: String(d.bookings.awaitingSignature), note: 'Sent, link still valid' },
    );
  }
  if (d.money) {
    const m = d.money;
    out.push(
      {
        label: 'Overdue',
        value: formatMoney(m.overdueCents, m.currency),
        note: plural(m.overdueCount, 'invoice past its due date', 'invoices past their due date'),
        to: `${paths.app.invoices.getHref()}?status=overdue`,
        attention: m.overdueCount > 0,
      },
      { label: 'Owed to you', value: formatMoney(m.openCents, m.currency), note: plural(m.openCount, 'open invoice', 'open invoices'), to: `${paths.app.invoices.getHref()}?status=open,partly_paid` },
      { label: 'Received, last 7 days', value: formatMoney(m.receivedLast7DaysCents, m.currency), note: 'Cash, check, transfer and card' },
    );
  }
  return out;
}

export function TodayFigures({ summary, deskWork }: { summary: DashboardSummary; deskWork: boolean }) {
  return (
    <ul className="grid gap-3 sm:grid-cols-2 xl:grid-cols-4" aria-label="Today’s figures">
      {todayFigures(summary, { deskWork }).map((f) => (
        <li key={f.label}>
          {f.to ? (
            <Link
              to={f.to}
              className={cn('block h-full rounded-lg border p-4', f.attention ? 'border-rust-200 bg-rust-50 hover:bg-rust-100' : 'border-canvas-200 bg-white hover:bg-canvas-50')}
            >
              <FigureText figure={f} />
            </Link>
          ) : (
            <div className="h-full rounded-lg border border-canvas-200 bg-white p-4">
              <FigureText figure={f} />
            </div>
          )}
        </li>
      ))}
    </ul>
  );
}

function FigureText({ figure: f }: { figure: Figure }) {
  return (
    <>
      <span className="block text-sm font-semibold text-canvas-700">{f.label}</span>
      <span className={cn('mt-1 block text-2xl font-bold tabular-nums', f.attention ? 'text-rust-700' : 'text-canvas-900')}>{f.value}</span>
      {f.note ? <span className="mt-1 block text-sm text-canvas-600">{f.note}</span> : null}
    </>
  );
}
