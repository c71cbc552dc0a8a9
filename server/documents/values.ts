/**
 * The values a document template may use: a booking, its company and the document being issued,
 * turned into strings a person reads (money in the company's currency, dates and times in the
 * company's time zone). Plain data in, plain data out; the values are stored beside the PDF so an
 * issued document can be explained later.
 */
import { formatMoney } from '../../shared/money';
import type { BookingRow } from '../../shared/schemas/bookings';
import type { CompanyRules } from '../../shared/schemas/rules';

import { DOCUMENT_KINDS, DOCUMENT_KIND_LABELS, type DocumentKind } from '../../shared/schemas/documents';

export { DOCUMENT_KINDS, type DocumentKind };
export const DOCUMENT_TITLES: Record<DocumentKind, string> = DOCUMENT_KIND_LABELS;

export interface OrganizationForDocuments {
  name: string;
  addressLine1: string;
  addressLine2: string;
  city: string;
  region: string;
  postalCode: string;
  country: string;
  phone: string;
  email: string;
  currency: string;
  timeZone: string;
}

export interface DocumentLineValues {
  description: string;
  quantity: string;
  unitPrice: string;
  /** Days beyond the first, "" when none. */
  extraDays: string;
  /** quantity x (unit price + extra days x extra-day price), before discounts. */
  total: string;
}

export interface DocumentValues {
  company: {
    name: string;
    addressLine1: string;
    addressLine2: string;
    city: string;
    region: string;
    postalCode: string;
    country: string;
    /** The whole address on one line. */
    address: string;
    phone: string;
    email: string;
    currency: string;
    timeZone: string;
  };
  document: {
    kind: DocumentKind;
    /** "Rental agreement", "Invoice"... */
    title: string;
    number: string;
    version: string;
    issuedDate: string;
    issuedAt: string;
    /** "Rental agreement B-1001 · version 2" */
    label: string;
  };
  customer: { name: string; email: string; phone: string; taxExempt: string };
  booking: {
    reference: string;
    status: string;
    eventStart: string;
    eventEnd: string;
    eventDate: string;
    /** Start to end, the date said once when both are on the same day. */
    eventWindow: string;
    deliveryWindow: string;
    pickupWindow: string;
    siteAddress: string;
    siteNotes: string;
    surface: string;
    anchoring: string;
    utilityLocateNumber: string;
    utilityLocateDate: string;
    guestCount: string;
    seating: string;
    afterDark: string;
    deliveryMiles: string;
    damageWaiver: string;
    ownInsurance: string;
    notes: string;
  };
  lines: DocumentLineValues[];
  totals: {
    rental: string;
    fees: string;
    discount: string;
    delivery: string;
    setupLabor: string;
    damageWaiver: string;
    subtotal: string;
    taxable: string;
    taxRate: string;
    tax: string;
    total: string;
    deposit: string;
    balance: string;
    securityDeposit: string;
    /** Total plus the refundable security deposit. */
    due: string;
  };
  /** The totals rows worth printing under the line items (no zero rows), in order. */
  summary: { label: string; amount: string; strong: boolean }[];
  schedule: { label: string; dueDate: string; amount: string }[];
  rules: {
    windLimitMph: string;
    depositPercent: string;
    depositMinimum: string;
    balanceDueDays: string;
    damageWaiverPercent: string;
    turnaroundHours: string;
    permitAreaSqFt: string;
  };
  /** Empty strings unless a payment was given (receipts). */
  payment: { amount: string; method: string; receivedAt: string; receivedDate: string; reference: string };
  /** Empty strings unless a credit was given (credit notes). */
  credit: { amount: string; reason: string };
  occupancy: { tent: string; maxOccupants: string }[];
}

/**
 * Every variable path a template may name. Arrays are listed by name ("lines") and their items'
 * fields under it ("lines.description"): inside {{#each lines}} those resolve as {{description}}.
 */
