import Decimal from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addDays, deliveryFee, quote } from '../../shared/quote';
import { QuoteRequest, type QuoteResult } from '../../shared/schemas/quote';

const D = Decimal.clone({ precision: 60 });
/** The rounding rule's check: exact product, half up to the cent (decimal.js, independent of shared/money). */
const halfUp = (x: Decimal.Value) => new D(x).toDecimalPlaces(0, Decimal.ROUND_HALF_UP).toNumber();
const pct = (cents: number, bp: number) => halfUp(new D(cents).times(bp).div(10000));

const q = (req: QuoteRequest) => quote(QuoteRequest.parse(req));
const line = (over: Partial<QuoteRequest['lines'][number]> = {}) => ({ description: 'Item', quantity: 1, unitPriceCents: 1000, ...over });

describe('quote: a worked booking', () => {
  // Numbers worked by hand (and checked with decimal.js) — no value here comes from quote().
  const result = q({
    lines: [
      { description: '20x30 pole tent', quantity: 1, unitPriceCents: 45_000, extraDays: 1, extraDayPriceCents: 15_000 },
      { description: '8-ft banquet table', quantity: 8, unitPriceCents: 1_000, extraDays: 1, extraDayPriceCents: 500, discountCents: 1_000 },
      { description: 'Folding chair', quantity: 75, unitPriceCents: 200, extraDays: 1, extraDayPriceCents: 100, discountBp: 1_000 },
      { description: 'Site cleanup', quantity: 1, unitPriceCents: 5_000, kind: 'fee', taxable: false },
    ],
    taxRateBp: 887.5,
    discountBp: 500,
    deliveryMiles: 12,
    deliveryBands: [
      { upToMiles: 10, feeCents: 7_500 },
      { upToMiles: 25, feeCents: 12_500 },
      { upToMiles: 50, feeCents: 20_000 },
    ],
    setupLaborCents: 20_000,
    setupLaborTaxable: true,
    damageWaiverBp: 1_000,
    depositBp: 3_000,
    depositMinCents: 10_000,
    securityDepositCents: 25_000,
    balanceDueDays: 7,
    signingDate: '2027-05-20',
    eventDate: '2027-06-12',
  });

  it('prices the lines: extra days, line discounts, the booking discount spread without losing a cent', () => {
    // gross: 1 x (450 + 150) = 600; 8 x (10 + 5) = 120 less $10; 75 x (2 + 1) = 225 less 10% = 22.50; fee 50
    // net after line discounts 600 + 110 + 202.50 + 50 = 962.50; 5% = 48.125 -> $48.13 booking discount
    // shares of 4813 by net: 3000.31, 550.06, 1012.61, 250.03 -> floors 4812, the cent left to the .61
    expect(result.lines.map((l) => [l.grossCents, l.lineDiscountCents, l.bookingDiscountCents, l.netCents])).toEqual([
      [60_000, 0, 3_000, 57_000],
      [12_000, 1_000, 550, 10_450],
      [22_500, 2_250, 1_013, 19_237],
      [5_000, 0, 250, 4_750],
    ]);
    expect(result.rentalCents).toBe(94_500);
    expect(result.feesCents).toBe(5_000);
    expect(result.discountCents).toBe(8_063); // 10 + 22.50 + 48.13
  });

  it('adds delivery by band, labor, the damage waiver, and taxes the base once', () => {
    expect(result.deliveryCents).toBe(12_500); // 12 miles: the 25-mile band
    expect(result.setupLaborCents).toBe(20_000);
    expect(result.damageWaiverCents).toBe(8_669); // 10% of the rental lines' net 866.87 = 86.687 -> 86.69
    expect(result.subtotalCents).toBe(132_606); // 914.37 + 125 + 200 + 86.69
    expect(result.taxableCents).toBe(115_356); // rentals 866.87 + labor 200 + waiver 86.69; not the fee line, not delivery
    expect(result.taxCents).toBe(10_238); // 1153.56 x 8.875% = 102.37845 -> 102.38
    expect(result.totalCents).toBe(142_844);
    expect(result.depositCents).toBe(42_853); // 30% of 1428.44 = 428.532 -> 428.53 (above the $100 minimum)
    expect(result.balanceCents).toBe(99_991);
    expect(result.securityDepositCents).toBe(25_000);
    expect(result.dueCents).toBe(167_844);
  });

  it('schedules the deposit at signing, the balance and the security deposit 7 days before the event', () => {
    expect(result.schedule.map((s) => [s.kind, s.dueDate, s.amountCents])).toEqual([
      ['deposit', '2027-05-20', 42_853],
      ['balance', '2027-06-05', 99_991],
      ['security_deposit', '2027-06-05', 25_000],
    ]);
    expect(result.schedule.every((s) => s.label.length > 0)).toBe(true);
  });
});

