/**
 * Amounts and percentages as people type them, to and from the integer units the API takes.
 * Everything goes through the digits of the string, never through a float, so "0.29" is 29
 * cents and "8.875" % is 887.5 bp exactly.
 */

export type Parsed<T> = { ok: true; value: T } | { ok: false; message: string };

const DECIMAL = /^(\d+)(?:\.(\d*))?$|^\.(\d+)$/;

/** Splits "1,250.5" into whole and fraction digits; null when it is not a plain decimal number. */
function digits(text: string): { whole: string; fraction: string } | null {
  const s = text.trim().replace(/^\$/, '').replace(/,(?=\d{3}(\D|$))/g, '');
  const m = DECIMAL.exec(s);
  if (!m) return null;
  if (m[3] !== undefined) return { whole: '0', fraction: m[3] };
  return { whole: m[1], fraction: m[2] ?? '' };
}

/** Dollars and cents typed as "125", "125.5" or "1,250.00", to integer cents. Empty gives `empty`. */
export function parseDollars(text: string, empty: number | null = 0): Parsed<number | null> {
  if (text.trim() === '') return { ok: true, value: empty };
  const d = digits(text);
  if (!d) return { ok: false, message: 'Enter an amount like 125.00.' };
  if (d.fraction.length > 2) return { ok: false, message: 'Use at most two decimals (whole cents).' };
  const cents = BigInt(d.whole) * 100n + BigInt(d.fraction.padEnd(2, '0') || '0');
  if (cents > BigInt(Number.MAX_SAFE_INTEGER)) return { ok: false, message: 'That amount is too large.' };
  return { ok: true, value: Number(cents) };
}

/** Integer cents as the text of a money input: 12500 -> "125.00". */
export function centsToInput(cents: number | null | undefined): string {
  if (cents === null || cents === undefined) return '';
  const negative = cents < 0;
  const abs = String(Math.abs(cents)).padStart(3, '0');
  return `${negative ? '-' : ''}${abs.slice(0, -2)}.${abs.slice(-2)}`;
}

/**
 * A percentage typed with up to `decimals` decimals, to basis points (1% = 100 bp):
 * "12.5" -> 1250. With 4 decimals the result may carry two decimals of a bp ("8.875" -> 887.5).
 */
export function parsePercent(text: string, decimals = 2, empty: number | null = 0): Parsed<number | null> {
  if (text.trim() === '') return { ok: true, value: empty };
  const d = digits(text.replace(/%\s*$/, ''));
  if (!d) return { ok: false, message: 'Enter a percentage like 12.5.' };
  if (d.fraction.length > decimals) return { ok: false, message: `Use at most ${decimals} decimals.` };
  // Ten-thousandths of a percent are hundredths of a basis point.
  const hundredthsOfBp = BigInt(d.whole) * 10_000n + BigInt(d.fraction.padEnd(4, '0') || '0');
  if (hundredthsOfBp > 100_000_000n) return { ok: false, message: 'That percentage is too large.' };
  return { ok: true, value: Number(hundredthsOfBp) / 100 };
}

/** Basis points as the text of a percentage input: 1250 -> "12.5", 887.5 -> "8.875". */
export function bpToPercentInput(bp: number | null | undefined): string {
  if (bp === null || bp === undefined) return '';
  const h = Math.round(bp * 100);
  const whole = Math.floor(h / 10_000);
  const fraction = String(h % 10_000).padStart(4, '0').replace(/0+$/, '');
  return fraction ? `${whole}.${fraction}` : String(whole);
}

/** A whole number typed in a field; empty gives `empty`. */
export function parseWhole(text: string, empty: number | null = 0): Parsed<number | null> {
  const s = text.trim().replace(/,(?=\d{3}(\D|$))/g, '');
  if (s === '') return { ok: true, value: empty };
  if (!/^-?\d+$/.test(s)) return { ok: false, message: 'Enter a whole number.' };
  return { ok: true, value: Number(s) };
}

/** A decimal number (feet, miles) typed in a field; empty gives `empty`. */
export function parseDecimal(text: string, empty: number | null = null): Parsed<number | null> {
  const s = text.trim();
  if (s === '') return { ok: true, value: empty };
  if (!/^\d+(\.\d+)?$|^\.\d+$/.test(s)) return { ok: false, message: 'Enter a number like 20 or 20.5.' };
  return { ok: true, value: Number(s) };
}

export const numberToInput = (n: number | null | undefined) => (n === null || n === undefined ? '' : String(n));

/**
 * Collects parsed fields into an object and their messages by field name, for a form's
 * `toInput`: `const c = collect(); c.put('priceCents', parseDollars(v.priceCents));`.
 */
export function collector() {
  const input: Record<string, unknown> = {};
  const errors: Record<string, string> = {};
  return {
    input,
    errors,
    put<T>(name: string, parsed: Parsed<T>) {
      if (parsed.ok) input[name] = parsed.value;
      else errors[name] = parsed.message;
    },
  };
}
