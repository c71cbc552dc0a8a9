/**
 * The quote calculator: rental lines, discounts, delivery, labor, damage waiver, sales tax,
 * deposit and payment schedule. Pure, so the client previews exactly what the server stores.
 * All arithmetic goes through shared/money.ts.
 */
import { allocate, multiply, percentOf, subtract, sum } from './money';
import type { QuoteInput, QuoteLine, QuoteLineResult, QuoteResult, ScheduleEntry } from './schemas/quote';

/**
 * quantity x (unit price + extra days x extra-day price), less the line discount
 * (discountBp of that gross plus discountCents), never below 0.
 */
function priceLine(line: QuoteLine): { grossCents: number; lineDiscountCents: number; netCents: number } {
  const perUnit = sum([line.unitPriceCents, multiply(line.extraDayPriceCents, line.extraDays)]);
  const grossCents = multiply(perUnit, line.quantity);
  const asked = sum([percentOf(grossCents, line.discountBp), line.discountCents]);
  const lineDiscountCents = Math.min(grossCents, asked);
  return { grossCents, lineDiscountCents, netCents: subtract(grossCents, lineDiscountCents) };
}

/**
 * The fee of the first band (nearest first) that reaches deliveryMiles. Bands are sorted by
 * distance first, so their order in the settings does not matter. Beyond the farthest band we
 * charge the farthest band's fee: the office adds a line for an unusually long haul. Customer
 * pickup (null miles) and a company without bands cost nothing.
 */
export function deliveryFee(miles: number | null, bands: readonly { upToMiles: number; feeCents: number }[]): number {
  if (miles === null || bands.length === 0) return 0;
  const sorted = [...bands].sort((a, b) => a.upToMiles - b.upToMiles);
  const band = sorted.find((b) => b.upToMiles >= miles) ?? sorted[sorted.length - 1];
  return band.feeCents;
}

const DAY_MS = 86_400_000;

/** A YYYY-MM-DD date moved by whole days, on the UTC calendar (no time zone, no DST). */
export function addDays(date: string, days: number): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!m) throw new RangeError(`Dates are YYYY-MM-DD; got ${date}.`);
  const ms = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]));
  const back = new Date(ms).toISOString().slice(0, 10);
  if (back !== date) throw new RangeError(`Not a calendar date: ${date}.`);
  return new Date(ms + days * DAY_MS).toISOString().slice(0, 10);
}

function schedule(input: QuoteInput, depositCents: number, balanceCents: number, securityCents: number, totalCents: number): ScheduleEntry[] {
  const signing = input.signingDate ?? null;
  if (signing) addDays(signing, 0); // validates
  const days = input.balanceDueDays;
  let balanceDate = input.eventDate ? addDays(input.eventDate, -days) : null;
  // ISO dates compare as strings. When the balance date would come on or before signing, the
  // event is too near for a second payment: everything is due at signing.
  const allAtSigning = signing !== null && balanceDate !== null && balanceDate <= signing;
  if (allAtSigning) balanceDate = signing;

  const dayWord = days === 1 ? 'day' : 'days';
  const entries: ScheduleEntry[] = [];
  if (totalCents > 0) {
    entries.push({ kind: 'deposit', dueDate: signing, amountCents: depositCents, label: 'Deposit, due at signing' });
  }
  if (balanceCents > 0) {
    entries.push({
      kind: 'balance',
      dueDate: balanceDate,
      amountCents: balanceCents,
      label: allAtSigning ? 'Balance, due at signing (the event is too near for a later date)' : `Balance, due ${days} ${dayWord} before the event`,
    });
  }
  if (securityCents > 0) {
    entries.push({
      kind: 'security_deposit',
      dueDate: balanceDate,
      amountCents: securityCents,
      label: allAtSigning ? 'Refundable security deposit, due at signing' : 'Refundable security deposit, due with the balance',
    });
  }
  return entries;
}

export function quote(input: QuoteInput): QuoteResult {
  const priced = input.lines.map(priceLine);
  const linesNet = sum(priced.map((p) => p.netCents));

  // The booking discount works on what is left after line discounts, capped there, and is
  // spread over the lines in proportion to their net so each line's tax status carries its share.
  const bookingAsked = sum([percentOf(linesNet, input.discountBp), input.discountCents]);
  const bookingDiscount = Math.min(linesNet, bookingAsked);
  // Each share is at most ceil(discount x net / linesNet) <= net, so no line goes negative.
  const shares = allocate(bookingDiscount, priced.map((p) => p.netCents));

  const lines: QuoteLineResult[] = input.lines.map((line, i) => ({
    description: line.description,
    quantity: line.quantity,
    kind: line.kind,
    taxable: line.taxable,
    grossCents: priced[i].grossCents,
    lineDiscountCents: priced[i].lineDiscountCents,
    bookingDiscountCents: shares[i],
    netCents: subtract(priced[i].netCents, shares[i]),
  }));

  const of = (pick: (l: QuoteLineResult) => boolean, field: 'grossCents' | 'netCents') => sum(lines.filter(pick).map((l) => l[field]));
  const rentalCents = of((l) => l.kind === 'rental', 'grossCents');
  const feesCents = of((l) => l.kind === 'fee', 'grossCents');
  // Line and booking discounts together: rental + fees - discount = the lines' net.
  const discountCents = sum(lines.flatMap((l) => [l.lineDiscountCents, l.bookingDiscountCents]));

  const deliveryCents = deliveryFee(input.deliveryMiles, input.deliveryBands);
  const setupLaborCents = input.setupLaborCents;
  const damageWaiverCents = input.ownInsurance ? 0 : percentOf(of((l) => l.kind === 'rental', 'netCents'), input.damageWaiverBp);

  const subtotalCents = sum([of(() => true, 'netCents'), deliveryCents, setupLaborCents, damageWaiverCents]);

  // The base the tax is computed on; 0 for an exempt customer (nothing of the sale is taxable).
  const taxableCents = input.taxExempt
    ? 0
    : sum([
        of((l) => l.taxable, 'netCents'),
        input.deliveryTaxable ? deliveryCents : 0,
        input.setupLaborTaxable ? setupLaborCents : 0,
        input.damageWaiverTaxable ? damageWaiverCents : 0,
      ]);
  // Tax once per rate per invoice, on the whole taxable base, rounded half up to the cent:
  // Streamlined Sales and Use Tax Agreement §324 (rounding rule: carry to the third decimal,
  // round up when it is above four; the seller may compute per item or per invoice), as enacted
  // e.g. in RCW 82.08.054. Rounding the exact product half up is the same thing, since the mills
  // digit is 5 or more exactly when the fraction of a cent is at least one half.
  const taxCents = percentOf(taxableCents, input.taxRateBp);
  const totalCents = sum([subtotalCents, taxCents]);

  const depositCents = totalCents === 0 ? 0 : Math.min(totalCents, Math.max(input.depositMinCents, percentOf(totalCents, input.depositBp)));
  const balanceCents = subtract(totalCents, depositCents);
  const securityDepositCents = input.securityDepositCents;
  const dueCents = sum([totalCents, securityDepositCents]);

  return {
    lines,
    rentalCents,
    feesCents,
    discountCents,
    deliveryCents,
    setupLaborCents,
    damageWaiverCents,
    subtotalCents,
    taxableCents,
    taxRateBp: input.taxRateBp,
    taxCents,
    totalCents,
    depositCents,
    balanceCents,
    securityDepositCents,
    dueCents,
    schedule: schedule(input, depositCents, balanceCents, securityDepositCents, totalCents),
  };
}
