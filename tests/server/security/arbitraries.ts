/**
 * fast-check arbitraries for bad request bodies: values of the wrong type, odd numbers, unicode,
 * huge strings, deep nesting and extra keys, and the helpers that build a route's bodies from
 * the keys its schema reads.
 */
import fc from 'fast-check';

/**
 * Numbers JSON.stringify cannot write (1e400 parses to Infinity, -0, digits beyond a double) are
 * carried as this marker string and written as raw literals by `serialize`.
 */
const raw = (literal: string) => `__RAW:${literal}__`;

/** A body as the wire carries it, raw number literals included. */
export function serialize(body: unknown): string {
  return JSON.stringify(body).replace(/"__RAW:([^"_]+)__"/g, '$1');
}

/** Negative, fractional, too large, not numbers at all, NaN-like: never a valid amount in cents. */
export const badAmount: fc.Arbitrary<unknown> = fc.oneof(
  fc.integer({ min: -2_000_000_000, max: 0 }),
  fc.double({ noNaN: true, noDefaultInfinity: true }).filter((n) => !Number.isInteger(n)),
  fc.constantFrom(
    0.5, -0.01, 49.999, 1e11, 2 ** 53, 2 ** 53 + 2, 1e21, 1e308, Number.MIN_VALUE,
    raw('1e400'), raw('-1e400'), raw('1e-400'), raw('-0'), raw('123456789012345678901234567890'),
    '100', '-5', '1e3', '0x1F', ' 42 ', '4,200', '$12.00', '١٢', 'NaN', 'Infinity', '-Infinity', '', null, true, false, [], {},
  ),
);

const oddNumbers = fc.oneof(badAmount, fc.integer(), fc.double(), fc.constantFrom(1, 50, 100, 10_000, 4.2));

/**
 * Halves of a surrogate pair ("x\udfffy" is legal JSON, but no text in UTF-8): validate() refuses
 * them with a 400, as PostgreSQL's JSONB and text columns cannot keep them.
 */
export const LONE_SURROGATES = ['\ud800', 'x\udfffy'];

/** Strings a form would not send: control characters, lone surrogates, markup, template syntax, any script. */
const oddStrings = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.string({ unit: 'grapheme', maxLength: 40 }),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.constantFrom(
    '', ' ', '\u0000', 'a\u0000b', '\u202eevil', '\uFEFFbom', 'e\u0301', '👨‍👩‍👧‍👦', '\r\n', '\t',
    '<script>alert(1)</script>', "'; DROP TABLE bookings; --", '{{constructor.constructor("return process")()}}', '{{#each}}', '}}{{',
    '../../etc/passwd', '%s%n%x', 'null', 'true', 'undefined', '2031-02-30', '2031-13-01T25:61:00Z', 'draft', 'owner', 'cash',
    ...LONE_SURROGATES,
  ),
);

/** Long enough to hit every length limit, short enough to stay under the 1 MB body limit. */
export const hugeString = fc
  .tuple(fc.integer({ min: 5_000, max: 120_000 }), fc.constantFrom('x', '€', '𝄞', '\u0000', 'a\u0301'))
  .map(([n, unit]) => unit.repeat(Math.ceil(n / unit.length)));

/** Arrays and objects nested 20 to 1,000 deep. */
export const deepNesting = fc.integer({ min: 20, max: 1_000 }).map((depth) => {
  let v: unknown = 'bottom';
  for (let i = 0; i < depth; i++) v = i % 2 ? [v] : { a: v };
  return v;
});

/** Names that trip careless code: prototype keys, and keys that look like the route's own. */
const oddKeys = fc.oneof(
  fc.string({ maxLength: 12 }),
  fc.constantFrom('__proto__', 'constructor', 'prototype', 'toString', 'hasOwnProperty', 'organizationId', 'id', 'status', 'role', 'paidCents', 'createdById'),
);

/** Any value in the wrong place: the whole zoo, weighted toward the cheap ones. */
export const junk: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: oddNumbers },
  { weight: 4, arbitrary: oddStrings },
  { weight: 2, arbitrary: fc.constantFrom(null, true, false, [], {}) },
  { weight: 2, arbitrary: fc.oneof(fc.uuid(), fc.date({ noInvalidDate: true }).map((d) => d.toISOString()), fc.date({ noInvalidDate: true }).map((d) => d.toISOString().slice(0, 10))) },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 2 }) },
  { weight: 1, arbitrary: hugeString },
  { weight: 1, arbitrary: deepNesting },
);

/** Strings that are never e-mail addresses, and values that are not strings. */
export const badEmail: fc.Arbitrary<unknown> = fc.oneof(oddStrings.filter((s) => !s.includes('@')), badAmount);

/** Extra keys with junk values. */
export const extraKeys = fc.dictionary(oddKeys, junk, { maxKeys: 3 });

/** A route's body shape: each top-level key, or for an array of objects the keys of its elements. */
export type Shape = Record<string, true | string[]>;

/** Objects with the route's keys (any subset), each holding junk or an array of junk elements, plus extra keys. */
export function keyed(shape: Shape): fc.Arbitrary<Record<string, unknown>> {
  const fields = Object.fromEntries(
    Object.entries(shape).map(([key, inner]) => [
      key,
      inner === true ? junk : fc.oneof(junk, fc.array(fc.record(Object.fromEntries(inner.map((k) => [k, junk])), { requiredKeys: [] }), { maxLength: 3 })),
    ]),
  );
  return fc.tuple(fc.record(fields, { requiredKeys: [] }), extraKeys).map(([known, extra]) => ({ ...extra, ...known }));
}

/** Every path to a leaf of a valid body ('lines.0.quantity'), to spoil one at a time. */
function leafPaths(value: unknown, prefix: string[] = []): string[][] {
  if (value && typeof value === 'object') {
    const entries = Array.isArray(value) ? value.map((v, i) => [String(i), v] as const) : Object.entries(value);
    return entries.flatMap(([k, v]) => leafPaths(v, [...prefix, k]));
  }
  return prefix.length ? [prefix] : [];
}

/** A valid body with one leaf (or one whole top-level key) replaced by junk, sometimes with extra keys. */
export function spoiled(base: Record<string, unknown>): fc.Arbitrary<Record<string, unknown>> {
  const paths = [...leafPaths(base), ...Object.keys(base).map((k) => [k])];
  return fc.tuple(fc.constantFrom(...paths), junk, fc.option(extraKeys, { nil: undefined })).map(([path, value, extra]) => {
    const body = structuredClone(base);
    let at = body as Record<string, unknown>;
    for (const k of path.slice(0, -1)) at = at[k] as Record<string, unknown>;
    at[path[path.length - 1]] = value;
    return { ...(extra ?? {}), ...body };
  });
}
