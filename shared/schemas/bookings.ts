import { z } from 'zod';
import { Bp, Cents, Id, Instant, TaxRateBp } from './common';
import type { QuoteResult } from './quote';
import { SEATING_STYLES } from './rules';

export const BOOKING_STATUSES = ['draft', 'quoted', 'reserved', 'out', 'returned', 'closed', 'cancelled'] as const;
export type BookingStatus = (typeof BOOKING_STATUSES)[number];
export const BOOKING_STATUS_LABELS: Record<BookingStatus, string> = {
  draft: 'Draft',
  quoted: 'Quoted',
  reserved: 'Reserved',
  out: 'Out',
  returned: 'Returned',
  closed: 'Closed',
  cancelled: 'Cancelled',
};
/** Which status may follow which. */
export const BOOKING_TRANSITIONS: Record<BookingStatus, BookingStatus[]> = {
  draft: ['quoted', 'reserved', 'cancelled'],
  quoted: ['draft', 'reserved', 'cancelled'],
  reserved: ['quoted', 'out', 'cancelled'],
  out: ['returned'],
  returned: ['closed'],
  closed: [],
  cancelled: [],
};
/** Statuses whose lines hold stock. */
export const HOLDING_STATUSES: BookingStatus[] = ['reserved', 'out'];

export const SURFACES = ['grass', 'soil', 'gravel', 'asphalt', 'concrete'] as const;
export const ANCHORING = ['stakes', 'ballast'] as const;

export const BookingLineInput = z.object({
  /** A catalog item, or null for a free-text line. */
  itemId: Id.nullable().default(null),
  description: z.string({ error: 'Describe the line.' }).trim().min(1, 'Describe the line.').max(200),
  quantity: z.number({ error: 'Enter a quantity.' }).int('Quantities are whole.').min(1, 'At least 1.').max(100_000),
  unitPriceCents: Cents,
  extraDays: z.number().int().min(0, 'Extra days cannot be negative.').max(365).default(0),
  extraDayPriceCents: Cents.default(0),
  discountBp: Bp.default(0),
  discountCents: Cents.default(0),
  taxable: z.boolean().default(true),
  kind: z.enum(['rental', 'fee']).default('rental'),
});
export type BookingLineInput = z.input<typeof BookingLineInput>;

const text = (max: number) => z.string().trim().max(max, `Use at most ${max} characters.`).default('');

const BookingFields = z.object({
  customerId: Id,
  eventStart: Instant,
  eventEnd: Instant,
  deliveryStart: Instant,
  deliveryEnd: Instant,
  pickupStart: Instant,
  pickupEnd: Instant,
  siteLine1: text(160),
  siteLine2: text(160),
  siteCity: text(80),
  siteRegion: text(80),
  sitePostalCode: text(20),
  /** Gate width, slope, where vehicles may drive... */
  siteNotes: text(4000),
  surface: z.enum(SURFACES, { error: 'Choose the ground: grass, soil, gravel, asphalt or concrete.' }).default('grass'),
  anchoring: z.enum(ANCHORING, { error: 'Choose stakes or ballast.' }).default('stakes'),
  utilityLocateNumber: text(60),
  utilityLocateDate: z.iso.date({ error: 'Enter the date as YYYY-MM-DD.' }).nullable().default(null),
  guestCount: z.number().int().min(0, 'Guests cannot be negative.').max(100_000).default(0),
  seating: z.enum(SEATING_STYLES, { error: 'Choose banquet, rows, standing or mixed.' }).default('banquet'),
  afterDark: z.boolean().default(false),
  deliveryMiles: z.number().min(0, 'Distance cannot be negative.').max(1000).nullable().default(null),
  setupLaborCents: Cents.default(0),
  discountBp: Bp.default(0),
  discountCents: Cents.default(0),
  damageWaiver: z.boolean().default(true),
  ownInsurance: z.boolean().default(false),
  /** Null: the company's current rate. */
  taxRateBp: TaxRateBp.nullable().default(null),
  securityDepositCents: Cents.default(0),
  notes: text(4000),
  lines: z.array(BookingLineInput).max(500, 'At most 500 lines.').default([]),
});

