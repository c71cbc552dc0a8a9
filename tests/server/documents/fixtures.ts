/** An invented company, customer and booking to render documents from (no database). */
import { quote } from '../../../shared/quote';
import type { BookingLineRow, BookingRow } from '../../../shared/schemas/bookings';
import { QuoteRequest } from '../../../shared/schemas/quote';
import { DEFAULT_RULES, type CompanyRules } from '../../../shared/schemas/rules';
import { bookingDocumentValues, type DocumentKind, type DocumentValues, type OrganizationForDocuments } from '../../../server/documents';

export const organization: OrganizationForDocuments = {
  name: 'Quillbrook Tent & Table Co.',
  addressLine1: '410 Millrace Road',
  addressLine2: 'Unit 3',
  city: 'Fernhollow',
  region: 'IL',
  postalCode: '61999',
  country: 'US',
  phone: '(555) 010-4477',
  email: 'office@quillbrook.example',
  currency: 'USD',
  timeZone: 'America/Chicago',
};

export const rules: CompanyRules = { ...DEFAULT_RULES, taxRateBp: 825 };

type LineSeed = Pick<BookingLineRow, 'description' | 'quantity' | 'unitPriceCents'> & Partial<BookingLineRow>;

function line(position: number, seed: LineSeed): BookingLineRow {
  return {
    id: `00000000-0000-4000-8000-00000000000${position}`,
    position,
    itemId: null,
    itemKind: null,
    extraDays: 0,
    extraDayPriceCents: 0,
    discountBp: 0,
    discountCents: 0,
    taxable: true,
    kind: 'rental',
    available: null,
    shortfall: 0,
    ...seed,
  };
}

/** A Saturday wedding reception in June 2027, delivered on Friday. */
export function sampleBooking(overrides: { customerName?: string; lines?: LineSeed[] } = {}): BookingRow {
  const lines = (
    overrides.lines ?? [
      { description: '20 x 40 ft frame tent, white', quantity: 1, unitPriceCents: 89_500 },
      { description: 'Sidewall section, 20 ft, solid', quantity: 4, unitPriceCents: 4_500 },
      { description: '8-ft banquet table', quantity: 10, unitPriceCents: 1_200, extraDays: 1, extraDayPriceCents: 400 },
      { description: 'White folding chair', quantity: 80, unitPriceCents: 250 },
      { description: 'String lighting, 100 ft', quantity: 2, unitPriceCents: 6_000 },
    ]
  ).map((l, i) => line(i + 1, l));
  const base = {
    securityDepositCents: 25_000,
    deliveryMiles: 12,
    setupLaborCents: 15_000,
    damageWaiver: true,
    ownInsurance: false,
    taxRateBp: rules.taxRateBp,
    discountBp: 0,
    discountCents: 0,
  };
  const totals = quote(
    QuoteRequest.parse({
      lines: lines.map((l) => ({
        description: l.description,
        quantity: l.quantity,
        unitPriceCents: l.unitPriceCents,
        extraDays: l.extraDays,
        extraDayPriceCents: l.extraDayPriceCents,
        taxable: l.taxable,
        kind: l.kind,
      })),
      taxRateBp: base.taxRateBp,
      deliveryMiles: base.deliveryMiles,
      deliveryBands: rules.deliveryBands,
      setupLaborCents: base.setupLaborCents,
      damageWaiverBp: rules.damageWaiverBp,
      depositBp: rules.depositBp,
      depositMinCents: rules.depositMinCents,
      securityDepositCents: base.securityDepositCents,
      balanceDueDays: rules.balanceDueDays,
      signingDate: '2027-04-20',
      eventDate: '2027-06-12',
    }),
  );
  return {
    id: '11111111-1111-4111-8111-111111111111',
    reference: 'B-1042',
    status: 'reserved',
    customer: { id: '22222222-2222-4222-8222-222222222222', name: overrides.customerName ?? 'Juniper Hollowell', email: 'juniper@example.com', phone: '(555) 010-2288', taxExempt: false },
    // 2:00 PM to 10:00 PM in Chicago (CDT, UTC-5).
    eventStart: '2027-06-12T19:00:00.000Z',
    eventEnd: '2027-06-13T03:00:00.000Z',
    deliveryStart: '2027-06-11T14:00:00.000Z',
    deliveryEnd: '2027-06-11T18:00:00.000Z',
    pickupStart: '2027-06-13T15:00:00.000Z',
    pickupEnd: '2027-06-13T19:00:00.000Z',
    siteLine1: '88 Orchard Bend',
    siteLine2: '',
    siteCity: 'Fernhollow',
    siteRegion: 'IL',
    sitePostalCode: '61999',
    siteNotes: 'Side gate is 5 ft wide. Sprinkler heads along the east fence.',
    surface: 'grass',
    anchoring: 'stakes',
    utilityLocateNumber: 'A271530099',
    utilityLocateDate: '2027-06-04',
    guestCount: 80,
    seating: 'banquet',
    afterDark: true,
    ...base,
    notes: '',
    currency: 'USD',
    lines,
    totals,
    createdAt: '2027-04-20T15:00:00.000Z',
    updatedAt: '2027-04-20T15:00:00.000Z',
    can: { update: true, changeStatus: [], seePrices: true, issueDocuments: true, readDocuments: true },
  };
}

export const NUMBERS: Record<DocumentKind, string> = {
  rental_agreement: 'RA-1042',
  invoice: 'INV-2027-0042',
  receipt: 'RC-2027-0107',
  credit_note: 'CN-2027-0009',
};

export const issuedAt = new Date('2027-04-20T15:30:00.000Z');

export function sampleValues(kind: DocumentKind, booking = sampleBooking()): DocumentValues {
  return bookingDocumentValues({
    booking,
    organization,
    rules,
    document: { kind, number: NUMBERS[kind], version: 2, issuedAt },
    payment: kind === 'receipt' ? { amountCents: 50_000, method: 'Check', receivedAt: new Date('2027-04-22T16:05:00.000Z'), reference: 'Check 1187' } : undefined,
    credit: kind === 'credit_note' ? { amountCents: 4_500, reason: 'One sidewall section was not needed and came back unused.' } : undefined,
    occupancy: [{ tent: '20 x 40 ft frame tent', maxOccupants: 53 }],
  });
}