export const DOCUMENT_VARIABLES: string[] = [
  ...['name', 'addressLine1', 'addressLine2', 'city', 'region', 'postalCode', 'country', 'address', 'phone', 'email', 'currency', 'timeZone'].map(
    (f) => `company.${f}`,
  ),
  ...['kind', 'title', 'number', 'version', 'issuedDate', 'issuedAt', 'label'].map((f) => `document.${f}`),
  ...['name', 'email', 'phone', 'taxExempt'].map((f) => `customer.${f}`),
  ...[
    'reference', 'status', 'eventStart', 'eventEnd', 'eventDate', 'eventWindow', 'deliveryWindow', 'pickupWindow', 'siteAddress', 'siteNotes',
    'surface', 'anchoring', 'utilityLocateNumber', 'utilityLocateDate', 'guestCount', 'seating', 'afterDark', 'deliveryMiles', 'damageWaiver',
    'ownInsurance', 'notes',
  ].map((f) => `booking.${f}`),
  'lines',
  ...['description', 'quantity', 'unitPrice', 'extraDays', 'total'].map((f) => `lines.${f}`),
  ...[
    'rental', 'fees', 'discount', 'delivery', 'setupLabor', 'damageWaiver', 'subtotal', 'taxable', 'taxRate', 'tax', 'total', 'deposit', 'balance',
    'securityDeposit', 'due',
  ].map((f) => `totals.${f}`),
  'summary',
  ...['label', 'amount', 'strong'].map((f) => `summary.${f}`),
  'schedule',
  ...['label', 'dueDate', 'amount'].map((f) => `schedule.${f}`),
  ...['windLimitMph', 'depositPercent', 'depositMinimum', 'balanceDueDays', 'damageWaiverPercent', 'turnaroundHours', 'permitAreaSqFt'].map(
    (f) => `rules.${f}`,
  ),
  ...['amount', 'method', 'receivedAt', 'receivedDate', 'reference'].map((f) => `payment.${f}`),
  ...['amount', 'reason'].map((f) => `credit.${f}`),
  'occupancy',
  ...['tent', 'maxOccupants'].map((f) => `occupancy.${f}`),
];

export interface BookingDocumentInput {
  booking: BookingRow;
  organization: OrganizationForDocuments;
  rules: CompanyRules;
  document: { kind: DocumentKind; number: string; version: number; issuedAt: Date };
  payment?: { amountCents: number; method: string; receivedAt: Date; reference: string };
  credit?: { amountCents: number; reason: string };
  occupancy?: { tent: string; maxOccupants: number }[];
}

// ICU puts a narrow no-break space before AM/PM; the PDF fonts' latin subset and plain-text
// mail read better with an ordinary one.
const plainSpaces = (s: string) => s.replace(/[\u202f\u00a0]/g, ' ');

function formatters(timeZone: string) {
  const date = new Intl.DateTimeFormat('en-US', { timeZone, weekday: 'long', year: 'numeric', month: 'long', day: 'numeric' });
  const time = new Intl.DateTimeFormat('en-US', { timeZone, hour: 'numeric', minute: '2-digit' });
  const d = (at: Date) => plainSpaces(date.format(at));
  const t = (at: Date) => plainSpaces(time.format(at));
  const dateTime = (at: Date) => `${d(at)}, ${t(at)}`;
  const window = (startIso: string, endIso: string) => {
    const start = new Date(startIso);
    const end = new Date(endIso);
    return d(start) === d(end) ? `${dateTime(start)} – ${t(end)}` : `${dateTime(start)} – ${dateTime(end)}`;
  };
  return { date: d, time: t, dateTime, window };
}

/** A YYYY-MM-DD calendar date as "Friday, June 4, 2027" (no zone: the date is already local). */
export function formatCalendarDate(date: string | null): string {
  if (!date) return '';
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!m) return date;
  const at = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  return plainSpaces(new Intl.DateTimeFormat('en-US', { timeZone: 'UTC', weekday: 'long', year: 'numeric', month: 'long', day: 'numeric' }).format(at));
}

