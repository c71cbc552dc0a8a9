import Decimal from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { allocate, assertCents, formatMoney, multiply, percentOf, roundDiv, subtract, sum } from '../../shared/money';

// decimal.js, a general-purpose decimal library, is the independent check. Its ROUND_HALF_UP
// rounds ties away from zero. Enough digits for the largest products the properties make.
const D = Decimal.clone({ precision: 80 });

describe('roundDiv', () => {
  it('rounds half away from zero', () => {
    expect(roundDiv(5n, 2n)).toBe(3n); // 2.5 -> 3
    expect(roundDiv(-5n, 2n)).toBe(-3n); // -2.5 -> -3
    expect(roundDiv(5n, -2n)).toBe(-3n);
    expect(roundDiv(-5n, -2n)).toBe(3n);
    expect(roundDiv(7n, 2n)).toBe(4n); // 3.5 -> 4
    expect(roundDiv(4n, 3n)).toBe(1n); // 1.33 -> 1
    expect(roundDiv(5n, 3n)).toBe(2n); // 1.67 -> 2
    expect(roundDiv(-5n, 3n)).toBe(-2n);
    expect(roundDiv(1n, 3n)).toBe(0n);
    expect(roundDiv(0n, 7n)).toBe(0n);
    expect(() => roundDiv(1n, 0n)).toThrow(RangeError);
  });

  it('agrees with decimal.js ROUND_HALF_UP on any integers', () => {
    fc.assert(
      fc.property(fc.bigInt({ min: -(10n ** 24n), max: 10n ** 24n }), fc.bigInt({ min: -(10n ** 12n), max: 10n ** 12n }).filter((d) => d !== 0n), (n, d) => {
        const expected = new D(n.toString()).div(d.toString()).toDecimalPlaces(0, Decimal.ROUND_HALF_UP);
        expect(roundDiv(n, d).toString()).toBe(expected.toFixed(0));
      }),
      { numRuns: 500 },
    );
  });
});

describe('percentOf', () => {
  it('applies the rounding rule to worked examples', () => {
    // Rounding rule: Streamlined Sales and Use Tax Agreement §324 / RCW 82.08.054 — carry to the
    // third decimal, round up when it is above four.
    expect(percentOf(1999, 887.5)).toBe(177); // $19.99 x 8.875% = $1.7741125 -> $1.77
    expect(percentOf(1006, 825)).toBe(83); // $10.06 x 8.25% = $0.82995 -> $0.83
    expect(percentOf(10, 500)).toBe(1); // $0.10 x 5% = $0.005 -> $0.01 (exactly half rounds up)
    expect(percentOf(30, 500)).toBe(2); // $0.30 x 5% = $0.015 -> $0.02
    expect(percentOf(49, 100)).toBe(0); // $0.49 x 1% = $0.0049 -> $0.00
    expect(percentOf(10_000, 10_000)).toBe(10_000); // 100%
    expect(percentOf(-10, 500)).toBe(-1); // half away from zero on a credit too
  });

  it('keeps two decimals of a basis point and refuses a third', () => {
    expect(percentOf(1_000_000, 0.01)).toBe(1); // 0.0001% of $10,000 = $0.01
    expect(percentOf(1_000_000, 887.25)).toBe(88_725); // 8.8725% of $10,000
    expect(() => percentOf(100, 887.125)).toThrow(RangeError);
    expect(() => percentOf(1.5, 100)).toThrow(RangeError);
  });

  it('equals decimal.js cents x bp / 10000 rounded half up, for non-negative values', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 100_000_000_00 }), fc.integer({ min: 0, max: 1_000_000 }), (cents, hundredths) => {
        const bp = hundredths / 100;
        const expected = new D(cents).times(bp).div(10000).toDecimalPlaces(0, Decimal.ROUND_HALF_UP);
        expect(percentOf(cents, bp)).toBe(expected.toNumber());
      }),
      { numRuns: 500 },
    );
  });
});

