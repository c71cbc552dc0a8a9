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
 * over the booking's rental lines in proportion to their net amounts after line and booking
 * discounts (the quote's own split, to the cent by largest remainder), and an item gets the share
 * of its lines. Delivery, labor, damage waiver, tax and additional charges are not the item's.
 * Revenue counts on the event day. The item has paid for itself on the first event day on which its
 * revenue to date reaches its purchase cost times the quantity owned.
 */
import { Op, QueryTypes } from 'sequelize';
import { allocate } from '../../../shared/money';
import type { StockBookingRow, StockItemRow, StockReport } from '../../../shared/schemas/reports';
import { sequelize } from '../../db';
import { Booking, BookingLine, Customer, Item, type Organization } from '../../models';
import { quoteBooking } from '../pricing';
import { daysBetweenInclusive, isoDate, type ReportContext } from './common';

/** Bookings whose stock counts as out: it was delivered or is held for the event. */
export const OUT_STATUSES = ['reserved', 'out', 'returned', 'closed'] as const;

interface Billed { billed: number; credited: number; invoiceIds: string[] }

/** Each booking's rental billed on deposit and balance invoices, net of the rental part of their credit notes. */
async function rentalBilled(ctx: ReportContext): Promise<Map<string, Billed>> {
  const rows = await sequelize.query<{ id: string; booking_id: string; kind: string; rental_cents: number }>(
    `SELECT i.id, i.booking_id, i.kind, i.rental_cents
       FROM invoices i
       LEFT JOIN invoices o ON o.id = i.credits_invoice_id
      WHERE i.organization_id = :org
        AND ((i.kind IN ('deposit', 'balance') AND i.status IN ('open', 'partly_paid', 'paid'))
          OR (i.kind = 'credit_note' AND o.kind IN ('deposit', 'balance')))`,
    { replacements: { org: ctx.organizationId }, type: QueryTypes.SELECT, transaction: ctx.t },
  );
  const out = new Map<string, Billed>();
  for (const r of rows) {
    const b = out.get(r.booking_id) ?? { billed: 0, credited: 0, invoiceIds: [] };
    if (r.kind === 'credit_note') b.credited += Number(r.rental_cents);
    else b.billed += Number(r.rental_cents);
    b.invoiceIds.push(r.id);
    out.set(r.booking_id, b);
  }
  return out;
}

export async function stockReport(ctx: ReportContext, organization: Organization, from: string, to: string): Promise<StockReport> {
  const items = await Item.findAll({ where: { organizationId: ctx.organizationId, kind: { [Op.ne]: 'service' } }, order: [['name', 'ASC']], transaction: ctx.t });
  const billed = await rentalBilled(ctx);
  const bookings = (await Booking.findAll({
    where: {
      organizationId: ctx.organizationId,
      [Op.or]: [{ status: { [Op.in]: [...OUT_STATUSES] } }, { id: { [Op.in]: [...billed.keys()] } }],
    },
    include: [{ model: BookingLine, as: 'lines' }, { model: Customer, as: 'customer' }],
    order: [['eventStart', 'ASC'], ['reference', 'ASC']],
    transaction: ctx.t,
  })) as (Booking & { lines: BookingLine[]; customer: Customer })[];

  const perItem = new Map<string, StockBookingRow[]>();
  const firstDelivery = new Map<string, string>();
  for (const b of bookings) {
    const lines = [...b.lines].sort((x, y) => x.position - y.position);
    const deliveryDate = isoDate(b.deliveryStart, ctx.timeZone);
    const pickupDate = isoDate(b.pickupEnd, ctx.timeZone);
    const eventDate = isoDate(b.eventStart, ctx.timeZone);
    const holds = (OUT_STATUSES as readonly string[]).includes(b.status);

    // The rental billed, split over the rental lines by their net after discounts.
    const money = billed.get(b.id);
    const shares = new Array<number>(lines.length).fill(0);
    if (money) {
      const quote = quoteBooking(b, lines, b.customer, organization);
      const weights = quote.lines.map((l) => (l.kind === 'rental' ? l.netCents : 0));
      if (weights.some((w) => w > 0)) allocate(money.billed - money.credited, weights).forEach((c, i) => (shares[i] = c));
    }
    const byItem = new Map<string, { quantity: number; revenueCents: number }>();
    lines.forEach((l, i) => {
      if (!l.itemId) return;
      const x = byItem.get(l.itemId) ?? { quantity: 0, revenueCents: 0 };
      x.quantity += l.quantity;
      x.revenueCents += shares[i];
      byItem.set(l.itemId, x);
    });
    for (const [itemId, x] of byItem) {
      if (holds && (!firstDelivery.has(itemId) || deliveryDate < firstDelivery.get(itemId)!)) firstDelivery.set(itemId, deliveryDate);
      perItem.set(itemId, [
        ...(perItem.get(itemId) ?? []),
        {
          bookingId: b.id, reference: b.reference, status: b.status, eventDate, deliveryDate, pickupDate, quantity: x.quantity,
          daysOutInPeriod: 0, revenueCents: x.revenueCents, invoiceIds: money?.invoiceIds ?? [],
        },
      ]);
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
      bookings: bookingsShown,
    });
  }
  return { from, to, timeZone: ctx.timeZone, currency: ctx.currency, items: rows };
}
