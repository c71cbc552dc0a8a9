import type { BookingRow } from '@shared/schemas/bookings';
import type { ItemRow } from '@shared/schemas/items';
import type { QuoteRequest } from '@shared/schemas/quote';
import type { CompanyRules, SeatingStyle } from '@shared/schemas/rules';
import { bpToPercentInput, centsToInput, collector, numberToInput, parseDecimal, parseDollars, parsePercent, parseWhole } from '@/lib/amounts';
import { isoToZonedInput, zonedDate, zonedInputToIso } from '@/lib/zoned-time';

/** One line as typed: amounts in dollars, percentages in percent. */
export interface LineState {
  /** A key for React; not sent. */
  key: string;
  itemId: string;
  description: string;
  quantity: string;
  unitPrice: string;
  extraDays: string;
  extraDayPrice: string;
  discountPercent: string;
  discountAmount: string;
  taxable: boolean;
  kind: 'rental' | 'fee';
}

export interface BookingState {
  customerId: string;
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
  surface: string;
  anchoring: string;
  utilityLocateNumber: string;
  utilityLocateDate: string;
  guestCount: string;
  seating: SeatingStyle;
  afterDark: boolean;
  deliveryMiles: string;
  setupLabor: string;
  discountPercent: string;
  discountAmount: string;
  damageWaiver: boolean;
  ownInsurance: boolean;
  /** Empty: the company's current rate. */
  taxRatePercent: string;
  securityDeposit: string;
  notes: string;
  lines: LineState[];
}

let counter = 0;
export const newKey = () => `line-${Date.now().toString(36)}-${(counter += 1)}`;

export function emptyLine(kind: 'rental' | 'fee' = 'rental'): LineState {
  return { key: newKey(), itemId: '', description: '', quantity: '1', unitPrice: '', extraDays: '0', extraDayPrice: '', discountPercent: '', discountAmount: '', taxable: true, kind };
}

/** A catalog item as a line, at its list prices. */
export function lineFromItem(item: ItemRow, quantity = 1): LineState {
  return {
    key: newKey(),
    itemId: item.id,
    description: item.name,
    quantity: String(quantity),
    unitPrice: centsToInput(item.rentalPriceCents),
    extraDays: '0',
    extraDayPrice: centsToInput(item.extraDayPriceCents),
    discountPercent: '',
    discountAmount: '',
    taxable: item.taxable,
    kind: item.kind === 'service' ? 'fee' : 'rental',
  };
}

export function emptyBooking(customerId = ''): BookingState {
  return {
    customerId,
    eventStart: '',
    eventEnd: '',
    deliveryStart: '',
    deliveryEnd: '',
    pickupStart: '',
    pickupEnd: '',
    siteLine1: '',
    siteLine2: '',
    siteCity: '',
    siteRegion: '',
    sitePostalCode: '',
    siteNotes: '',
    surface: 'grass',
    anchoring: 'stakes',
    utilityLocateNumber: '',
    utilityLocateDate: '',
    guestCount: '',
    seating: 'banquet',
    afterDark: false,
    deliveryMiles: '',
    setupLabor: '',
    discountPercent: '',
    discountAmount: '',
    damageWaiver: true,
    ownInsurance: false,
    taxRatePercent: '',
    securityDeposit: '',
    notes: '',
    lines: [],
  };
}

export function stateFromBooking(b: BookingRow, timeZone: string): BookingState {
  const z = (iso: string) => isoToZonedInput(iso, timeZone);
  const blankZero = (cents: number) => (cents ? centsToInput(cents) : '');
  return {
    customerId: b.customer.id,
    eventStart: z(b.eventStart),
    eventEnd: z(b.eventEnd),
    deliveryStart: z(b.deliveryStart),
    deliveryEnd: z(b.deliveryEnd),
    pickupStart: z(b.pickupStart),
    pickupEnd: z(b.pickupEnd),
    siteLine1: b.siteLine1,
    siteLine2: b.siteLine2,
    siteCity: b.siteCity,
    siteRegion: b.siteRegion,
    sitePostalCode: b.sitePostalCode,
    siteNotes: b.siteNotes,
    surface: b.surface,
    anchoring: b.anchoring,
    utilityLocateNumber: b.utilityLocateNumber,
    utilityLocateDate: b.utilityLocateDate ?? '',
    guestCount: b.guestCount ? String(b.guestCount) : '',
    seating: b.seating,
    afterDark: b.afterDark,
    deliveryMiles: numberToInput(b.deliveryMiles),
    setupLabor: blankZero(b.setupLaborCents),
    discountPercent: b.discountBp ? bpToPercentInput(b.discountBp) : '',
    discountAmount: blankZero(b.discountCents),
    damageWaiver: b.damageWaiver,
    ownInsurance: b.ownInsurance,
    taxRatePercent: bpToPercentInput(b.taxRateBp),
    securityDeposit: blankZero(b.securityDepositCents),
    notes: b.notes,
    lines: b.lines.map((l) => ({
      key: l.id,
      itemId: l.itemId ?? '',
      description: l.description,
      quantity: String(l.quantity),
      unitPrice: centsToInput(l.unitPriceCents),
      extraDays: String(l.extraDays),
      extraDayPrice: centsToInput(l.extraDayPriceCents),
      discountPercent: l.discountBp ? bpToPercentInput(l.discountBp) : '',
      discountAmount: blankZero(l.discountCents),
      taxable: l.taxable,
      kind: l.kind,
    })),
  };
}

/**
 * The typed state as a BookingInput, with messages (by the schema's paths, "lines.2.quantity")
 * for text that could not be read. `keepPrices` sends the saved prices for people who see none.
 */
