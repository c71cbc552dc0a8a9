/**
 * Turning database text into CSV cells, with string arithmetic only: amounts arrive as the digits
 * of whole cents ("-12345") and leave as decimal strings with two places ("-123.45"). No value
 * passes through a JavaScript number, so no float ever touches a cent. Where an export has
 * PostgreSQL print its cells instead (the paid invoices, for speed), the SQL twins below give the
 * same text with exact NUMERIC arithmetic.
 */

const CENTS = /^-?\d+$/;

/** "12345" -> "123.45", "-5" -> "-0.05", "0" -> "0.00". */
export function centsText(cents: string | null | undefined): string {
  const raw = (cents ?? '0').trim();
  if (!CENTS.test(raw)) throw new RangeError(`Not whole cents: "${cents}".`);
  const negative = raw.startsWith('-');
  const digits = (negative ? raw.slice(1) : raw).replace(/^0+(?=\d)/, '').padStart(3, '0');
  const text = `${digits.slice(0, -2)}.${digits.slice(-2)}`;
  return negative && /[1-9]/.test(digits) ? `-${text}` : text;
}

/** The same amount with the sign turned (a credit note's parts read as minus). */
export function negatedCents(cents: string): string {
  const raw = cents.trim();
  if (!CENTS.test(raw)) throw new RangeError(`Not whole cents: "${cents}".`);
  if (/^-?0+$/.test(raw)) return '0';
  return raw.startsWith('-') ? raw.slice(1) : `-${raw}`;
}

/**
 * A tax rate in basis points as PostgreSQL prints NUMERIC(8,2) ("725.00", "887.50") -> a percent
 * without trailing zeros ("7.25", "8.875").
 */
export function ratePercent(bp: string): string {
  const m = /^(\d+)(?:\.(\d{1,2}))?$/.exec(bp.trim());
  if (!m) throw new RangeError(`Not a rate in basis points: "${bp}".`);
  // Hundredths of a basis point; a percent is 10,000 of them.
  const hundredths = (m[1] + (m[2] ?? '').padEnd(2, '0')).replace(/^0+(?=\d)/, '').padStart(5, '0');
  const whole = hundredths.slice(0, -4).replace(/^0+(?=\d)/, '');
  const fraction = hundredths.slice(-4).replace(/0+$/, '');
  return fraction ? `${whole}.${fraction}` : whole;
}

/**
 * A cell a spreadsheet would otherwise run as a formula (one starting with =, +, -, @, tab or
 * carriage return) gets a leading apostrophe, which spreadsheets read as "this is text" (OWASP,
 * "CSV Injection" page; OWASP ASVS 5.0, V1.2.10, lists the same characters). `writeCsv` applies it
 * to every text cell and header title of every export (account codes and names, labels and
 * numbers included, whoever typed them), never to a column marked `amountColumn`. Applying it
 * twice changes nothing: an apostrophe is not one of those characters.
 */
export function safeText(text: string | null | undefined): string {
  const t = text ?? '';
  return FORMULA_START.test(t) ? `'${t}` : t;
}

const FORMULA_START = /^[=+\-@\t\r]/;

export const METHOD_LABELS: Record<string, string> = {
  cash: 'cash',
  check: 'check',
  transfer: 'bank transfer',
  card: 'card',
  security_deposit: 'security deposit',
  credit: 'account credit',
};

const sqlText = (text: string) => `'${text.replace(/'/g, "''")}'`;

/**
 * The same amounts as `centsText`, printed by PostgreSQL: whole cents times 0.01 is an exact
 * NUMERIC with two places ("-0.05", "0.00"; NUMERIC has no minus zero). `unit` may be an SQL
 * expression giving -0.01 to turn the sign.
 */
export const centsSql = (cents: string, unit = '0.01') => `((${cents}) * ${unit})::text`;

/** METHOD_LABELS as an SQL expression over a payment method column. */
export const methodLabelSql = (method: string) =>
  `CASE ${method}::text ${Object.entries(METHOD_LABELS).map(([m, label]) => `WHEN ${sqlText(m)} THEN ${sqlText(label)}`).join(' ')} ELSE ${method}::text END`;

export const ACCOUNT_TYPE_LABELS: Record<string, string> = {
  asset: 'Asset',
  liability: 'Liability',
  equity: 'Equity',
  revenue: 'Revenue',
  expense: 'Expense',
  contra_revenue: 'Contra revenue',
};

export const ENTRY_KIND_LABELS: Record<string, string> = {
  invoice_issued: 'Invoice issued',
  payment_received: 'Payment received',
  refund: 'Refund',
  credit_note: 'Credit note',
  deposit_earned: 'Deposit earned',
  security_deposit_held: 'Security deposit held',
  security_deposit_refunded: 'Security deposit returned',
  security_deposit_applied: 'Security deposit applied',
  credit_refunded: 'Account credit paid back',
  card_fee: 'Card processing fee',
  reversal: 'Reversal',
};

export const entryKindLabel = (kind: string) => ENTRY_KIND_LABELS[kind] ?? kind.replace(/_/g, ' ');
