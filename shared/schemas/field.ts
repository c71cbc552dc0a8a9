/**
 * Field operations: day sheets, load lists, the site checklist, delivery marks, photos and the
 * return check-in. Every answer here is read by the crew, so none carries a price or an amount;
 * the proposed damage charges are the office's own shapes at the end of this file.
 */
import { z } from 'zod';
import type { LoadList } from '../loadList';
import type { SiteSafety } from '../siteSafety';
import { Cents, DateOnly, Id } from './common';
import type { BookingStatus } from './bookings';
import type { ItemKind } from './items';
import type { SeatingStyle } from './rules';

const text = (max: number) => z.string({ error: 'Enter text.' }).trim().max(max, `Use at most ${max} characters.`).default('');

export const DayParams = z.object({ date: DateOnly });
export type DayParams = z.infer<typeof DayParams>;

export const BookingIdParams = z.object({ bookingId: Id });

/** PUT /api/field/bookings/:bookingId/crew (office): who goes out on this booking. */
export const CrewAssignmentInput = z.object({
  userIds: z.array(Id, { error: 'Choose the crew.' }).max(20, 'At most 20 people on one booking.').default([]),
});
export type CrewAssignmentInput = z.input<typeof CrewAssignmentInput>;

export const PRIVATE_LINES = ['not_asked', 'none', 'marked'] as const;
export type PrivateLines = (typeof PRIVATE_LINES)[number];
export const PRIVATE_LINES_LABELS: Record<PrivateLines, string> = {
  not_asked: 'Not asked yet',
  none: 'Customer says there are none',
  marked: 'Customer showed them; marked',
};

const Feet = z.number({ error: 'Enter feet.' }).min(0, 'Cannot be negative.').max(10_000, 'At most 10,000 ft.').nullable().default(null);

/** PUT /api/field/bookings/:bookingId/site-check: the checklist as the crew fills it in. */
export const SiteCheckInput = z.object({
  locateRequested: z.boolean().default(false),
  locateRequestedOn: DateOnly.nullable().default(null),
  /** The one-call center's ticket number. */
  locateNumber: text(60),
  hardSurfaceBallast: z.boolean().default(false),
  privateLines: z.enum(PRIVATE_LINES, { error: 'Say whether the customer showed private lines.' }).default('not_asked'),
  privateLinesNotes: text(1000),
  buildingClearanceFt: Feet,
  lotLineClearanceFt: Feet,
  /** Sustained wind measured or forecast at set-up. */
  windMph: z.number({ error: 'Enter the wind in mph.' }).int('Use whole mph.').min(0, 'Cannot be negative.').max(200).nullable().default(null),
  exitsPlanned: z.boolean().default(false),
  notes: text(2000),
});
export type SiteCheckInput = z.input<typeof SiteCheckInput>;

export const FIELD_MARKS = ['delivered', 'set_up'] as const;
export type FieldMark = (typeof FIELD_MARKS)[number];
export const FieldMarkInput = z.object({ mark: z.enum(FIELD_MARKS, { error: 'Choose delivered or set up.' }) });

export const PHOTO_STAGES = ['site', 'delivered', 'set_up', 'return', 'damage'] as const;
export type PhotoStage = (typeof PHOTO_STAGES)[number];
export const PHOTO_STAGE_LABELS: Record<PhotoStage, string> = {
  site: 'Site',
  delivered: 'Delivered',
  set_up: 'Set up',
  return: 'Pickup',
  damage: 'Damage',
};
/** Photos: the content decides the type; a phone camera picture fits well under 10 MB. */
export const PHOTO_MAX_BYTES = 10 * 1024 * 1024;
// What the server can decode to check and fit a photo (sharp's prebuilt libvips reads no HEIC; phones
// hand a browser a JPEG copy of one).
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp', 'image/avif'] as const;

/** What a photo shows, in the upload's query string (so every value arrives as text). */
export const PhotoFields = z.object({
  stage: z.enum(PHOTO_STAGES, { error: 'Say what the photo shows: site, delivered, set up, pickup or damage.' }),
  /** For a damage photo: the return line (catalog item id, or text: and the description). */
  lineKey: z.string().trim().max(260).default(''),
  caption: text(200),
});

/** One line of the return check-in: what came back of what went out. */
export const ReturnLineInput = z.object({
  key: z.string({ error: 'Unknown line.' }).min(1).max(260),
  returned: z.number({ error: 'Enter how many came back.' }).int('Use a whole number.').min(0, 'Cannot be negative.').max(100_000),
  damaged: z.number({ error: 'Enter how many are damaged.' }).int('Use a whole number.').min(0, 'Cannot be negative.').max(100_000).default(0),
  notes: text(1000),
});

/** PUT /api/field/bookings/:bookingId/return-check: saves the count; `submit` finishes the check-in. */
export const ReturnCheckInput = z.object({
  lines: z.array(ReturnLineInput).max(500),
  notes: text(2000),
  submit: z.boolean().default(false),
});
export type ReturnCheckInput = z.input<typeof ReturnCheckInput>;

// --- answers (no money) -------------------------------------------------------------------