/** Basis points as a percentage for reading: 825 -> "8.25%", 1000 -> "10%", 887.5 -> "8.875%". */
export function formatPercent(bp: number): string {
  return `${Number((bp / 100).toFixed(4))}%`;
}

const join = (parts: string[], sep = ', ') => parts.map((p) => p.trim()).filter(Boolean).join(sep);

const SURFACE_WORDS: Record<BookingRow['surface'], string> = {
  grass: 'Grass',
  soil: 'Soil',
  gravel: 'Gravel',
  asphalt: 'Asphalt',
  concrete: 'Concrete',
};
const ANCHORING_WORDS: Record<BookingRow['anchoring'], string> = { stakes: 'Stakes', ballast: 'Ballast (no staking)' };
const SEATING_WORDS: Record<BookingRow['seating'], string> = {
  banquet: 'Seated at banquet tables',
  rows: 'Seated in rows of chairs',
  standing: 'Standing',
  mixed: 'Partly seated, partly standing',
};
const STATUS_WORDS: Record<BookingRow['status'], string> = {
  draft: 'Draft',
  quoted: 'Quoted',
  reserved: 'Reserved',
  out: 'Out',
  returned: 'Returned',
  closed: 'Closed',
  cancelled: 'Cancelled',
};

export function bookingDocumentValues(input: BookingDocumentInput): DocumentValues {
  const { booking, organization: org, rules, document } = input;
  const totals = booking.totals;
  if (!totals) throw new Error(`Booking ${booking.reference} has no totals: documents need the priced booking.`);
  const money = (cents: number) => formatMoney(cents, org.currency);
  const f = formatters(org.timeZone);

  const lines: DocumentLineValues[] = booking.lines.map((line, i) => ({
    description: line.description,
    quantity: String(line.quantity),
    unitPrice: money(line.unitPriceCents),
    extraDays: line.extraDays > 0 ? `${line.extraDays} × ${money(line.extraDayPriceCents)}` : '',
    total: money(totals.lines[i]?.grossCents ?? line.quantity * line.unitPriceCents),
  }));

  const taxRate = formatPercent(totals.taxRateBp);
  const summary: DocumentValues['summary'] = [];
  const row = (label: string, cents: number, opts: { strong?: boolean; always?: boolean; negative?: boolean } = {}) => {
    if (cents !== 0 || opts.always) summary.push({ label, amount: money(opts.negative ? -cents : cents), strong: opts.strong ?? false });
  };
  row('Rental', totals.rentalCents);
  row('Fees', totals.feesCents);
  row('Discounts', totals.discountCents, { negative: true });
  row('Delivery', totals.deliveryCents);
  row('Set-up and take-down', totals.setupLaborCents);
  row(`Damage waiver (${formatPercent(rules.damageWaiverBp)} of rental)`, totals.damageWaiverCents);
  row('Subtotal', totals.subtotalCents, { always: true });
  row(booking.customer.taxExempt ? 'Sales tax (exempt)' : `Sales tax (${taxRate})`, totals.taxCents, { always: true });
  row('Total', totals.totalCents, { always: true, strong: true });
  row('Refundable security deposit', totals.securityDepositCents);
  if (totals.securityDepositCents > 0) row('Total with security deposit', totals.dueCents, { strong: true });

  const number = document.number;
  const title = DOCUMENT_TITLES[document.kind];
  return {
    company: {
      name: org.name,
      addressLine1: org.addressLine1,
      addressLine2: org.addressLine2,
      city: org.city,
      region: org.region,
      postalCode: org.postalCode,
      country: org.country,
      address: join([org.addressLine1, org.addressLine2, join([org.city, join([org.region, org.postalCode], ' ')]), org.country]),
      phone: org.phone,
      email: org.email,
      currency: org.currency,
      timeZone: org.timeZone,
    },
    document: {
      kind: document.kind,
      title,
      number,
      version: String(document.version),
      issuedDate: f.date(document.issuedAt),
      issuedAt: f.dateTime(document.issuedAt),
      label: `${title} ${number} · version ${document.version}`,
    },
    customer: {
      name: booking.customer.name,
      email: booking.customer.email,
      phone: booking.customer.phone,
      taxExempt: booking.customer.taxExempt ? 'Yes' : 'No',
    },
    booking: {
      reference: booking.reference,
      status: STATUS_WORDS[booking.status],
      eventStart: f.dateTime(new Date(booking.eventStart)),
      eventEnd: f.dateTime(new Date(booking.eventEnd)),
      eventDate: f.date(new Date(booking.eventStart)),
      eventWindow: f.window(booking.eventStart, booking.eventEnd),
      deliveryWindow: f.window(booking.deliveryStart, booking.deliveryEnd),
      pickupWindow: f.window(booking.pickupStart, booking.pickupEnd),
      siteAddress: join([booking.siteLine1, booking.siteLine2, booking.siteCity, join([booking.siteRegion, booking.sitePostalCode], ' ')]),
      siteNotes: booking.siteNotes,
      surface: SURFACE_WORDS[booking.surface],
      anchoring: ANCHORING_WORDS[booking.anchoring],
      utilityLocateNumber: booking.utilityLocateNumber,
      utilityLocateDate: formatCalendarDate(booking.utilityLocateDate),
      guestCount: String(booking.guestCount),
      seating: SEATING_WORDS[booking.seating],
      afterDark: booking.afterDark ? 'Yes' : 'No',
      deliveryMiles: booking.deliveryMiles === null ? 'Customer pickup' : `${booking.deliveryMiles} mi`,
      damageWaiver: booking.ownInsurance ? 'Declined: customer insurance on file' : booking.damageWaiver ? 'Included' : 'Declined',
      ownInsurance: booking.ownInsurance ? 'Yes' : 'No',
      notes: booking.notes,
    },
    lines,
    totals: {
      rental: money(totals.rentalCents),
      fees: money(totals.feesCents),
      discount: money(totals.discountCents),
      delivery: money(totals.deliveryCents),
      setupLabor: money(totals.setupLaborCents),
      damageWaiver: money(totals.damageWaiverCents),
      subtotal: money(totals.subtotalCents),
      taxable: money(totals.taxableCents),
      taxRate,
      tax: money(totals.taxCents),
      total: money(totals.totalCents),
      deposit: money(totals.depositCents),
      balance: money(totals.balanceCents),
      securityDeposit: money(totals.securityDepositCents),
      due: money(totals.dueCents),
    },
    summary,
    schedule: totals.schedule.map((s) => ({ label: s.label, dueDate: formatCalendarDate(s.dueDate), amount: money(s.amountCents) })),
    rules: {
      windLimitMph: String(rules.windLimitMph),
      depositPercent: formatPercent(rules.depositBp),
      depositMinimum: money(rules.depositMinCents),
      balanceDueDays: String(rules.balanceDueDays),
      damageWaiverPercent: formatPercent(rules.damageWaiverBp),
      turnaroundHours: String(rules.turnaroundHours),
      permitAreaSqFt: String(rules.permitAreaSqFt),
    },
    payment: input.payment
      ? {
          amount: money(input.payment.amountCents),
          method: input.payment.method,
          receivedAt: f.dateTime(input.payment.receivedAt),
          receivedDate: f.date(input.payment.receivedAt),
          reference: input.payment.reference,
        }
      : { amount: '', method: '', receivedAt: '', receivedDate: '', reference: '' },
    credit: input.credit ? { amount: money(input.credit.amountCents), reason: input.credit.reason } : { amount: '', reason: '' },
    occupancy: (input.occupancy ?? []).map((o) => ({ tent: o.tent, maxOccupants: String(o.maxOccupants) })),
  };
}
