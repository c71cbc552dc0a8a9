/** The columns the import reads, in the order of the example file. */
export const IMPORT_COLUMNS = [
  'name',
  'kind',
  'sku',
  'description',
  'quantity_owned',
  'rental_price',
  'extra_day_price',
  'replacement_value',
  'purchase_cost',
  'taxable',
  'active',
  'tent_type',
  'width_ft',
  'length_ft',
  'height_ft',
  'section_length_ft',
  'seats',
  'poles_per_setup',
  'stakes_per_setup',
  'ballast_per_setup_lbs',
  'service_type',
] as const;

type Row = Partial<Record<(typeof IMPORT_COLUMNS)[number], string>>;

/** Invented example stock, one row per kind, so the file shows every column in use. */
const EXAMPLE_ROWS: Row[] = [
  { name: '20 x 30 pole tent', kind: 'tent', sku: 'PT-2030', description: 'White vinyl top, center poles', quantity_owned: '2', rental_price: '450.00', extra_day_price: '150.00', replacement_value: '6500.00', purchase_cost: '4800.00', taxable: 'true', active: 'true', tent_type: 'pole', width_ft: '20', length_ft: '30', poles_per_setup: '14', stakes_per_setup: '18', ballast_per_setup_lbs: '' },
  { name: '20 x 20 frame tent', kind: 'tent', sku: 'FT-2020', description: 'Free-standing frame; stakes or ballast', quantity_owned: '3', rental_price: '375.00', extra_day_price: '125.00', replacement_value: '5200.00', purchase_cost: '3900.00', taxable: 'true', active: 'true', tent_type: 'frame', width_ft: '20', length_ft: '20', poles_per_setup: '8', stakes_per_setup: '8', ballast_per_setup_lbs: '1600' },
  { name: 'Sidewall, solid white 20 ft', kind: 'sidewall', sku: 'SW-20', quantity_owned: '16', rental_price: '25.00', extra_day_price: '10.00', replacement_value: '180.00', taxable: 'true', active: 'true', height_ft: '7', section_length_ft: '20' },
  { name: '8 ft banquet table', kind: 'table', sku: 'BT-8', quantity_owned: '40', rental_price: '10.00', extra_day_price: '3.00', replacement_value: '120.00', taxable: 'yes', active: 'yes', length_ft: '8', seats: '10' },
  { name: 'White folding chair', kind: 'chair', sku: 'CH-W', quantity_owned: '300', rental_price: '2.25', extra_day_price: '0.75', replacement_value: '35.00', taxable: '1', active: '1' },
  { name: 'String lights, 48 ft', kind: 'lighting', sku: 'LT-48', quantity_owned: '12', rental_price: '40.00', replacement_value: '90.00', taxable: 'true', active: 'true' },
  { name: 'Set-up crew, per hour', kind: 'service', sku: 'SV-SET', rental_price: '65.00', taxable: 'false', active: 'true', service_type: 'setup' },
];

function cell(value: string | undefined): string {
  const text = value ?? '';
  return /[",\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

export function exampleCsv(): string {
  const lines = [IMPORT_COLUMNS.join(','), ...EXAMPLE_ROWS.map((row) => IMPORT_COLUMNS.map((c) => cell(row[c])).join(','))];
  return `${lines.join('\r\n')}\r\n`;
}

/** A data: URL the link downloads, made in the browser. */
export function exampleCsvHref(): string {
  return `data:text/csv;charset=utf-8,${encodeURIComponent(exampleCsv())}`;
}
