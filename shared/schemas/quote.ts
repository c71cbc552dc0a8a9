import { z } from 'zod';
import { Bp, Cents, DateOnly, TaxRateBp } from './common';

export const QuoteLineInput = z.object({
  description: z.string({ error: 'Describe the line.' }).trim().min(1, 'Describe the line.').max(200),
  quantity: z.number({ error: 'Enter a quantity.' }).int('Quantities are whole.').min(0, 'Quantities cannot be negative.').max(100_000),
  unitPriceCents: Cents,
  /** Days beyond the first, each at extraDayPriceCents a unit. */
  extraDays: z.number().int().min(0, 'Extra days cannot be negative.').max(365).default(0),
  extraDayPriceCents: Cents.default(0),
  /** A line discount: a percentage, or an amount, or neither. */
  discountBp: Bp.default(0),
  discountCents: Cents.default(0),
  taxable: z.boolean().default(true),
  /** rental: counts toward the damage waiver; fee: delivery, set-up, labor. */
  kind: z.enum(['rental', 'fee']).default('rental'),
});
export type QuoteLineInput = z.input<typeof QuoteLineInput>;
export type QuoteLine = z.output<typeof QuoteLineInput>;

/** POST /api/quotes/preview, and the pricing part of a booking. */
export const QuoteRequest = z.object({
  lines: z.array(QuoteLineInput).max(500, 'At most 500 lines.'),
  taxRateBp: TaxRateBp,
  /** The customer is tax exempt (certificate on file). */
  taxExempt: z.boolean().default(false),
  /** A booking discount over all lines, as a percentage or an amount. */
  discountBp: Bp.default(0),
  discountCents: Cents.default(0),
  /** Delivery distance; the fee comes from the company's bands. Null: customer pickup. */
  deliveryMiles: z.number().min(0).max(1000).nullable().default(null),
  deliveryBands: z.array(z.object({ upToMiles: z.number().positive(), feeCents: Cents })).default([]),
  deliveryTaxable: z.boolean().default(false),
  /** Set-up and take-down labor as one amount. */
  setupLaborCents: Cents.default(0),
  setupLaborTaxable: z.boolean().default(false),
  damageWaiverBp: Bp.default(0),
  damageWaiverTaxable: z.boolean().default(true),
  /** The customer shows their own insurance: no damage waiver. */
  ownInsurance: z.boolean().default(false),
  depositBp: Bp.default(0),
  depositMinCents: Cents.default(0),
  securityDepositCents: Cents.default(0),
  balanceDueDays: z.number().int().min(0).max(120).default(7),
  /** When the agreement is signed (today for a preview) and the event's first day. */
  signingDate: DateOnly.optional(),
  eventDate: DateOnly.optional(),
});
export type QuoteRequest = z.input<typeof QuoteRequest>;
export type QuoteInput = z.output<typeof QuoteRequest>;

export interface QuoteLineResult {
  description: string;
  quantity: number;
  kind: 'rental' | 'fee';
  taxable: boolean;
  /** quantity x (unit + extra days x extra-day price), before discounts. */
  grossCents: number;
  lineDiscountCents: number;
  /** This line's share of the booking discount. */
  bookingDiscountCents: number;
  netCents: number;
}

export interface ScheduleEntry {
  kind: 'deposit' | 'balance' | 'security_deposit';
  /** YYYY-MM-DD, or null when no dates were given. */
  dueDate: string | null;
  amountCents: number;
  label: string;
}

export interface QuoteResult {
  lines: QuoteLineResult[];
  rentalCents: number;
  feesCents: number;
  discountCents: number;
  deliveryCents: number;
  setupLaborCents: number;
  damageWaiverCents: number;
  /** Everything before tax: lines after discounts, delivery, labor, damage waiver. */
  subtotalCents: number;
  taxableCents: number;
  taxRateBp: number;
  taxCents: number;
  totalCents: number;
  depositCents: number;
  balanceCents: number;
  /** Refundable, never taxed, not revenue; outside totalCents. */
  securityDepositCents: number;
  /** totalCents + securityDepositCents. */
  dueCents: number;
  schedule: ScheduleEntry[];
}
