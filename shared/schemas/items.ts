import { z } from 'zod';
import { Cents } from './common';

export const ITEM_KINDS = ['tent', 'sidewall', 'table', 'chair', 'lighting', 'accessory', 'service'] as const;
export type ItemKind = (typeof ITEM_KINDS)[number];
export const ITEM_KIND_LABELS: Record<ItemKind, string> = {
  tent: 'Tent',
  sidewall: 'Sidewall',
  table: 'Table',
  chair: 'Chair',
  lighting: 'Lighting',
  accessory: 'Accessory',
  service: 'Service or fee',
};
export const TENT_TYPES = ['pole', 'frame'] as const;
export const SERVICE_TYPES = ['delivery', 'setup', 'takedown', 'other'] as const;

const Feet = z.number({ error: 'Enter feet.' }).positive('Must be above 0.').max(1000, 'At most 1,000 ft.');
const Count = z.number({ error: 'Enter a whole number.' }).int('Use a whole number.').min(0, 'Cannot be negative.').max(1_000_000);

/** An item of stock (or a service/fee line) as the owner edits it. */
export const ItemInput = z
  .object({
    name: z.string({ error: 'Enter a name.' }).trim().min(1, 'Enter a name.').max(120, 'Use at most 120 characters.'),
    kind: z.enum(ITEM_KINDS, { error: 'Choose a kind: tent, sidewall, table, chair, lighting, accessory or service.' }),
    sku: z.string().trim().max(40, 'Use at most 40 characters.').default(''),
    description: z.string().trim().max(2000, 'Use at most 2,000 characters.').default(''),
    quantityOwned: Count.default(0),
    rentalPriceCents: Cents,
    extraDayPriceCents: Cents.default(0),
    replacementValueCents: Cents.default(0),
    purchaseCostCents: Cents.default(0),
    taxable: z.boolean().default(true),
    active: z.boolean().default(true),
    // Kind-specific measurements; required where the kind needs them.
    tentType: z.enum(TENT_TYPES, { error: 'Choose pole or frame.' }).nullable().default(null),
    widthFt: Feet.nullable().default(null),
    lengthFt: Feet.nullable().default(null),
    heightFt: Feet.nullable().default(null),
    sectionLengthFt: Feet.nullable().default(null),
    seats: Count.nullable().default(null),
    polesPerSetup: Count.nullable().default(null),
    stakesPerSetup: Count.nullable().default(null),
    ballastPerSetupLbs: Count.nullable().default(null),
    serviceType: z.enum(SERVICE_TYPES).nullable().default(null),
  })
  .superRefine((v, ctx) => {
    const need = (field: keyof typeof v, message: string) => {
      if (v[field] === null || v[field] === undefined) ctx.addIssue({ code: 'custom', path: [field], message });
    };
    if (v.kind === 'tent') {
      need('tentType', 'Choose pole or frame.');
      need('widthFt', 'Enter the tent width in feet.');
      need('lengthFt', 'Enter the tent length in feet.');
    }
    if (v.kind === 'sidewall') {
      need('sectionLengthFt', 'Enter the section length in feet.');
      need('heightFt', 'Enter the sidewall height in feet.');
    }
    if (v.kind === 'table') {
      need('lengthFt', 'Enter the table length in feet.');
      need('seats', 'Enter how many guests the table seats.');
    }
    if (v.kind === 'service') need('serviceType', 'Choose delivery, set-up, take-down or other.');
    if (v.kind === 'tent' && typeof v.widthFt === 'number' && typeof v.lengthFt === 'number' && v.widthFt > v.lengthFt) {
      ctx.addIssue({ code: 'custom', path: ['widthFt'], message: 'Give the shorter side as the width.' });
    }
    // Run even when other fields failed, so one pass names every missing measurement.
  }, { when: () => true });
export type ItemInput = z.input<typeof ItemInput>;
export type ItemValues = z.output<typeof ItemInput>;

export const ItemListQuery = z.object({
  page: z.coerce.number().int().min(1, 'Pages start at 1.').default(1),
  pageSize: z.coerce.number().int().min(1).max(500, 'At most 500 a page.').default(100),
  q: z.string().trim().max(100).optional(),
  kind: z.enum(ITEM_KINDS, { error: 'Unknown kind.' }).optional(),
  active: z.enum(['true', 'false', 'all']).default('true'),
  sort: z.enum(['name', 'kind', 'quantityOwned', 'rentalPriceCents', 'updatedAt']).default('name'),
  dir: z.enum(['asc', 'desc']).default('asc'),
});
export type ItemListQuery = z.infer<typeof ItemListQuery>;

export interface ItemRow extends ItemValues {
  id: string;
  createdAt: string;
  updatedAt: string;
  /** Crew see no prices: these are null for roles that may not see them. */
  can: { update: boolean; seePrices: boolean };
}

export interface ImportReport {
  /** Rows read (without the header). */
  rows: number;
  created: number;
  rejected: { line: number; sku: string; name: string; errors: Record<string, string> }[];
  dryRun: boolean;
}

export const AvailabilityQuery = z
  .object({
    from: z.iso.datetime({ offset: true, error: 'Give from as an ISO date-time.' }),
    to: z.iso.datetime({ offset: true, error: 'Give to as an ISO date-time.' }),
    excludeBookingId: z.uuid().optional(),
  })
  .refine((v) => new Date(v.to) > new Date(v.from), { path: ['to'], message: 'The end must be after the start.' })
  .refine((v) => new Date(v.to).getTime() - new Date(v.from).getTime() <= 400 * 86_400_000, {
    path: ['to'],
    message: 'Ask for at most 400 days at a time.',
  });
export type AvailabilityQuery = z.infer<typeof AvailabilityQuery>;

export interface ItemAvailability {
  itemId: string;
  name: string;
  quantityOwned: number;
  from: string;
  to: string;
  /** The fewest free at any moment in the window. */
  free: number;
  /** Per calendar day in the company's time zone: the most units out that day and what is left. */
  days: { date: string; reserved: number; free: number }[];
  /** Bookings that hold this item in the window (with the turnaround buffer). */
  holds: { bookingId: string; reference: string; status: string; quantity: number; start: string; end: string }[];
}
