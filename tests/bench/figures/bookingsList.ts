/**
 * Figure 1: a month of bookings, a page of 50 list rows with the customer and the booking's total,
 * through GET /api/bookings (what the Bookings screen asks for a month), against one hand-written
 * SQL query through `pg` returning the same rows.
 */
import { addDays, zonedTimeToInstant } from '../../../shared/dates';
import type { BookingListRow } from '../../../shared/schemas/bookings';
import type { BenchContext } from '../lib/context';
import { compare, ms, times, type Result } from '../lib/measure';

/** June of the last full season: the busiest month of the year. */
export const BUSY_MONTH = '2026-06';

export function monthRange(month: string, zone: string) {
  const first = `${month}-01`;
  const next = addDays(first, 32).slice(0, 7);
  return { from: zonedTimeToInstant(first, '00:00', zone), to: zonedTimeToInstant(`${next}-01`, '00:00', zone) };
}

// The page with its customers, and the count: what a person writing it by hand would do.
const SQL = `
  SELECT b.id, b.reference, b.status, b.event_start, b.event_end, b.site_line1, b.site_city, b.guest_count, b.currency, b.total_cents,
         c.id AS customer_id, c.name AS customer_name,
         (SELECT count(*) FROM bookings WHERE organization_id = $1 AND event_start < $3 AND event_end > $2) AS total
    FROM bookings b
    JOIN customers c ON c.id = b.customer_id
   WHERE b.organization_id = $1 AND b.event_start < $3 AND b.event_end > $2
   ORDER BY b.event_start, b.reference
   LIMIT 50`;

export async function bookingsListFigure(ctx: BenchContext): Promise<Result> {
  const { from, to } = monthRange(BUSY_MONTH, ctx.timeZone);
  const path = `/api/bookings?from=${encodeURIComponent(from.toISOString())}&to=${encodeURIComponent(to.toISOString())}&page=1&pageSize=50`;
  const query = () => ctx.db.query(SQL, [ctx.organizationId, from, to]);

  // Same rows, same order, same total: otherwise the comparison means nothing.
  const api = await ctx.http.json<{ data: BookingListRow[]; total: number }>('GET', path);
  if (api.status !== 200) throw new Error(`GET ${path} answered ${api.status}.`);
  const sql = await query();
  const same =
    api.data.data.length === sql.rows.length &&
    api.data.data.every((b, i) => {
      const r = sql.rows[i];
      return (
        b.id === r.id &&
        b.customer.id === r.customer_id &&
        b.customer.name === r.customer_name &&
        b.eventStart === r.event_start.toISOString() &&
        b.totalCents === Number(r.total_cents) &&
        !('lines' in b)
      );
    }) &&
    Number(sql.rows[0]?.total) === api.data.total;
  // Both read bookings.total_cents: it has to be the booking's quote as its own page shows it.
  let stale = 0;
  for (const b of api.data.data) {
    const one = await ctx.http.json<{ totals: { totalCents: number } | null }>('GET', `/api/bookings/${b.id}`);
    if (one.status !== 200 || one.data.totals?.totalCents !== b.totalCents) stale += 1;
  }

  const r = await compare(
    async () => {
      const reply = await ctx.http.request('GET', path);
      if (reply.status !== 200) throw new Error(`GET ${path} answered ${reply.status}.`);
    },
    query,
    // The app has just started: its first few hundred requests run before the JIT has compiled the
    // request path and every pooled connection has prepared the list's statement, so the figure is
    // the steady state after 300 rounds of each (about two seconds), the median of 201.
    { warmup: 300, runs: 201 },
  );
  return {
    key: 'bookings-list',
    figure: `Bookings list, a month (${BUSY_MONTH}, page of 50 of ${api.data.total}, customer and totals)`,
    measured: `${ms(r.subject)} vs SQL ${ms(r.baseline)} = ${times(r.ratio)}${same ? '' : ' (rows differ!)'}${stale ? ` (${stale} stored totals differ from the quote!)` : ''}`,
    target: '≤ 2×',
    pass: same && !stale && r.ratio <= 2,
    notes: [`GET ${path}`, `route runs (ms): ${r.subjectRuns.map((x) => x.toFixed(1)).join(' ')}`, `SQL runs (ms): ${r.baselineRuns.map((x) => x.toFixed(1)).join(' ')}`],
  };
}
