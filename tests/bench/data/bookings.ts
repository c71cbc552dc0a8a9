/**
 * 20,000 bookings with 200,000 lines over five seasons (2022 to 2026) and next season's early
 * reservations: events follow the trade's calendar (most from May to September, most on
 * Saturdays), each booking's windows pass the app's own order rules, and its status follows its
 * dates (closed or cancelled in the past, out or returned around today, reserved, quoted or draft
 * ahead). Lines come from the event: a tent sized for the guests, sidewalls, tables, chairs and
 * linens for them, lights after dark, ballast on hard ground, the crew, then the extras.
 */
import { addDays, zonedTimeToInstant } from '../../../shared/dates';
import type { BookingStatus } from '../../../shared/schemas/bookings';
import type { CatalogItem, Rand } from './catalog';
import type { BenchCustomer } from './customers';

export const BOOKING_COUNT = 20_000;
export const LINE_COUNT = 200_000;
/** Next season's bookings made already (the rest fall in the five seasons). */
const NEXT_SEASON = 600;
export const FIRST_SEASON = 2022;
const SEASONS = 5;
const MONTH_WEIGHTS = [1, 2, 4, 8, 13, 16, 14, 14, 13, 9, 4, 2];
// Sunday first: most events are on Saturdays, then Fridays and Sundays.
const WEEKDAY_WEIGHTS = [15, 3, 3, 3, 5, 20, 51];
const OCCASIONS = ['Wedding reception', 'Graduation party', 'Family reunion', 'Fundraiser dinner', 'Birthday party', 'Church picnic', 'Company picnic', 'Festival', 'Anniversary party', 'Memorial gathering'];

export interface BenchLine {
  id: string;
  bookingId: string;
  position: number;
  itemId: string | null;
  description: string;
  quantity: number;
  unitPriceCents: number;
  extraDays: number;
  extraDayPriceCents: number;
  discountBp: number;
  discountCents: number;
  taxable: boolean;
  kind: 'rental' | 'fee';
}

export interface BenchBooking {
  id: string;
  reference: string;
  status: BookingStatus;
  customer: BenchCustomer;
  eventDay: string;
  eventStart: Date; eventEnd: Date; deliveryStart: Date; deliveryEnd: Date; pickupStart: Date; pickupEnd: Date;
  siteLine1: string; siteCity: string; siteRegion: string; sitePostalCode: string; siteNotes: string;
  surface: 'grass' | 'soil' | 'gravel' | 'asphalt' | 'concrete';
  anchoring: 'stakes' | 'ballast';
  utilityLocateNumber: string; utilityLocateDate: string | null;
  guestCount: number; seating: 'banquet' | 'rows' | 'standing' | 'mixed'; afterDark: boolean;
  deliveryMiles: number | null; setupLaborCents: number; discountBp: number; discountCents: number;
  damageWaiver: boolean; ownInsurance: boolean; taxRateBp: number; securityDepositCents: number;
  notes: string;
  totalCents: number;
  /** When the quote was made (the row's creation) and when the customer reserved. */
  createdAt: Date; reservedAt: Date; updatedAt: Date;
  lines: BenchLine[];
}

function weighted(rand: Rand, weights: readonly number[]): number {
  let r = rand() * weights.reduce((a, b) => a + b, 0);
  for (let i = 0; i < weights.length; i++) if ((r -= weights[i]) < 0) return i;
  return weights.length - 1;
}

function eventDay(rand: Rand, year: number, months: number[]): string {
  const month = months[weighted(rand, months.map((m) => MONTH_WEIGHTS[m]))];
  const days = new Date(Date.UTC(year, month + 1, 0)).getUTCDate();
  for (;;) {
    const day = 1 + Math.floor(rand() * days);
    const date = `${year}-${String(month + 1).padStart(2, '0')}-${String(day).padStart(2, '0')}`;
    if (rand() * 51 < WEEKDAY_WEIGHTS[new Date(`${date}T12:00:00Z`).getUTCDay()]) return date;
  }
}

const hhmm = (h: number) => `${String(Math.floor(h)).padStart(2, '0')}:${h % 1 ? '30' : '00'}`;