function checkOrder(v: z.output<typeof BookingFields>, ctx: z.RefinementCtx) {
  const t = (s: unknown) => (typeof s === 'string' ? new Date(s).getTime() : NaN);
  const rule = (a: keyof typeof v, b: keyof typeof v, path: string, message: string) => {
    if (t(v[b]) < t(v[a])) ctx.addIssue({ code: 'custom', path: [path], message });
  };
  rule('eventStart', 'eventEnd', 'eventEnd', 'The event cannot end before it starts.');
  rule('deliveryStart', 'deliveryEnd', 'deliveryEnd', 'The delivery window cannot end before it starts.');
  rule('pickupStart', 'pickupEnd', 'pickupEnd', 'The pickup window cannot end before it starts.');
  rule('deliveryStart', 'pickupStart', 'pickupStart', 'Pickup cannot be before delivery.');
  rule('deliveryStart', 'eventStart', 'deliveryStart', 'Delivery must start before the event does.');
  rule('eventEnd', 'pickupEnd', 'pickupEnd', 'Pickup must end after the event does.');
}

// Runs even when other fields failed, so one answer names every problem.
export const BookingInput = BookingFields.superRefine(checkOrder, { when: () => true });
export type BookingInput = z.input<typeof BookingInput>;
export type BookingValues = z.output<typeof BookingInput>;

export const BookingStatusChange = z.object({
  status: z.enum(BOOKING_STATUSES, { error: 'Unknown status.' }),
  /** Why (a cancellation reason, say); kept in the audit log. */
  note: z.string().trim().max(500).default(''),
});
export type BookingStatusChange = z.input<typeof BookingStatusChange>;

export const BookingListQuery = z.object({
  page: z.coerce.number().int().min(1, 'Pages start at 1.').default(1),
  pageSize: z.coerce.number().int().min(1).max(500, 'At most 500 a page.').default(50),
  status: z
    .string()
    .optional()
    .transform((s) => (s ? s.split(',').filter(Boolean) : undefined))
    .pipe(z.array(z.enum(BOOKING_STATUSES, { error: 'Unknown status.' })).optional()),
  from: z.iso.datetime({ offset: true, error: 'Give from as an ISO date-time.' }).optional(),
  to: z.iso.datetime({ offset: true, error: 'Give to as an ISO date-time.' }).optional(),
  customerId: z.uuid().optional(),
  q: z.string().trim().max(100).optional(),
});
export type BookingListQuery = z.infer<typeof BookingListQuery>;

export interface BookingLineRow {
  id: string;
  position: number;
  itemId: string | null;
  itemKind: string | null;
  description: string;
  quantity: number;
  unitPriceCents: number;
  extraDays: number;
  extraDayPriceCents: number;
  discountBp: number;
  discountCents: number;
  taxable: boolean;
  kind: 'rental' | 'fee';
  /** For catalog items: the fewest free over the booking's window, not counting this booking. */
  available: number | null;
  shortfall: number;
}

export interface BookingRow {
  id: string;
  reference: string;
  status: BookingStatus;
  customer: { id: string; name: string; email: string; phone: string; taxExempt: boolean };
  eventStart: string;
  eventEnd: string;
  deliveryStart: string;
  deliveryEnd: string;
  pickupStart: string;
  pickupEnd: string;
  siteLine1: string;
  siteLine2: string;
  siteCity: string;
  siteRegion: string;
  sitePostalCode: string;
  siteNotes: string;
  surface: (typeof SURFACES)[number];
  anchoring: (typeof ANCHORING)[number];
  utilityLocateNumber: string;
  utilityLocateDate: string | null;
  guestCount: number;
  seating: (typeof SEATING_STYLES)[number];
  afterDark: boolean;
  deliveryMiles: number | null;
  setupLaborCents: number;
  discountBp: number;
  discountCents: number;
  damageWaiver: boolean;
  ownInsurance: boolean;
  taxRateBp: number;
  securityDepositCents: number;
  notes: string;
  currency: string;
  lines: BookingLineRow[];
  /** The quote totals (null for roles that see no prices). */
  totals: QuoteResult | null;
  createdAt: string;
  updatedAt: string;
  can: { update: boolean; changeStatus: BookingStatus[]; seePrices: boolean; issueDocuments: boolean; readDocuments: boolean };
}

/**
 * A row of GET /api/bookings: what the lists, the calendar and the booking picker show. The
 * booking with its lines, quote and permissions is GET /api/bookings/:id.
 */
export interface BookingListRow {
  id: string;
  reference: string;
  status: BookingStatus;
  customer: { id: string; name: string };
  eventStart: string;
  eventEnd: string;
  siteLine1: string;
  siteCity: string;
  guestCount: number;
  currency: string;
  /** The booking's stored quote total; null for roles that see no prices. */
  totalCents: number | null;
}

/** A 409 on reserving: which items are short and by how many. */
export interface ShortfallDetail {
  itemId: string;
  name: string;
  requested: number;
  available: number;
  shortfall: number;
}