export function toBookingInput(s: BookingState, timeZone: string, keepPrices: BookingRow | null = null) {
  const c = collector();
  c.input.customerId = s.customerId;
  for (const key of ['eventStart', 'eventEnd', 'deliveryStart', 'deliveryEnd', 'pickupStart', 'pickupEnd'] as const) {
    const iso = s[key] ? zonedInputToIso(s[key], timeZone) : null;
    if (iso) c.input[key] = iso;
    else c.errors[key] = 'Enter a date and time.';
  }
  for (const key of ['siteLine1', 'siteLine2', 'siteCity', 'siteRegion', 'sitePostalCode', 'siteNotes', 'utilityLocateNumber', 'notes'] as const) c.input[key] = s[key];
  c.input.surface = s.surface;
  c.input.anchoring = s.anchoring;
  c.input.utilityLocateDate = s.utilityLocateDate || null;
  c.put('guestCount', parseWhole(s.guestCount, 0));
  c.input.seating = s.seating;
  c.input.afterDark = s.afterDark;
  c.put('deliveryMiles', parseDecimal(s.deliveryMiles, null));
  c.input.damageWaiver = s.damageWaiver;
  c.input.ownInsurance = s.ownInsurance;
  if (keepPrices) {
    c.input.setupLaborCents = keepPrices.setupLaborCents;
    c.input.discountBp = keepPrices.discountBp;
    c.input.discountCents = keepPrices.discountCents;
    c.input.taxRateBp = keepPrices.taxRateBp;
    c.input.securityDepositCents = keepPrices.securityDepositCents;
  } else {
    c.put('setupLaborCents', parseDollars(s.setupLabor, 0));
    c.put('discountBp', parsePercent(s.discountPercent, 2, 0));
    c.put('discountCents', parseDollars(s.discountAmount, 0));
    c.put('taxRateBp', parsePercent(s.taxRatePercent, 4, null));
    c.put('securityDepositCents', parseDollars(s.securityDeposit, 0));
  }
  const saved = new Map((keepPrices?.lines ?? []).map((l) => [l.id, l]));
  c.input.lines = s.lines.map((line, i) => {
    const l = collector();
    l.input.itemId = line.itemId || null;
    l.input.description = line.description;
    l.put('quantity', parseWhole(line.quantity, null));
    l.put('extraDays', parseWhole(line.extraDays, 0));
    l.input.taxable = line.taxable;
    l.input.kind = line.kind;
    const old = saved.get(line.key);
    if (keepPrices && old) {
      Object.assign(l.input, { unitPriceCents: old.unitPriceCents, extraDayPriceCents: old.extraDayPriceCents, discountBp: old.discountBp, discountCents: old.discountCents });
    } else {
      l.put('unitPriceCents', parseDollars(line.unitPrice, 0));
      l.put('extraDayPriceCents', parseDollars(line.extraDayPrice, 0));
      l.put('discountBp', parsePercent(line.discountPercent, 2, 0));
      l.put('discountCents', parseDollars(line.discountAmount, 0));
    }
    if (l.input.quantity === null) delete l.input.quantity;
    for (const [k, m] of Object.entries(l.errors)) c.errors[`lines.${i}.${k}`] = m;
    return l.input;
  });
  return c;
}

/** What the quote calculator takes, from the typed state and the company's rules; null while unreadable. */
export function quoteRequestOf(s: BookingState, rules: CompanyRules, taxExempt: boolean, timeZone: string): QuoteRequest | null {
  const c = toBookingInput(s, timeZone);
  const lines = (c.input.lines as Record<string, unknown>[]).filter((l, i) => !Object.keys(c.errors).some((k) => k.startsWith(`lines.${i}.`)));
  const num = (v: unknown, fallback = 0) => (typeof v === 'number' && Number.isFinite(v) ? v : fallback);
  const eventStartIso = typeof c.input.eventStart === 'string' ? c.input.eventStart : null;
  return {
    lines: lines.map((l) => ({
      description: String(l.description || 'Line'),
      quantity: num(l.quantity),
      unitPriceCents: num(l.unitPriceCents),
      extraDays: num(l.extraDays),
      extraDayPriceCents: num(l.extraDayPriceCents),
      discountBp: num(l.discountBp),
      discountCents: num(l.discountCents),
      taxable: Boolean(l.taxable),
      kind: l.kind === 'fee' ? 'fee' : 'rental',
    })),
    taxRateBp: c.input.taxRateBp === null || c.input.taxRateBp === undefined ? rules.taxRateBp : num(c.input.taxRateBp),
    taxExempt,
    discountBp: num(c.input.discountBp),
    discountCents: num(c.input.discountCents),
    deliveryMiles: typeof c.input.deliveryMiles === 'number' ? c.input.deliveryMiles : null,
    deliveryBands: rules.deliveryBands,
    deliveryTaxable: rules.deliveryTaxable,
    setupLaborCents: num(c.input.setupLaborCents),
    damageWaiverBp: s.damageWaiver ? rules.damageWaiverBp : 0,
    damageWaiverTaxable: rules.damageWaiverTaxable,
    ownInsurance: s.ownInsurance,
    depositBp: rules.depositBp,
    depositMinCents: rules.depositMinCents,
    securityDepositCents: num(c.input.securityDepositCents),
    balanceDueDays: rules.balanceDueDays,
    signingDate: zonedDate(Date.now(), timeZone),
    eventDate: eventStartIso ? zonedDate(eventStartIso, timeZone) : undefined,
  };
}