function windows(rand: Rand, day: string, zone: string, days: number) {
  const at = (d: string, h: number) => zonedTimeToInstant(d, hhmm(h), zone);
  const start = [11, 12, 14, 16, 16, 17, 18][Math.floor(rand() * 7)];
  const lastDay = addDays(day, days - 1);
  const sameDay = rand() < 0.25;
  const deliveryDay = sameDay ? day : addDays(day, -1);
  const deliveryFrom = sameDay ? 6 + Math.floor(rand() * 2) : 8 + Math.floor(rand() * 4);
  const pickupFrom = 9 + Math.floor(rand() * 4);
  return {
    eventStart: at(day, start), eventEnd: at(lastDay, Math.min(23, start + 4 + Math.floor(rand() * 5))),
    deliveryStart: at(deliveryDay, deliveryFrom), deliveryEnd: at(deliveryDay, deliveryFrom + 3),
    pickupStart: at(addDays(lastDay, 1), pickupFrom), pickupEnd: at(addDays(lastDay, 1), pickupFrom + 4),
  };
}

function statusFor(rand: Rand, w: { eventStart: Date; pickupEnd: Date }, now: Date): BookingStatus {
  const r = rand();
  if (w.eventStart > now) {
    const soon = w.eventStart.getTime() - now.getTime() < 45 * 86_400_000;
    if (soon) return r < 0.85 ? 'reserved' : r < 0.95 ? 'quoted' : 'draft';
    return r < 0.55 ? 'reserved' : r < 0.8 ? 'quoted' : r < 0.95 ? 'draft' : 'cancelled';
  }
  if (w.pickupEnd > now) return 'out';
  if (now.getTime() - w.pickupEnd.getTime() < 10 * 86_400_000) return r < 0.5 ? 'returned' : 'closed';
  return r < 0.965 ? 'closed' : 'cancelled';
}

interface Stock { tents: CatalogItem[]; byKind: Map<string, CatalogItem[]>; byName: Map<string, CatalogItem> }

function stockOf(items: CatalogItem[]): Stock {
  const byKind = new Map<string, CatalogItem[]>();
  for (const i of items) byKind.set(i.kind, [...(byKind.get(i.kind) ?? []), i]);
  return { tents: byKind.get('tent')!, byKind, byName: new Map(items.map((i) => [i.name, i])) };
}

type Draft = { item: CatalogItem | null; quantity: number; description?: string; fee?: boolean; priceCents?: number };

/** The lines an event of this size and kind needs, before the extras. */
function coreLines(rand: Rand, s: Stock, b: Pick<BenchBooking, 'guestCount' | 'seating' | 'afterDark' | 'anchoring'>, hasTent: boolean): Draft[] {
  const pick = <T,>(xs: T[]) => xs[Math.floor(rand() * xs.length)];
  const out: Draft[] = [];
  const g = b.guestCount;
  if (hasTent) {
    const need = g * (b.seating === 'standing' ? 6 : 10);
    const fits = s.tents.filter((t) => t.widthFt! * t.lengthFt! >= need);
    const area = (t: CatalogItem) => t.widthFt! * t.lengthFt!;
    const tent = fits.length ? pick(fits.sort((a, c) => area(a) - area(c)).slice(0, 4)) : s.tents[s.tents.length - 1];
    out.push({ item: tent, quantity: 1 });
    if (rand() < 0.4) {
      const wall = pick(s.byKind.get('sidewall')!);
      out.push({ item: wall, quantity: Math.max(2, Math.ceil((2 * (tent.widthFt! + tent.lengthFt!)) / wall.sectionLengthFt!)) });
    }
    if (b.anchoring === 'ballast') out.push({ item: s.byName.get('Water barrel ballast, 400 lb')!, quantity: Math.min(40, 4 + Math.ceil(tent.lengthFt! / 10) * 2) });
    out.push({ item: pick(s.byKind.get('service')!.slice(0, 3)), quantity: 1 });
    if (tent.widthFt! * tent.lengthFt! > 400 && rand() < 0.5) out.push({ item: s.byName.get('Tent permit filing')!, quantity: 1 });
  }
  if (b.seating !== 'standing') {
    const table = pick(s.byKind.get('table')!.filter((t) => (t.seats ?? 0) >= 6));
    const tables = Math.ceil(g / (table.seats ?? 8));
    out.push({ item: table, quantity: tables });
    out.push({ item: pick(s.byKind.get('chair')!.slice(0, 12)), quantity: b.seating === 'mixed' ? Math.ceil(g / 2) : g });
    const linens = s.byKind.get('accessory')!.filter((i) => i.name.startsWith('Linen,') && !i.name.includes('napkin'));
    out.push({ item: pick(linens), quantity: tables });
  }
  if (b.afterDark) out.push({ item: pick(s.byKind.get('lighting')!), quantity: 1 + Math.floor(rand() * 4) });
  return out;
}

