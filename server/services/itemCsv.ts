import { parse } from 'csv-parse/sync';
import { ItemInput, type ItemValues } from '../../shared/schemas/items';
import { fieldErrors } from '../middlewares/validate';

const COLUMNS: Record<string, keyof ItemValues> = {
  name: 'name', kind: 'kind', sku: 'sku', description: 'description', quantity_owned: 'quantityOwned',
  rental_price: 'rentalPriceCents', extra_day_price: 'extraDayPriceCents', replacement_value: 'replacementValueCents',
  purchase_cost: 'purchaseCostCents', taxable: 'taxable', active: 'active', tent_type: 'tentType', width_ft: 'widthFt',
  length_ft: 'lengthFt', height_ft: 'heightFt', section_length_ft: 'sectionLengthFt', seats: 'seats',
  poles_per_setup: 'polesPerSetup', stakes_per_setup: 'stakesPerSetup', ballast_per_setup_lbs: 'ballastPerSetupLbs',
  service_type: 'serviceType',
};
const MONEY = new Set(['rental_price', 'extra_day_price', 'replacement_value', 'purchase_cost']);
const BOOLEAN = new Set(['taxable', 'active']);
const NUMBER = new Set(['quantity_owned', 'width_ft', 'length_ft', 'height_ft', 'section_length_ft', 'seats', 'poles_per_setup', 'stakes_per_setup', 'ballast_per_setup_lbs']);

export const CSV_COLUMNS = Object.keys(COLUMNS);

/** "1,250.5" or "$125.00" -> cents, by string arithmetic so no float rounding creeps in. */
export function parseDollars(text: string): number | string {
  const t = text.trim().replace(/^\$/, '').replace(/,/g, '');
  const m = t.match(/^(\d{1,9})(?:\.(\d{1,2}))?$/);
  if (!m) return 'Write the price in dollars, like 125.00 (no negative amounts).';
  return Number(m[1]) * 100 + Number((m[2] ?? '').padEnd(2, '0'));
}

export interface CsvRow {
  line: number;
  raw: Record<string, string>;
  values: ItemValues | null;
  errors: Record<string, string>;
}

/** Reads the CSV: an error naming the problem when the file itself is malformed, else each row checked. */
export function readItemCsv(text: string): { rows: CsvRow[] } | { fileError: string } {
  let records: Record<string, string>[];
  try {
    records = parse(text, {
      columns: (header: string[]) => header.map((h) => h.trim().toLowerCase().replace(/\s+/g, '_')),
      skip_empty_lines: true,
      trim: true,
      bom: true,
      max_record_size: 10_000,
    });
  } catch (err) {
    return { fileError: `The file is not valid CSV: ${(err as Error).message}` };
  }
  if (records.length === 0) return { fileError: 'The file has a header but no rows.' };
  const header = Object.keys(records[0]);
  const unknown = header.filter((h) => !(h in COLUMNS));
  if (unknown.length) return { fileError: `Unknown column${unknown.length > 1 ? 's' : ''}: ${unknown.join(', ')}. Known: ${CSV_COLUMNS.join(', ')}.` };
  for (const needed of ['name', 'kind', 'rental_price']) {
    if (!header.includes(needed)) return { fileError: `The header has no "${needed}" column.` };
  }
  return {
    rows: records.map((raw, i) => {
      const errors: Record<string, string> = {};
      const input: Record<string, unknown> = {};
      for (const [col, value] of Object.entries(raw)) {
        const field = COLUMNS[col];
        if (value === '' || value === undefined) continue;
        if (MONEY.has(col)) {
          const cents = parseDollars(value);
          if (typeof cents === 'string') errors[col] = cents;
          else input[field] = cents;
        } else if (BOOLEAN.has(col)) {
          const v = value.toLowerCase();
          if (['true', 'yes', 'y', '1'].includes(v)) input[field] = true;
          else if (['false', 'no', 'n', '0'].includes(v)) input[field] = false;
          else errors[col] = 'Write true or false.';
        } else if (NUMBER.has(col)) {
          const n = Number(value);
          if (!Number.isFinite(n)) errors[col] = 'Write a number.';
          else input[field] = n;
        } else {
          input[field] = field === 'kind' || field === 'tentType' || field === 'serviceType' ? value.toLowerCase() : value;
        }
      }
      const parsed = ItemInput.safeParse(input);
      if (!parsed.success) {
        const byField = fieldErrors(parsed.error);
        const toColumn = Object.fromEntries(Object.entries(COLUMNS).map(([c, f]) => [f, c]));
        for (const [f, m] of Object.entries(byField)) errors[toColumn[f] ?? f] ??= m;
      }
      // Line numbers as a spreadsheet shows them: the header is line 1.
      return { line: i + 2, raw, values: Object.keys(errors).length ? null : parsed.data!, errors };
    }),
  };
}
