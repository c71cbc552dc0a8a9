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
 * Lines of holding bookings (reserved, out) for these items whose window — delivery start to
 * pickup end plus the turnaround buffer — overlaps [from, to).
 */
export async function findHolds(
  organizationId: string,
  itemIds: string[],
  from: Date,
  to: Date,
  turnaroundHours: number,
  opts: { excludeBookingId?: string; transaction?: Transaction } = {},
): Promise<Hold[]> {
  if (itemIds.length === 0) return [];
  const rows = await sequelize.query<{
    item_id: string; booking_id: string; reference: string; status: string; quantity: number; start: Date; end: Date;
  }>(
    `SELECT bl.item_id, b.id AS booking_id, b.reference, b.status, SUM(bl.quantity)::int AS quantity,
            b.delivery_start AS start, b.pickup_end + make_interval(hours => :turnaround) AS "end"
       FROM booking_lines bl
       JOIN bookings b ON b.id = bl.booking_id
      WHERE bl.organization_id = :org AND b.organization_id = :org
        AND bl.item_id IN (:itemIds)
        AND b.status IN (:statuses)
        AND b.delivery_start < :to
        AND b.pickup_end + make_interval(hours => :turnaround) > :from
        AND (:exclude::uuid IS NULL OR b.id <> :exclude::uuid)
      GROUP BY bl.item_id, b.id`,
    {
      replacements: {
        org: organizationId, itemIds, statuses: HOLDING_STATUSES, from, to,
        turnaround: turnaroundHours, exclude: opts.excludeBookingId ?? null,
      },
      type: QueryTypes.SELECT,
      transaction: opts.transaction,
    },
  );
  return rows.map((r) => ({
    itemId: r.item_id, bookingId: r.booking_id, reference: r.reference, status: r.status,
    quantity: Number(r.quantity), start: new Date(r.start), end: new Date(r.end),
  }));
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
  // reservations of the same item take turns: the second one sees the first one's hold.
  const lock = opts.lockItems && opts.transaction ? opts.transaction.LOCK.UPDATE : undefined;
  const loadItems = () =>
    Item.findAll({
      where: { id: { [Op.in]: ids }, organizationId },
      attributes: ['id', 'name', 'kind', 'quantityOwned'],
      order: [['id', 'ASC']],
      transaction: opts.transaction,
      lock,
      raw: true,
    });
  const loadHolds = () => findHolds(organizationId, ids, from, to, turnaroundHours, opts);
  // A reservation reads the holds only once it has the locks; a check that locks nothing asks both at once.
  const [items, holds] = lock ? [await loadItems(), await loadHolds()] : await Promise.all([loadItems(), loadHolds()]);
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