describe('quote: sales tax', () => {
  it('rounds once per invoice, not per line (SSUTA §324 lets the seller choose invoice basis)', () => {
    const r = q({ lines: [line({ unitPriceCents: 10 }), line({ unitPriceCents: 10 }), line({ unitPriceCents: 10 })], taxRateBp: 500 });
    // Per invoice: $0.30 x 5% = $0.015 -> $0.02. Per line: $0.005 -> $0.01 three times = $0.03.
    const perLine = [10, 10, 10].map((c) => pct(c, 500)).reduce((a, b) => a + b, 0);
    expect(perLine).toBe(3);
    expect(r.taxableCents).toBe(30);
    expect(r.taxCents).toBe(2);
    expect(r.totalCents).toBe(32);
  });

  it('follows the rounding rule on worked examples (SSUTA §324; RCW 82.08.054)', () => {
    expect(q({ lines: [line({ unitPriceCents: 1999 })], taxRateBp: 887.5 }).taxCents).toBe(177); // $1.7741125 -> $1.77
    expect(q({ lines: [line({ unitPriceCents: 1006 })], taxRateBp: 825 }).taxCents).toBe(83); // $0.82995 -> $0.83
  });

  it('charges an exempt customer no tax', () => {
    const r = q({ lines: [line({ unitPriceCents: 50_000 })], taxRateBp: 887.5, taxExempt: true, damageWaiverBp: 1000 });
    expect(r.taxCents).toBe(0);
    expect(r.taxableCents).toBe(0);
    expect(r.totalCents).toBe(55_000); // 500 + 10% waiver
  });

  it('never taxes the security deposit, and keeps it out of the total', () => {
    const base = { lines: [line({ unitPriceCents: 10_000 })], taxRateBp: 1000 };
    const without = q(base);
    const withSecurity = q({ ...base, securityDepositCents: 50_000 });
    expect(withSecurity.taxCents).toBe(1_000); // 10% of $100 only
    expect(withSecurity.taxableCents).toBe(without.taxableCents);
    expect(withSecurity.totalCents).toBe(11_000);
    expect(withSecurity.dueCents).toBe(61_000);
  });

  it('taxes delivery, labor and the waiver only when told to', () => {
    const common = { lines: [line({ unitPriceCents: 10_000 })], taxRateBp: 1000, deliveryMiles: 5, deliveryBands: [{ upToMiles: 10, feeCents: 5_000 }], setupLaborCents: 3_000, damageWaiverBp: 1000 };
    expect(q({ ...common, damageWaiverTaxable: false }).taxableCents).toBe(10_000);
    expect(q({ ...common, deliveryTaxable: true, setupLaborTaxable: true }).taxableCents).toBe(19_000); // 100 + 50 + 30 + 10
    expect(q({ ...common, lines: [line({ unitPriceCents: 10_000, taxable: false })] }).taxableCents).toBe(1_000); // the waiver alone
  });
});

