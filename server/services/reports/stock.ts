/**
 * Stock utilization and payback, per item, over a period of days in the company's calendar.
 *
 * Days out: for every booking that took the stock out or holds it (reserved, out, returned,
 * closed), the item's quantity times the calendar days from the delivery day to the pickup day,
 * both included, inside the period. Days owned: the quantity owned today times the days of the
 * period from the day the item was owned. An item is owned from the day it was added to the
 * catalog, or from its first delivery when that came earlier (stock already in use when it was
 * entered, say by a CSV import), so utilization never exceeds what was there to rent.
 *
 * Revenue attribution: a booking's rental revenue is what its deposit and balance invoices billed
 * as rental (issued, not void), less the rental part of credit notes on them. That amount is split
 * over the booking's rental lines in proportion to their net amounts after discounts (to the cent,
 * by largest remainder), and an item gets the share of its lines. Delivery, labor, damage waiver, tax and additional charges are not the item's.
 * Revenue counts on the event day. The item has paid for itself on the first event day on which its
 * revenue to date reaches its purchase cost times the quantity owned.
 */
import { Op, QueryTypes } from 'sequelize';
import { allocate } from '../../../shared/money';
import type { StockBookingRow, StockItemRow, StockReport } from '../../../shared/schemas/reports';
import { sequelize } from '../../db';
import { Item } from '../../models';
import { daysBetweenInclusive, endOfDay, isoDate, type ReportContext } from './common';

/** Bookings whose stock counts as out: it was delivered or is held for the event. */
export const OUT_STATUSES = ['reserved', 'out', 'returned', 'closed'] as const;

interface Billed { billed: number; credited: number; invoices: { id: string; number: string | null }[] }

/** Each booking's rental billed on deposit and balance invoices, net of the rental part of their credit notes. */
async function rentalBilled(ctx: ReportContext): Promise<Map<string, Billed>> {
  const rows = await sequelize.query<{ id: string; number: string | null; booking_id: string; kind: string; rental_cents: number }>(
    `SELECT i.id, i.number, i.booking_id, i.kind, i.rental_cents
       FROM invoices i
       LEFT JOIN invoices o ON o.id = i.credits_invoice_id
      WHERE i.organization_id = :org
        AND ((i.kind IN ('deposit', 'balance') AND i.status IN ('open', 'partly_paid', 'paid'))
          OR (i.kind = 'credit_note' AND o.kind IN ('deposit', 'balance')))`,
    { replacements: { org: ctx.organizationId }, type: QueryTypes.SELECT, transaction: ctx.t },
  );
  const out = new Map<string, Billed>();
  for (const r of rows) {
    const b = out.get(r.booking_id) ?? { billed: 0, credited: 0, invoices: [] };
    if (r.kind === 'credit_note') b.credited += Number(r.rental_cents);
    else b.billed += Number(r.rental_cents);
    b.invoices.push({ id: r.id, number: r.number });
    out.set(r.booking_id, b);
  }
  return out;
}

interface LineRow {
  booking_id: string; reference: string; status: string; event_start: Date; event_date: string; delivery_date: string; pickup_date: string;
  item_id: string | null; quantity: number; rental_net: number;
}

/**
 * Every item's figures over the period; with `itemId`, that one item's, with the bookings behind
 * them (the list leaves them out: a busy company has tens of thousands in a year).
 */
