import { Op, QueryTypes } from 'sequelize';
import { HOLDING_STATUSES } from '../../shared/schemas/bookings';
import type { ShortfallDetail } from '../../shared/schemas/bookings';
import { sequelize, type Transaction } from '../db';
import { Item, Shortfall } from '../models';

export interface Hold {
  itemId: string;
  bookingId: string;
  reference: string;
  status: string;
  quantity: number;
  start: Date;
  /** Pickup end plus the turnaround buffer. */
  end: Date;
}

/**
 * Lines of holding bookings (reserved, out) for the items `:itemIds` whose window — delivery start
 * to pickup end plus the turnaround buffer — overlaps [:from, :to), one row per item and booking.
 */
const HOLDS_SQL = `
  SELECT bl.item_id, b.id AS booking_id, b.reference, b.status, SUM(bl.quantity)::int AS quantity,
         b.delivery_start AS start, b.pickup_end + make_interval(hours => :turnaround) AS "end"
    FROM booking_lines bl
    JOIN bookings b ON b.id = bl.booking_id
   WHERE bl.organization_id = :org AND b.organization_id = :org
     AND bl.item_id IN (:itemIds)
     AND b.status IN (:statuses)
     AND b.delivery_start < :to
     AND b.pickup_end + make_interval(hours => :turnaround) > :from
     AND (:exclude::uuid IS NULL OR b.id <> :exclude::uuid)
   GROUP BY bl.item_id, b.id`;

interface HoldRow { item_id: string; booking_id: string; reference: string; status: string; quantity: number; start: Date; end: Date }

type HoldOptions = { excludeBookingId?: string; transaction?: Transaction };

const holdReplacements = (organizationId: string, itemIds: string[], from: Date, to: Date, turnaroundHours: number, opts: HoldOptions) => ({
  org: organizationId, itemIds, statuses: HOLDING_STATUSES, from, to, turnaround: turnaroundHours, exclude: opts.excludeBookingId ?? null,
});

const toHold = (r: HoldRow): Hold => ({
  itemId: r.item_id, bookingId: r.booking_id, reference: r.reference, status: r.status,
  quantity: Number(r.quantity), start: new Date(r.start), end: new Date(r.end),
});

/**
 * Lines of holding bookings (reserved, out) for these items whose window — delivery start to
 * pickup end plus the turnaround buffer — overlaps [from, to).
 */
export async function findHolds(
  organizationId: string,
  itemIds: string[],
  from: Date,
  to: Date,
  turnaroundHours: number,
  opts: HoldOptions = {},
): Promise<Hold[]> {
  if (itemIds.length === 0) return [];
  const rows = await sequelize.query<HoldRow>(HOLDS_SQL, {
    replacements: holdReplacements(organizationId, itemIds, from, to, turnaroundHours, opts),
    type: QueryTypes.SELECT,
    transaction: opts.transaction,
  });
  return rows.map(toHold);
}

interface StockRow { id: string; name: string; kind: string; quantityOwned: number }

/** The items and their holds in one query, for a check that locks nothing. */
async function stockWithHolds(organizationId: string, itemIds: string[], from: Date, to: Date, turnaroundHours: number, opts: HoldOptions) {
  const rows = await sequelize.query<{ id: string; name: string; kind: string; quantity_owned: number } & Partial<HoldRow>>(
    `WITH holds AS (${HOLDS_SQL})
     SELECT i.id, i.name, i.kind, i.quantity_owned, h.item_id, h.booking_id, h.reference, h.status, h.quantity, h.start, h."end"
       FROM items i LEFT JOIN holds h ON h.item_id = i.id
      WHERE i.organization_id = :org AND i.id IN (:itemIds)
      ORDER BY i.id`,
    { replacements: holdReplacements(organizationId, itemIds, from, to, turnaroundHours, opts), type: QueryTypes.SELECT, transaction: opts.transaction },
  );
  const items = new Map<string, StockRow>();
  const holds: Hold[] = [];
  for (const r of rows) {
    if (!items.has(r.id)) items.set(r.id, { id: r.id, name: r.name, kind: r.kind, quantityOwned: Number(r.quantity_owned) });
    if (r.booking_id) holds.push(toHold(r as HoldRow));
  }
  return { items: [...items.values()], holds };
}

/** The most units held at any one moment within [from, to) (a sweep over the holds' edges). */
export function peakHeld(holds: Hold[], from: Date, to: Date): number {
  const edges: [number, number][] = [];
  for (const h of holds) {
    const s = Math.max(h.start.getTime(), from.getTime());
    const e = Math.min(h.end.getTime(), to.getTime());
    if (s < e) edges.push([s, h.quantity], [e, -h.quantity]);
  }
  // At the same instant, releases come before new holds: back-to-back windows do not overlap.
  edges.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  let now = 0;
  let peak = 0;
  for (const [, d] of edges) {
    now += d;
    peak = Math.max(peak, now);
  }
  return peak;
}

/** How many of each requested item are free over the window, and the shortfall. */
export async function checkAvailability(
  organizationId: string,
  requests: { itemId: string; quantity: number }[],
  from: Date,
  to: Date,
  turnaroundHours: number,
  opts: { excludeBookingId?: string; transaction?: Transaction; lockItems?: boolean } = {},
): Promise<ShortfallDetail[]> {
  const needed = new Map<string, number>();
  for (const r of requests) needed.set(r.itemId, (needed.get(r.itemId) ?? 0) + r.quantity);
  const ids = [...needed.keys()].sort();
  if (ids.length === 0) return [];
  // Locking the item rows (in id order, so two reservers never deadlock) makes concurrent
  // reservations of the same item take turns: the second one sees the first one's hold, because
  // the holds are read only once the locks are held. A check that locks nothing asks for the
  // items and their holds in one query.
  let items: StockRow[];
  let holds: Hold[];
  if (opts.lockItems && opts.transaction) {
    items = await Item.findAll({
      where: { id: { [Op.in]: ids }, organizationId },
      attributes: ['id', 'name', 'kind', 'quantityOwned'],
      order: [['id', 'ASC']],
      transaction: opts.transaction,
      lock: opts.transaction.LOCK.UPDATE,
      raw: true,
    });
    holds = await findHolds(organizationId, ids, from, to, turnaroundHours, opts);
  } else {
    ({ items, holds } = await stockWithHolds(organizationId, ids, from, to, turnaroundHours, opts));
  }
  return items
    .filter((item) => item.kind !== 'service')
    .map((item) => {
      const requested = needed.get(item.id) ?? 0;
      const held = peakHeld(holds.filter((h) => h.itemId === item.id), from, to);
      const available = Math.max(0, item.quantityOwned - held);
      return { itemId: item.id, name: item.name, requested, available, shortfall: Math.max(0, requested - available) };
    });
}

/** Records shortfalls for the purchasing report (in its own transaction when the caller's rolled back). */
export async function recordShortfalls(
  organizationId: string,
  bookingId: string | null,
  details: ShortfallDetail[],
  from: Date,
  to: Date,
  transaction?: Transaction,
) {
  const short = details.filter((d) => d.shortfall > 0);
  if (short.length === 0) return;
  await Shortfall.bulkCreate(
    short.map((d) => ({
      organizationId, itemId: d.itemId, bookingId, requested: d.requested, available: d.available,
      shortfall: d.shortfall, windowStart: from, windowEnd: to,
    })),
    { transaction },
  );
}