describe('quote: discounts, waiver, delivery, deposit', () => {
  it('never lets a line or booking discount go below zero', () => {
    const r = q({ lines: [line({ unitPriceCents: 1000, discountCents: 99_999 }), line({ unitPriceCents: 500, discountBp: 5000 })], taxRateBp: 0, discountCents: 1_000_000 });
    expect(r.lines.map((l) => [l.lineDiscountCents, l.bookingDiscountCents, l.netCents])).toEqual([
      [1000, 0, 0],
      [250, 250, 0],
    ]);
    expect(r.totalCents).toBe(0);
    expect(r.depositCents).toBe(0);
    expect(r.schedule).toEqual([]);
  });

  it('waives the damage waiver for a customer with their own insurance, and counts only rental lines', () => {
    const lines = [line({ unitPriceCents: 20_000 }), line({ unitPriceCents: 10_000, kind: 'fee' })];
    expect(q({ lines, taxRateBp: 0, damageWaiverBp: 1000 }).damageWaiverCents).toBe(2_000);
    expect(q({ lines, taxRateBp: 0, damageWaiverBp: 1000, ownInsurance: true }).damageWaiverCents).toBe(0);
  });

  it('takes the delivery fee of the first band that reaches the distance', () => {
    const bands = [
      { upToMiles: 25, feeCents: 12_500 },
      { upToMiles: 10, feeCents: 7_500 },
      { upToMiles: 50, feeCents: 20_000 },
    ];
    expect(deliveryFee(null, bands)).toBe(0); // customer pickup
    expect(deliveryFee(0, bands)).toBe(7_500);
    expect(deliveryFee(10, bands)).toBe(7_500); // up to and including 10 miles
    expect(deliveryFee(10.1, bands)).toBe(12_500);
    expect(deliveryFee(50, bands)).toBe(20_000);
    expect(deliveryFee(80, bands)).toBe(20_000); // beyond the last band: the last band's fee
    expect(deliveryFee(5, [])).toBe(0);
  });

  it('asks at least the minimum deposit, never more than the total', () => {
    const r1 = q({ lines: [line({ unitPriceCents: 20_000 })], taxRateBp: 0, depositBp: 3000, depositMinCents: 10_000 });
    expect([r1.depositCents, r1.balanceCents]).toEqual([10_000, 10_000]); // 30% = $60 < $100 minimum
    const r2 = q({ lines: [line({ unitPriceCents: 5_000 })], taxRateBp: 0, depositBp: 3000, depositMinCents: 10_000, eventDate: '2027-06-12', signingDate: '2027-05-01' });
    expect([r2.depositCents, r2.balanceCents]).toEqual([5_000, 0]);
    expect(r2.schedule.map((s) => s.kind)).toEqual(['deposit']); // a zero balance is no entry
  });
});

describe('quote: schedule dates', () => {
  const money = { lines: [line({ unitPriceCents: 100_000 })], taxRateBp: 0, depositBp: 3000, securityDepositCents: 20_000 };

  it('puts everything at signing when the event is sooner than the balance date', () => {
    const r = q({ ...money, signingDate: '2027-06-05', eventDate: '2027-06-10', balanceDueDays: 7 });
    expect(r.schedule.map((s) => [s.kind, s.dueDate, s.amountCents])).toEqual([
      ['deposit', '2027-06-05', 30_000],
      ['balance', '2027-06-05', 70_000],
      ['security_deposit', '2027-06-05', 20_000],
    ]);
  });

  it('puts everything at signing when the balance date falls on the signing date', () => {
    const r = q({ ...money, signingDate: '2027-06-05', eventDate: '2027-06-12', balanceDueDays: 7 });
    expect(r.schedule.map((s) => s.dueDate)).toEqual(['2027-06-05', '2027-06-05', '2027-06-05']);
  });

  it('keeps the balance date the day after signing when it falls there', () => {
    const r = q({ ...money, signingDate: '2027-06-04', eventDate: '2027-06-12', balanceDueDays: 7 });
    expect(r.schedule.map((s) => s.dueDate)).toEqual(['2027-06-04', '2027-06-05', '2027-06-05']);
  });

  it('gives null dates when no dates are known', () => {
    const r = q(money);
    expect(r.schedule.map((s) => s.dueDate)).toEqual([null, null, null]);
  });

  it('counts calendar days across months, leap days and years (Gregorian calendar)', () => {
    expect(addDays('2027-03-05', -7)).toBe('2027-02-26'); // 2027: February has 28 days
    expect(addDays('2028-03-05', -7)).toBe('2028-02-27'); // 2028 is a leap year
    expect(addDays('2027-01-03', -7)).toBe('2026-12-27');
    expect(addDays('2027-03-16', -7)).toBe('2027-03-09'); // across the US DST change of 2027-03-14
    expect(() => addDays('2027-02-30', 0)).toThrow(RangeError);
    expect(() => addDays('6/12/2027', 0)).toThrow(RangeError);
  });
});

