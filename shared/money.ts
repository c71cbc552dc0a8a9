/**
 * Money arithmetic, and the only place it lives. Amounts are integer minor units (cents);
 * percentages are basis points (1% = 100 bp), tax rates to a hundredth of a basis point.
 * Anything that multiplies or divides goes through BigInt so no float ever touches a cent.
 * Pure: no Node or browser imports; runs in the client (previews) and on the server.
 */

/** A result or input left the range where a JavaScript number holds whole cents exactly. */
export class MoneyRangeError extends RangeError {
  constructor(message: string) {
    super(message);
    this.name = 'MoneyRangeError';
  }
}

/** Throws unless n is a whole number of cents that a JavaScript number holds exactly. Returns n. */
export function assertCents(n: number, what = 'amount'): number {
  if (!Number.isSafeInteger(n)) {
    throw new MoneyRangeError(`The ${what} must be whole cents within ±${Number.MAX_SAFE_INTEGER}; got ${n}.`);
  }
  return n;
}

function toNumber(n: bigint, what: string): number {
  if (n > BigInt(Number.MAX_SAFE_INTEGER) || n < -BigInt(Number.MAX_SAFE_INTEGER)) {
    throw new MoneyRangeError(`The ${what} is too large to hold in whole cents.`);
  }
  return Number(n);
}

/** numerator / denominator, rounded half away from zero (2.5 -> 3, -2.5 -> -3). */
export function roundDiv(numerator: bigint, denominator: bigint): bigint {
  if (denominator === 0n) throw new RangeError('Division by zero.');
  const q = numerator / denominator; // truncates toward zero
  const r = numerator % denominator; // carries the numerator's sign
  const absR = r < 0n ? -r : r;
  const absD = denominator < 0n ? -denominator : denominator;
  if (absR * 2n < absD) return q;
  const negative = numerator < 0n !== denominator < 0n;
  return negative ? q - 1n : q + 1n;
}

/**
 * A basis-point figure as whole hundredths of a basis point (887.5 bp -> 88750). Rejects more
 * than two decimals rather than rounding a rate silently.
 */
export function bpToHundredths(bp: number): bigint {
  if (!Number.isFinite(bp)) throw new RangeError(`Not a percentage: ${bp}.`);
  const h = Math.round(bp * 100);
  if (Math.abs(h - bp * 100) > 1e-6) {
    throw new RangeError(`Percentages take at most two decimals of a basis point; got ${bp}.`);
  }
  if (!Number.isSafeInteger(h)) throw new RangeError(`Percentage out of range: ${bp}.`);
  return BigInt(h);
}

/** cents x bp / 10,000, rounded half away from zero once. bp may carry two decimals (887.5). */
export function percentOf(cents: number, bp: number): number {
  assertCents(cents);
  // bp in hundredths: cents x h / (10,000 x 100).
  return toNumber(roundDiv(BigInt(cents) * bpToHundredths(bp), 1_000_000n), 'percentage');
}

/** cents x a whole factor (a quantity, a number of days), exactly. */
export function multiply(cents: number, factor: number): number {
  assertCents(cents);
  if (!Number.isSafeInteger(factor)) throw new RangeError(`Quantities are whole; got ${factor}.`);
  return toNumber(BigInt(cents) * BigInt(factor), 'amount');
}

/** The sum of amounts in cents, checked to stay exact. */
export function sum(cents: readonly number[]): number {
  let total = 0n;
  for (const c of cents) total += BigInt(assertCents(c));
  return toNumber(total, 'total');
}

/** a - b, checked. */
export function subtract(a: number, b: number): number {
  return toNumber(BigInt(assertCents(a)) - BigInt(assertCents(b)), 'difference');
}

/**
 * Splits `cents` in proportion to `weights` so the parts add up to `cents` exactly, by the
 * largest remainder method: every part gets the whole cents of its exact share, then the cents
 * left over go one each to the parts with the largest fractional remainders, ties to the earliest.
 * Each part is therefore within one cent of its exact share.
 *
 * Weights are whole, non-negative numbers (in practice line amounts in cents). When they are all
 * zero the amount is split evenly (extra cents to the earliest parts): nothing marks any part as
 * the one to carry it, and an even split is what a person would do by hand. A negative amount is
 * split like its absolute value, with every part negated. No weights and a non-zero amount throws.
 */
export function allocate(cents: number, weights: readonly number[]): number[] {
  assertCents(cents);
  for (const w of weights) {
    if (!Number.isSafeInteger(w) || w < 0) throw new RangeError(`Allocation weights are whole and not negative; got ${w}.`);
  }
  if (weights.length === 0) {
    if (cents === 0) return [];
    throw new RangeError('Nothing to allocate the amount to.');
  }
  if (cents < 0) return allocate(-cents, weights).map((p) => (p === 0 ? 0 : -p));

  let ws = weights.map((w) => BigInt(w));
  let total = ws.reduce((a, b) => a + b, 0n);
  if (total === 0n) {
    ws = ws.map(() => 1n);
    total = BigInt(ws.length);
  }
  const amount = BigInt(cents);
  const parts = ws.map((w) => (amount * w) / total);
  const remainders = ws.map((w, i) => ({ i, r: (amount * w) % total }));
  let left = amount - parts.reduce((a, b) => a + b, 0n);
  // Stable order: the largest remainder first, the earliest part first among equals.
  remainders.sort((a, b) => (a.r === b.r ? a.i - b.i : a.r > b.r ? -1 : 1));
  for (const { i } of remainders) {
    if (left === 0n) break;
    parts[i] += 1n;
    left -= 1n;
  }
  return parts.map((p) => Number(p));
}

/**
 * An amount for people to read, in the currency's own minor unit (2 decimals for USD, 0 for
 * JPY). The number reaches Intl as a decimal string, so no float rounding shows; an engine
 * that does not take strings turns it into the same number.
 */
export function formatMoney(cents: number, currency: string, locale = 'en-US'): string {
  assertCents(cents);
  const nf = new Intl.NumberFormat(locale, { style: 'currency', currency });
  const digits = nf.resolvedOptions().maximumFractionDigits ?? 2;
  const negative = cents < 0;
  const abs = (negative ? -BigInt(cents) : BigInt(cents)).toString().padStart(digits + 1, '0');
  const whole = abs.slice(0, abs.length - digits);
  const fraction = abs.slice(abs.length - digits);
  const text = `${negative ? '-' : ''}${whole}${digits > 0 ? `.${fraction}` : ''}` as `${number}`;
  return nf.format(text);
}