export interface CrewMember {
  id: string;
  name: string;
  role: 'owner' | 'office' | 'crew';
}

export interface StopItem {
  itemId: string | null;
  name: string;
  kind: ItemKind | null;
  quantity: number;
}

export interface FieldSite {
  line1: string;
  line2: string;
  city: string;
  region: string;
  postalCode: string;
  /** One line for a label and for the map link. */
  address: string;
  /** A geo: URI (RFC 5870) with the address as its query: phones open their map app with it. */
  mapUrl: string | null;
  notes: string;
  surface: 'grass' | 'soil' | 'gravel' | 'asphalt' | 'concrete';
  anchoring: 'stakes' | 'ballast';
}

export interface StopProgress {
  readyToStakeAt: string | null;
  deliveredAt: string | null;
  setUpAt: string | null;
  checkedInAt: string | null;
}

export interface FieldStop {
  bookingId: string;
  reference: string;
  status: BookingStatus;
  stop: 'delivery' | 'pickup';
  windowStart: string;
  windowEnd: string;
  eventStart: string;
  eventEnd: string;
  customer: { name: string; phone: string };
  site: FieldSite;
  guestCount: number;
  seating: SeatingStyle;
  afterDark: boolean;
  items: StopItem[];
  crew: CrewMember[];
  /** The signed-in user is on this booking's crew. */
  mine: boolean;
  progress: StopProgress;
}

export interface DaySheet {
  date: string;
  timeZone: string;
  stops: FieldStop[];
  loadList: LoadList;
}

export interface PhotoRow {
  id: string;
  stage: PhotoStage;
  lineKey: string;
  caption: string;
  contentType: string;
  size: number;
  uploadedBy: string;
  createdAt: string;
  url: string;
  /** The viewer may take it off (taken by mistake; fieldPolicy.removePhoto). */
  canRemove: boolean;
}

export interface SiteCheckRow {
  locateRequested: boolean;
  locateRequestedOn: string | null;
  locateNumber: string;
  hardSurfaceBallast: boolean;
  privateLines: PrivateLines;
  privateLinesNotes: string;
  buildingClearanceFt: number | null;
  lotLineClearanceFt: number | null;
  windMph: number | null;
  exitsPlanned: boolean;
  notes: string;
  readyToStake: { ready: boolean; reason: string | null };
  updatedAt: string | null;
  updatedBy: string | null;
}

export interface ReturnLineRow {
  key: string;
  itemId: string | null;
  description: string;
  kind: ItemKind | null;
  sent: number;
  returned: number;
  damaged: number;
  missing: number;
  notes: string;
}

export interface ReturnCheckRow {
  lines: ReturnLineRow[];
  notes: string;
  submittedAt: string | null;
  submittedBy: string | null;
  savedAt: string | null;
}

export interface FieldBooking {
  delivery: FieldStop;
  pickup: FieldStop;
  siteCheck: SiteCheckRow;
  safety: SiteSafety;
  photos: PhotoRow[];
  returnCheck: ReturnCheckRow;
  timeZone: string;
  can: {
    work: boolean;
    markDelivered: boolean;
    markSetUp: boolean;
    checkIn: boolean;
    assignCrew: boolean;
    reviewCharges: boolean;
  };
}

export interface CalendarFeedState {
  active: boolean;
  createdAt: string | null;
  lastUsedAt: string | null;
}

/** The feed's address is shown once, when it is made; only its hash is kept. */
export interface CalendarFeedCreated extends CalendarFeedState {
  url: string;
}

// --- the office: proposed charges --------------------------------------------------------

export const CHARGE_KINDS = ['missing', 'damage'] as const;
export type ChargeKind = (typeof CHARGE_KINDS)[number];

export interface ProposedChargeLine {
  key: string;
  itemId: string | null;
  description: string;
  missing: number;
  damaged: number;
  notes: string;
  replacementValueCents: number;
  /** What the office is offered: missing units at replacement value; damaged ones at replacement value until a repair amount is entered. */
  proposed: { charge: ChargeKind; quantity: number; description: string; amountCents: number }[];
}

export interface ProposedCharges {
  bookingId: string;
  reference: string;
  currency: string;
  submittedAt: string | null;
  lines: ProposedChargeLine[];
  invoice: { id: string; number: string | null; status: string; totalCents: number } | null;
  securityDepositHeldCents: number;
  can: { createInvoice: boolean };
}

/** POST /api/field/bookings/:bookingId/charges (office): the amounts as reviewed. */
export const ChargesInput = z.object({
  lines: z
    .array(
      z.object({
        key: z.string().min(1).max(260),
        charge: z.enum(CHARGE_KINDS, { error: 'Choose missing or damage.' }),
        description: z.string({ error: 'Describe the charge.' }).trim().min(1, 'Describe the charge.').max(200, 'Use at most 200 characters.'),
        amountCents: Cents.refine((n) => n > 0, 'Enter an amount above zero.'),
      }),
    )
    .min(1, 'Keep at least one charge, or leave the invoice unmade.')
    .max(200),
});
export type ChargesInput = z.input<typeof ChargesInput>;