export async function stockReport(ctx: ReportContext, from: string, to: string, opts: { itemId?: string } = {}): Promise<StockReport> {
  const items = await Item.findAll({
    where: { organizationId: ctx.organizationId, kind: { [Op.ne]: 'service' }, ...(opts.itemId ? { id: opts.itemId } : {}) },
    order: [['name', 'ASC']],
    transaction: ctx.t,
  });
  const billed = await rentalBilled(ctx);
  // The bookings that count: out in the period (or ever, for each item's first delivery), or billed for rental up to its end.
  const lines = await sequelize.query<LineRow>(
    `SELECT b.id AS booking_id, b.reference, b.status, b.event_start,
            to_char(b.event_start AT TIME ZONE :tz, 'YYYY-MM-DD') AS event_date,
            to_char(b.delivery_start AT TIME ZONE :tz, 'YYYY-MM-DD') AS delivery_date,
            to_char(b.pickup_end AT TIME ZONE :tz, 'YYYY-MM-DD') AS pickup_date,
            l.item_id, l.quantity,
            -- The line's net after its own discount, as the quote works it (shared/quote.ts): gross less
            -- its discount (percent rounded half away from zero, plus the amount), never below zero.
            -- The booking-wide discount falls on every line in proportion to this net, so these nets
            -- weigh the lines' shares of the rental billed in the same proportion.
            CASE WHEN l.kind = 'rental' THEN g.gross - least(g.gross, round(g.gross * l.discount_bp / 10000.0) + l.discount_cents) ELSE 0 END::bigint AS rental_net
       FROM bookings b
       JOIN booking_lines l ON l.booking_id = b.id
       CROSS JOIN LATERAL (SELECT (l.unit_price_cents + l.extra_day_price_cents * l.extra_days) * l.quantity AS gross) g
      WHERE b.organization_id = :org
        AND (b.status IN (:out) OR (b.event_start < :until AND b.id IN (
              SELECT i.booking_id FROM invoices i
               WHERE i.organization_id = :org AND i.kind IN ('deposit', 'balance') AND i.status IN ('open', 'partly_paid', 'paid'))))
        ${opts.itemId ? 'AND b.id IN (SELECT booking_id FROM booking_lines WHERE item_id = :itemId)' : ''}`,
    {
      replacements: { org: ctx.organizationId, tz: ctx.timeZone, out: [...OUT_STATUSES], until: endOfDay(to, ctx.timeZone), itemId: opts.itemId ?? null },
      type: QueryTypes.SELECT,
      transaction: ctx.t,
    },
  );
  const byBooking = new Map<string, LineRow[]>();
  for (const l of lines) {
    const list = byBooking.get(l.booking_id);
    if (list) list.push(l);
    else byBooking.set(l.booking_id, [l]);
  }

  // Oldest event first, so each item's revenue runs up in time order.
  const ordered = [...byBooking].sort(([, [a]], [, [b]]) => a.event_start.getTime() - b.event_start.getTime() || a.reference.localeCompare(b.reference));

  const perItem = new Map<string, StockBookingRow[]>();
  const firstDelivery = new Map<string, string>();
  for (const [bookingId, mine] of ordered) {
    const b = mine[0];
    const { delivery_date: deliveryDate, pickup_date: pickupDate, event_date: eventDate } = b;
    const holds = (OUT_STATUSES as readonly string[]).includes(b.status);

    // The rental billed, split over the rental lines by their net after discounts.
    const money = billed.get(bookingId);
    const shares = new Array<number>(mine.length).fill(0);
    if (money) {
      const weights = mine.map((l) => Number(l.rental_net));
      if (weights.some((w) => w > 0)) allocate(money.billed - money.credited, weights).forEach((c, i) => (shares[i] = c));
    }
    const byItem = new Map<string, { quantity: number; revenueCents: number }>();
    mine.forEach((l, i) => {
      if (!l.item_id) return;
      const x = byItem.get(l.item_id) ?? { quantity: 0, revenueCents: 0 };
      x.quantity += l.quantity;
      x.revenueCents += shares[i];
      byItem.set(l.item_id, x);
    });
    for (const [itemId, x] of byItem) {
      if (holds && (!firstDelivery.has(itemId) || deliveryDate < firstDelivery.get(itemId)!)) firstDelivery.set(itemId, deliveryDate);
      const list = perItem.get(itemId) ?? [];
      list.push({
        bookingId, reference: b.reference, status: b.status, eventDate, deliveryDate, pickupDate, quantity: x.quantity,
        daysOutInPeriod: 0, revenueCents: x.revenueCents, invoices: money?.invoices ?? [],
      });
      perItem.set(itemId, list);
    }
  }

  const rows: StockItemRow[] = [];
  for (const item of items) {
    const createdDate = isoDate(item.createdAt, ctx.timeZone);
    const first = firstDelivery.get(item.id);
    const ownedFrom = first && first < createdDate ? first : createdDate;
    const periodStart = ownedFrom > from ? ownedFrom : from;
    const daysOwned = item.quantityOwned * daysBetweenInclusive(periodStart, to);
    const mine = perItem.get(item.id) ?? [];
    for (const r of mine) {
      if (!(OUT_STATUSES as readonly string[]).includes(r.status)) continue;
      const start = r.deliveryDate > periodStart ? r.deliveryDate : periodStart;
      const end = r.pickupDate < to ? r.pickupDate : to;
      r.daysOutInPeriod = r.quantity * daysBetweenInclusive(start, end);
    }
    const daysOut = mine.reduce((s, r) => s + r.daysOutInPeriod, 0);
    const earned = mine.filter((r) => r.revenueCents !== 0 && r.eventDate <= to);
    const revenueToDateCents = earned.reduce((s, r) => s + r.revenueCents, 0);
    const revenueInPeriodCents = earned.filter((r) => r.eventDate >= from).reduce((s, r) => s + r.revenueCents, 0);
    const costCents = item.purchaseCostCents * item.quantityOwned;
    let paidForItselfOn: string | null = null;
    if (costCents > 0) {
      let running = 0;
      for (const r of earned) {
        running += r.revenueCents;
        if (running >= costCents) {
          paidForItselfOn = r.eventDate;
          break;
        }
      }
    }
    // Listed: what was owned in the period, or rented in it (an item since retired still shows its history).
    const bookingsShown = mine.filter((r) => r.daysOutInPeriod > 0 || (r.revenueCents !== 0 && r.eventDate >= from && r.eventDate <= to));
    if (daysOwned === 0 && bookingsShown.length === 0 && revenueToDateCents === 0) continue;
    rows.push({
      item: { id: item.id, name: item.name, kind: item.kind, quantityOwned: item.quantityOwned, purchaseCostCents: item.purchaseCostCents, createdDate },
      daysOwned, daysOut,
      utilizationBp: daysOwned > 0 ? Math.round((daysOut * 10_000) / daysOwned) : null,
      revenueInPeriodCents, revenueToDateCents, costCents, paidForItselfOn,
      payback: costCents === 0 ? 'no_cost' : paidForItselfOn ? 'paid_back' : 'not_yet',
      bookingCount: bookingsShown.length,
      bookings: opts.itemId ? bookingsShown : [],
    });
  }
  return { from, to, timeZone: ctx.timeZone, currency: ctx.currency, items: rows };
}
