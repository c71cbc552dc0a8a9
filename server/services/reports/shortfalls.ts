/**
 * What to buy next: the times the stock could not meet a request (every refused reservation
 * keeps a `shortfalls` row), grouped by item. A request counts in the period when the stock was
 * wanted from a day inside it (the window's first day in the company's zone). One booking tried
 * twice shows twice: each time a customer was told no.
 */
import { QueryTypes } from 'sequelize';
import type { ShortfallItemRow, ShortfallsReport } from '../../../shared/schemas/reports';
import { sequelize } from '../../db';
import { endOfDay, isoDate, startOfDay, type ReportContext } from './common';

interface Row {
  id: string; created_at: Date; window_start: Date; window_end: Date; requested: number; available: number; shortfall: number;
  item_id: string; item_name: string; item_kind: string; quantity_owned: number; booking_id: string | null; reference: string | null; customer_name: string | null;
}

export async function shortfallsReport(ctx: ReportContext, from: string, to: string): Promise<ShortfallsReport> {
  const rows = await sequelize.query<Row>(
    `SELECT s.id, s.created_at, s.window_start, s.window_end, s.requested, s.available, s.shortfall,
            i.id AS item_id, i.name AS item_name, i.kind AS item_kind, i.quantity_owned,
            b.id AS booking_id, b.reference, c.name AS customer_name
       FROM shortfalls s
       JOIN items i ON i.id = s.item_id
       LEFT JOIN bookings b ON b.id = s.booking_id
       LEFT JOIN customers c ON c.id = b.customer_id
      WHERE s.organization_id = :org AND s.window_start >= :from AND s.window_start < :until
      ORDER BY s.window_start, s.created_at, s.id`,
    { replacements: { org: ctx.organizationId, from: startOfDay(from, ctx.timeZone), until: endOfDay(to, ctx.timeZone) }, type: QueryTypes.SELECT, transaction: ctx.t },
  );
  const byItem = new Map<string, ShortfallItemRow & { bookings: Set<string> }>();
  for (const r of rows) {
    const day = isoDate(r.window_start, ctx.timeZone);
    let g = byItem.get(r.item_id);
    if (!g) {
      byItem.set(
        r.item_id,
        (g = {
          item: { id: r.item_id, name: r.item_name, kind: r.item_kind, quantityOwned: r.quantity_owned },
          count: 0, bookingCount: 0, totalShort: 0, largestShort: 0, firstDate: day, lastDate: day, requests: [], bookings: new Set(),
        }),
      );
    }
    g.count += 1;
    g.totalShort += r.shortfall;
    g.largestShort = Math.max(g.largestShort, r.shortfall);
    if (day < g.firstDate) g.firstDate = day;
    if (day > g.lastDate) g.lastDate = day;
    if (r.booking_id) g.bookings.add(r.booking_id);
    g.requests.push({
      id: r.id,
      recordedAt: new Date(r.created_at).toISOString(),
      booking: r.booking_id ? { id: r.booking_id, reference: r.reference!, customerName: r.customer_name ?? '' } : null,
      windowStart: new Date(r.window_start).toISOString(),
      windowEnd: new Date(r.window_end).toISOString(),
      requested: r.requested, available: r.available, shortfall: r.shortfall,
    });
  }
  const items = [...byItem.values()]
    .map(({ bookings, ...g }) => ({ ...g, bookingCount: bookings.size }))
    // Most often short first; then the biggest gap.
    .sort((a, b) => b.count - a.count || b.largestShort - a.largestShort || a.item.name.localeCompare(b.item.name));
  return { from, to, timeZone: ctx.timeZone, items };
}
