import { z } from 'zod';
import { Bp, Cents, TaxRateBp } from './common';

export const SEATING_STYLES = ['banquet', 'rows', 'standing', 'mixed'] as const;
export type SeatingStyle = (typeof SEATING_STYLES)[number];

export const DeliveryBand = z.object({
  upToMiles: z.number({ error: 'Enter the distance.' }).positive('The distance must be above 0.').max(1000),
  feeCents: Cents,
});
export type DeliveryBand = z.infer<typeof DeliveryBand>;

/**
 * A company's own numbers for sizing, pricing and availability. Every default names its source;
 * the owner changes them in Company settings (states amend the fire code; prices are the company's).
 */
export const CompanyRules = z.object({
  /** Sales tax rate for new bookings. Default 0: the owner must set the local rate. */
  taxRateBp: TaxRateBp.default(0),
  /** Deposit asked at signing, share of the total. Default 30%: common practice, no published source. */
  depositBp: Bp.default(3000),
  /** The smallest deposit. Default $100: common practice, no published source. */
  depositMinCents: Cents.default(10_000),
  /** The balance is due this many days before the event. Default 7: common practice, no published source. */
  balanceDueDays: z.number().int().min(0).max(120).default(7),
  /** Damage waiver, share of the rental lines. Default 10%: common practice, no published source. */
  damageWaiverBp: Bp.default(1000),
  /** Whether the damage waiver is taxed (varies by state). */
  damageWaiverTaxable: z.boolean().default(true),
  /** Whether delivery is taxed (varies by state). */
  deliveryTaxable: z.boolean().default(false),
  /** Delivery fee by distance band, nearest first. */
  deliveryBands: z
    .array(DeliveryBand)
    .max(20)
    .default([
      { upToMiles: 10, feeCents: 7_500 },
      { upToMiles: 25, feeCents: 12_500 },
      { upToMiles: 50, feeCents: 20_000 },
    ]),
  /** Hours an item stays unavailable after pickup (cleaning, drying canvas). Default 24: common practice. */
  turnaroundHours: z.number().int().min(0).max(24 * 14).default(24),
  /** Tents above this area need a permit: IFC 2018 §3103.2 (400 sq ft); states amend it. */
  permitAreaSqFt: z.number().int().min(0).max(100_000).default(400),
  /** Tents open on all sides need one only above this area: IFC 2018 §3103.2 exception (700 sq ft). */
  permitOpenSidedAreaSqFt: z.number().int().min(0).max(100_000).default(700),
  /**
   * Floor area planned per guest when sizing a tent. banquet 8: a 20x20 seats about 50 and a
   * 20x30 about 75 (common practice, no published source); rows 6 and mixed 8: common practice;
   * standing 5: IFC 2018 Table 1004.5, standing space.
   */
  sqFtPerGuest: z
    .object({
      banquet: z.number().positive().max(100),
      rows: z.number().positive().max(100),
      standing: z.number().positive().max(100),
      mixed: z.number().positive().max(100),
    })
    .default({ banquet: 8, rows: 6, standing: 5, mixed: 8 }),
  /** Seats at one banquet table when the table item does not say (8-ft: 4 a side and 1 at each end; common practice). */
  seatsPerBanquetTable: z.number().int().min(1).max(30).default(10),
  /** Invoice numbers read PREFIX-YEAR-NUMBER, e.g. INV-2027-0001. */
  invoicePrefix: z.string().trim().min(1).max(8).regex(/^[A-Z0-9]+$/, 'Use capital letters and digits.').default('INV'),
  /** Reminders by e-mail, each sent once; the company turns each off here. Days are common practice, no published source. */
  reminders: z
    .object({
      balanceDue: z.boolean(),
      balanceDueDaysBefore: z.number().int().min(0).max(60),
      overdue: z.boolean(),
      unsignedAgreement: z.boolean(),
      unsignedAfterDays: z.number().int().min(1).max(60),
    })
    .default({ balanceDue: true, balanceDueDaysBefore: 3, overdue: true, unsignedAgreement: true, unsignedAfterDays: 3 }),
  /** A signing link works this many days. Default 14: common practice, no published source. */
  signingLinkDays: z.number().int().min(1).max(90).default(14),
  /** The customer can download the signed copy from the link this many days. Default 90: common practice. */
  signedCopyDays: z.number().int().min(1).max(3650).default(90),
  /** Take tents down or evacuate at this sustained wind speed unless the manufacturer says lower (common practice, no published source). */
  windLimitMph: z.number().int().min(10).max(150).default(40),
  /**
   * Nobody stays inside a tent at or above this sustained wind speed. Default 30 mph: a
   * trade-association magazine's guidance that above 30–38 mph it is too hazardous to stay inside
   * a tent (the source); the manufacturer's rating comes first when lower.
   */
  occupiedWindLimitMph: z.number().int().min(10).max(150).default(30),
});
export type CompanyRules = z.infer<typeof CompanyRules>;
export const DEFAULT_RULES: CompanyRules = CompanyRules.parse({});

/**
 * The rules that size and run the work (turnaround, permits, floor area per guest, seats, wind):
 * what a role that sees no prices reads. Listed one by one, so a new rule stays out of their
 * answer until someone decides it carries no money.
 */
export const PLANNING_RULE_KEYS = [
  'turnaroundHours', 'permitAreaSqFt', 'permitOpenSidedAreaSqFt', 'sqFtPerGuest', 'seatsPerBanquetTable', 'windLimitMph', 'occupiedWindLimitMph',
] as const satisfies readonly (keyof CompanyRules)[];
export type PlanningRules = Pick<CompanyRules, (typeof PLANNING_RULE_KEYS)[number]>;