describe('allocate', () => {
  it('gives the leftover cents to the largest remainders, ties to the earliest', () => {
    expect(allocate(100, [1, 1, 1])).toEqual([34, 33, 33]);
    expect(allocate(2, [1, 1, 1])).toEqual([1, 1, 0]);
    // exact shares 1.667, 3.333, 5: floors 1, 3, 5; the one cent left goes to the .667
    expect(allocate(10, [1, 2, 3])).toEqual([2, 3, 5]);
    expect(allocate(1000, [250, 0, 750])).toEqual([250, 0, 750]);
    expect(allocate(-100, [1, 1, 1])).toEqual([-34, -33, -33]);
  });

  it('splits evenly when every weight is zero, and refuses to lose an amount to no parts', () => {
    expect(allocate(5, [0, 0])).toEqual([3, 2]);
    expect(allocate(0, [])).toEqual([]);
    expect(() => allocate(1, [])).toThrow(RangeError);
    expect(() => allocate(10, [1, -1])).toThrow(RangeError);
    expect(() => allocate(10, [0.5, 1])).toThrow(RangeError);
  });

  it('parts sum to the whole and each is within one cent of its exact share', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 1_000_000_000 }), fc.array(fc.integer({ min: 0, max: 10_000_000 }), { minLength: 1, maxLength: 30 }), (cents, weights) => {
        const parts = allocate(cents, weights);
        expect(parts).toHaveLength(weights.length);
        expect(parts.reduce((a, b) => a + b, 0)).toBe(cents);
        const total = weights.reduce((a, b) => a + b, 0);
        parts.forEach((part, i) => {
          expect(part).toBeGreaterThanOrEqual(0);
          const exact = total === 0 ? new D(cents).div(weights.length) : new D(cents).times(weights[i]).div(total);
          expect(new D(part).minus(exact).abs().lessThan(1)).toBe(true);
        });
      }),
      { numRuns: 300 },
    );
  });
});

describe('sum, subtract, multiply, assertCents', () => {
  it('adds exactly and refuses anything that is not whole cents', () => {
    expect(sum([])).toBe(0);
    expect(sum([1999, 1, -500])).toBe(1500);
    expect(() => sum([Number.MAX_SAFE_INTEGER, 1])).toThrow(RangeError);
    expect(() => sum([0.1, 0.2])).toThrow(RangeError);
    expect(subtract(1000, 1999)).toBe(-999);
    expect(multiply(1999, 3)).toBe(5997);
    expect(() => multiply(10_000_000_000, 1_000_000)).toThrow(RangeError);
    expect(assertCents(42)).toBe(42);
    expect(() => assertCents(Number.NaN)).toThrow(RangeError);
    expect(() => assertCents(1.5)).toThrow(RangeError);
    expect(() => assertCents(Number.MAX_SAFE_INTEGER + 1)).toThrow(RangeError);
  });
});

describe('formatMoney', () => {
  it('formats in the currency minor unit and locale (CLDR formats, from memory)', () => {
    expect(formatMoney(123456, 'USD')).toBe('$1,234.56');
    expect(formatMoney(5, 'USD')).toBe('$0.05');
    expect(formatMoney(-5, 'USD')).toBe('-$0.05');
    expect(formatMoney(0, 'USD')).toBe('$0.00');
    expect(formatMoney(1234, 'JPY')).toBe('¥1,234'); // the yen has no minor unit (ISO 4217: 0 decimals)
    expect(formatMoney(123456, 'EUR', 'de-DE')).toMatch(/^1\.234,56\s€$/);
  });

  it('shows the largest safe amount to the cent, with no float rounding', () => {
    // 9,007,199,254,740,991 cents: divided as a float it would not end in .91
    expect(formatMoney(Number.MAX_SAFE_INTEGER, 'USD')).toBe('$90,071,992,547,409.91');
  });
});