function extraLine(rand: Rand, s: Stock, used: Set<string>, guests: number): Draft {
  // One line in sixty is typed by hand: a custom sign, a special request.
  if (rand() < 1 / 60) return { item: null, quantity: 1, description: rand() < 0.5 ? 'Custom welcome sign' : 'Special request: extra site visit', fee: true, priceCents: 2_500 + Math.floor(rand() * 20) * 500 };
  const pool = rand() < 0.8 ? s.byKind.get('accessory')! : rand() < 0.5 ? s.byKind.get('lighting')! : s.byKind.get('service')!;
  for (let tries = 0; tries < 20; tries++) {
    const item = pool[Math.floor(rand() * pool.length)];
    if (used.has(item.id)) continue;
    const per = item.kind === 'service' ? 1 : item.quantityOwned > 300 ? Math.max(1, Math.round(guests / (1 + rand() * 3))) : 1 + Math.floor(rand() * 8);
    return { item, quantity: Math.min(per, Math.max(1, item.quantityOwned || 1)) };
  }
  return { item: null, quantity: 1, description: 'Extra delivery stop', fee: true, priceCents: 5_000 };
}

/** How many lines each booking gets: 3 to 30, ten on average, summing to exactly `total`. */
function lineTargets(rand: Rand, minimums: number[], total: number): number[] {
  const n = minimums.map((min) => Math.max(min, Math.min(30, 3 + Math.round(-Math.log(1 - rand() * 0.999) * 7))));
  let sum = n.reduce((a, b) => a + b, 0);
  while (sum !== total) {
    const i = Math.floor(rand() * n.length);
    if (sum > total && n[i] > Math.max(3, minimums[i])) { n[i]--; sum--; }
    else if (sum < total && n[i] < 30) { n[i]++; sum++; }
  }
  return n;
}