describe('quote: every cent accounted for (property)', () => {
  const bp = fc.integer({ min: 0, max: 10_000 });
  const lineArb = fc.record({
    description: fc.constantFrom('Tent', 'Table', 'Chair', 'Lights', 'Cleanup'),
    quantity: fc.integer({ min: 0, max: 300 }),
    unitPriceCents: fc.integer({ min: 0, max: 200_000 }),
    extraDays: fc.integer({ min: 0, max: 10 }),
    extraDayPriceCents: fc.integer({ min: 0, max: 100_000 }),
    discountBp: fc.oneof(fc.constant(0), bp),
    discountCents: fc.oneof(fc.constant(0), fc.integer({ min: 0, max: 500_000 })),
    taxable: fc.boolean(),
    kind: fc.constantFrom('rental' as const, 'fee' as const),
  });
  const requestArb = fc.record({
    lines: fc.array(lineArb, { maxLength: 12 }),
    taxRateBp: fc.integer({ min: 0, max: 300_000 }).map((h) => h / 100),
    taxExempt: fc.boolean(),
    discountBp: fc.oneof(fc.constant(0), bp),
    discountCents: fc.oneof(fc.constant(0), fc.integer({ min: 0, max: 1_000_000 })),
    deliveryMiles: fc.option(fc.integer({ min: 0, max: 100 })),
    deliveryBands: fc.array(fc.record({ upToMiles: fc.integer({ min: 1, max: 80 }), feeCents: fc.integer({ min: 0, max: 50_000 }) }), { maxLength: 4 }),
    deliveryTaxable: fc.boolean(),
    setupLaborCents: fc.integer({ min: 0, max: 100_000 }),
    setupLaborTaxable: fc.boolean(),
    damageWaiverBp: bp,
    damageWaiverTaxable: fc.boolean(),
    ownInsurance: fc.boolean(),
    depositBp: bp,
    depositMinCents: fc.integer({ min: 0, max: 50_000 }),
    securityDepositCents: fc.integer({ min: 0, max: 100_000 }),
  });

  const numbers = (r: QuoteResult) =>
    [r.rentalCents, r.feesCents, r.discountCents, r.deliveryCents, r.setupLaborCents, r.damageWaiverCents, r.subtotalCents, r.taxableCents, r.taxCents, r.totalCents, r.depositCents, r.balanceCents, r.securityDepositCents, r.dueCents];

  it('totals are the sum of their parts, nothing is negative, tax is once on the base', () => {
    fc.assert(
      fc.property(requestArb, (req) => {
        const input = QuoteRequest.parse(req);
        const r = quote(input);
        const total = (xs: number[]) => xs.reduce((a, b) => a + b, 0);

        for (const n of numbers(r)) expect(Number.isSafeInteger(n) && n >= 0).toBe(true);
        r.lines.forEach((l, i) => {
          const src = input.lines[i];
          // gross checked with decimal.js
          expect(l.grossCents).toBe(new D(src.quantity).times(new D(src.extraDays).times(src.extraDayPriceCents).plus(src.unitPriceCents)).toNumber());
          expect(l.lineDiscountCents).toBe(Math.min(l.grossCents, pct(l.grossCents, src.discountBp) + src.discountCents));
          expect(l.grossCents - l.lineDiscountCents - l.bookingDiscountCents).toBe(l.netCents);
          for (const n of [l.lineDiscountCents, l.bookingDiscountCents, l.netCents]) expect(n).toBeGreaterThanOrEqual(0);
        });

        const afterLine = total(r.lines.map((l) => l.grossCents - l.lineDiscountCents));
        const bookingDiscount = Math.min(afterLine, pct(afterLine, input.discountBp) + input.discountCents);
        expect(total(r.lines.map((l) => l.bookingDiscountCents))).toBe(bookingDiscount); // no cent lost in the split

        const linesNet = total(r.lines.map((l) => l.netCents));
        expect(r.rentalCents + r.feesCents - r.discountCents).toBe(linesNet);
        expect(r.subtotalCents).toBe(linesNet + r.deliveryCents + r.setupLaborCents + r.damageWaiverCents);

        const rentalNet = total(r.lines.filter((l) => l.kind === 'rental').map((l) => l.netCents));
        expect(r.damageWaiverCents).toBe(input.ownInsurance ? 0 : pct(rentalNet, input.damageWaiverBp));

        const taxable = input.taxExempt
          ? 0
          : total(r.lines.filter((l) => l.taxable).map((l) => l.netCents)) +
            (input.deliveryTaxable ? r.deliveryCents : 0) +
            (input.setupLaborTaxable ? r.setupLaborCents : 0) +
            (input.damageWaiverTaxable ? r.damageWaiverCents : 0);
        expect(r.taxableCents).toBe(taxable);
        expect(r.taxCents).toBe(pct(taxable, input.taxRateBp)); // once, on the whole base

        expect(r.totalCents).toBe(r.subtotalCents + r.taxCents);
        expect(r.depositCents + r.balanceCents).toBe(r.totalCents);
        expect(r.depositCents).toBeLessThanOrEqual(r.totalCents);
        expect(r.dueCents).toBe(r.totalCents + r.securityDepositCents);
        expect(total(r.schedule.map((s) => s.amountCents))).toBe(r.dueCents);
        for (const s of r.schedule) expect(s.amountCents > 0 || (s.kind === 'deposit' && r.totalCents > 0)).toBe(true);
      }),
      { numRuns: 300 },
    );
  });
});
