/**
 * Figure 1: a month of bookings, a page of 50 with the customer and the lines the totals come
 * from, through GET /api/bookings (what the Bookings screen asks for a month), against one
 * hand-written SQL query through `pg` returning the same rows.
 */
import { addDays, zonedTimeToInstant } from '../../../shared/dates';
import type { BenchContext } from '../lib/context';
import { compare, ms, times, type Result } from '../lib/measure';

/** June of the last full season: the busiest month of the year. */
export const BUSY_MONTH = '2026-06';

export function monthRange(month: string, zone: string) {
  const first = `${month}-01`;
  const next = addDays(first, 32).slice(0, 7);
  return { from: zonedTimeToInstant(first, '00:00', zone), to: zonedTimeToInstant(`${next}-01`, '00:00', zone) };
}

// The page first, then its customers and lines: what a person writing it by hand would do.
const SQL = `
  WITH page AS (
    SELECT * FROM bookings
     WHERE organization_id = $1 AND event_start < $3 AND event_end > $2
     ORDER BY event_start, reference
     LIMIT 50)
  SELECT b.id, b.reference, b.status, b.event_start, b.event_end, b.delivery_start, b.delivery_end, b.pickup_start, b.pickup_end,
         b.site_line1, b.site_line2, b.site_city, b.site_region, b.site_postal_code, b.site_notes, b.surface, b.anchoring,
         b.utility_locate_number, b.utility_locate_date, b.guest_count, b.seating, b.after_dark, b.delivery_miles, b.setup_labor_cents,
         b.discount_bp, b.discount_cents, b.damage_waiver, b.own_insurance, b.tax_rate_bp, b.security_deposit_cents, b.currency, b.notes,
         b.total_cents, b.created_at, b.updated_at,
         json_build_object('id', c.id, 'name', c.name, 'email', c.email, 'phone', c.phone, 'taxExempt', c.tax_exempt) AS customer,
         (SELECT json_agg(l ORDER BY l.position)
            FROM (SELECT bl.id, bl.position, bl.item_id, i.kind AS item_kind, bl.description, bl.quantity, bl.unit_price_cents, bl.extra_days,
                         bl.extra_day_price_cents, bl.discount_bp, bl.discount_cents, bl.taxable, bl.kind
                    FROM booking_lines bl LEFT JOIN items i ON i.id = bl.item_id
                   WHERE bl.booking_id = b.id) l) AS lines,
         (SELECT count(*) FROM bookings WHERE organization_id = $1 AND event_start < $3 AND event_end > $2) AS total
    FROM page b
    JOIN customers c ON c.id = b.customer_id
   ORDER BY b.event_start, b.reference`;

export async function bookingsListFigure(ctx: BenchContext): Promise<Result> {
  const { from, to } = monthRange(BUSY_MONTH, ctx.timeZone);
  const path = `/api/bookings?from=${encodeURIComponent(from.toISOString())}&to=${encodeURIComponent(to.toISOString())}&page=1&pageSize=50`;
  const query = () => ctx.db.query(SQL, [ctx.organizationId, from, to]);

  // Same rows, same order, same total: otherwise the comparison means nothing.
  const api = await ctx.http.json<{ data: { id: string; lines: unknown[]; totals: unknown }[]; total: number }>('GET', path);
  if (api.status !== 200) throw new Error(`GET ${path} answered ${api.status}.`);
  const sql = await query();
  const same =
    api.data.data.length === sql.rows.length &&
    api.data.data.every((b, i) => b.id === sql.rows[i].id && b.lines.length === (sql.rows[i].lines?.length ?? 0) && b.totals !== null) &&
    Number(sql.rows[0]?.total) === api.data.total;

  const r = await compare(
    async () => {
      const reply = await ctx.http.request('GET', path);
      if (reply.status !== 200) throw new Error(`GET ${path} answered ${reply.status}.`);
    },
    query,
    { warmup: 5, runs: 51 },
  );
  return {
    key: 'bookings-list',
    figure: `Bookings list, a month (${BUSY_MONTH}, page of 50 of ${api.data.total}, customer, lines and totals)`,
    measured: `${ms(r.subject)} vs SQL ${ms(r.baseline)} = ${times(r.ratio)}${same ? '' : ' (rows differ!)'}`,
    target: '≤ 2×',
    pass: same && r.ratio <= 2,
    notes: [`GET ${path}`, `route runs (ms): ${r.subjectRuns.map((x) => x.toFixed(1)).join(' ')}`, `SQL runs (ms): ${r.baselineRuns.map((x) => x.toFixed(1)).join(' ')}`],
  };
}