export function benchBookings(rand: Rand, newId: () => string, opts: { items: CatalogItem[]; customers: BenchCustomer[]; zone: string; now: Date }): BenchBooking[] {
  const { zone, now } = opts;
  const s = stockOf(opts.items);
  const pick = <T,>(xs: readonly T[]) => xs[Math.floor(rand() * xs.length)];
  const inSeasons = BOOKING_COUNT - NEXT_SEASON;
  const plans = Array.from({ length: BOOKING_COUNT }, (_, i) => {
    const day = i < inSeasons
      ? eventDay(rand, FIRST_SEASON + Math.floor((i * SEASONS) / inSeasons), [...Array(12).keys()])
      : eventDay(rand, FIRST_SEASON + SEASONS, [0, 1, 2, 3, 4, 5, 6, 7, 8]);
    const w = windows(rand, day, zone, rand() < 0.08 ? 2 + Math.floor(rand() * 2) : 1);
    const surface = pick(['grass', 'grass', 'grass', 'grass', 'grass', 'grass', 'grass', 'gravel', 'asphalt', 'concrete', 'soil'] as const);
    const guestCount = Math.max(10, Math.min(600, Math.round(Math.exp(4.4 + 0.6 * (rand() + rand() + rand() - 1.5)))));
    const seating = pick(['banquet', 'banquet', 'banquet', 'mixed', 'rows', 'standing'] as const);
    const anchoring: 'stakes' | 'ballast' = surface === 'asphalt' || surface === 'concrete' ? 'ballast' : 'stakes';
    const b = { day, w, surface, anchoring, guestCount, seating, afterDark: rand() < 0.45, hasTent: rand() < 0.75 };
    return { ...b, core: coreLines(rand, s, b, b.hasTent) };
  });
  const targets = lineTargets(rand, plans.map((p) => p.core.length), LINE_COUNT);
  // The quote is made weeks or months before the event; references count up in that order.
  const quotedAt = plans.map((p) => {
    const lead = (10 + Math.floor(rand() ** 1.5 * 200)) * 86_400_000;
    return new Date(Math.min(now.getTime() - 3_600_000, p.w.eventStart.getTime() - lead));
  });
  const order = [...plans.keys()].sort((a, c) => quotedAt[a].getTime() - quotedAt[c].getTime());
  const bookings: BenchBooking[] = [];
  for (const [n, i] of order.entries()) {
    const p = plans[i];
    const customer = pick(opts.customers);
    const status = statusFor(rand, p.w, now);
    const id = newId();
    const used = new Set<string>();
    const drafts = [...p.core];
    for (const d of drafts) if (d.item) used.add(d.item.id);
    while (drafts.length < targets[i]) {
      const d = extraLine(rand, s, used, p.guestCount);
      if (d.item) used.add(d.item.id);
      drafts.push(d);
    }
    const days = Math.max(1, Math.round((p.w.eventEnd.getTime() - p.w.eventStart.getTime()) / 86_400_000) + 1);
    const lines: BenchLine[] = drafts.map((d, position) => ({
      id: newId(), bookingId: id, position, itemId: d.item?.id ?? null, description: d.item?.name ?? d.description!,
      quantity: d.quantity, unitPriceCents: d.item?.rentalPriceCents ?? d.priceCents!,
      extraDays: d.item && d.item.kind !== 'service' && days > 1 ? days - 1 : 0, extraDayPriceCents: d.item?.extraDayPriceCents ?? 0,
      discountBp: rand() < 0.03 ? 1000 : 0, discountCents: 0,
      taxable: d.item ? d.item.taxable : false, kind: d.fee || d.item?.kind === 'service' ? 'fee' : 'rental',
    }));
    const created = quotedAt[i];
    const reservedAt = new Date(Math.min(created.getTime() + Math.floor(rand() * 14) * 86_400_000, p.w.eventStart.getTime() - 3 * 86_400_000, now.getTime() - 60_000));
    const hasTent = p.core.some((d) => d.item?.kind === 'tent');
    const staked = hasTent && p.anchoring === 'stakes' && !['draft', 'quoted', 'cancelled'].includes(status);
    const closedAt = new Date(Math.min(p.w.pickupEnd.getTime() + (2 + Math.floor(rand() * 8)) * 86_400_000, now.getTime() - 60_000));
    const waiver = rand() < 0.7;
    bookings.push({
      id, reference: `B-${1001 + n}`, status, customer, eventDay: p.day, ...p.w,
      siteLine1: rand() < 0.7 ? customer.billingLine1 : `${10 + Math.floor(rand() * 990)} Fairground Road`, siteCity: customer.billingCity,
      siteRegion: customer.billingRegion, sitePostalCode: customer.billingPostalCode,
      siteNotes: `${pick(OCCASIONS)}. ${p.anchoring === 'ballast' ? 'Hard surface: ballast, no stakes.' : 'Lawn; truck reaches the side gate.'}`,
      surface: p.surface, anchoring: p.anchoring,
      utilityLocateNumber: staked ? `WC-${p.day.replace(/-/g, '')}-${n}` : '', utilityLocateDate: staked ? addDays(p.day, -7) : null,
      guestCount: p.guestCount, seating: p.seating, afterDark: p.afterDark,
      deliveryMiles: rand() < 0.03 ? null : Math.round((1 + rand() * 55) * 10) / 10,
      setupLaborCents: hasTent && rand() < 0.3 ? 10_000 + Math.floor(rand() * 9) * 5_000 : 0,
      discountBp: rand() < 0.1 ? pick([500, 1000]) : 0, discountCents: 0,
      damageWaiver: waiver, ownInsurance: !waiver && rand() < 0.15,
      // The county raised its sales tax in 2024: two rates in the books.
      taxRateBp: p.day < '2024-01-01' ? 700 : 725,
      securityDepositCents: hasTent ? pick([10_000, 25_000, 50_000]) : rand() < 0.2 ? 5_000 : 0,
      notes: status === 'cancelled' ? 'Cancelled: the customer changed plans.' : '',
      totalCents: 0,
      createdAt: created, reservedAt,
      updatedAt: ['closed', 'returned'].includes(status) ? closedAt : status === 'out' ? new Date(Math.min(p.w.deliveryEnd.getTime(), now.getTime() - 60_000)) : reservedAt,
      lines,
    });
  }
  return bookings;
}
