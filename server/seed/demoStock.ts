import type { ItemInput } from '../../shared/schemas/items';

type ItemValuesIn = ItemInput;

/** The demo company's stock: a young company's first tents, tables and chairs. Prices are invented. */
const tent = (name: string, sku: string, tentType: 'pole' | 'frame', widthFt: number, lengthFt: number, price: number, extra: number, replacement: number, cost: number, poles: number, stakes: number, ballast: number) => ({
  name, sku, kind: 'tent' as const, tentType, widthFt, lengthFt, quantityOwned: 1, rentalPriceCents: price, extraDayPriceCents: extra,
  replacementValueCents: replacement, purchaseCostCents: cost, polesPerSetup: poles, stakesPerSetup: stakes, ballastPerSetupLbs: ballast,
  description: `${widthFt} x ${lengthFt} ft ${tentType} tent, white vinyl top.`,
});

export const DEMO_STOCK: ItemValuesIn[] = [
  tent('20x20 pole tent', 'PT-2020', 'pole', 20, 20, 35_000, 10_000, 320_000, 280_000, 5, 12, 1_600),
  tent('20x30 pole tent', 'PT-2030', 'pole', 20, 30, 45_000, 12_500, 420_000, 365_000, 6, 16, 2_400),
  tent('20x40 frame tent', 'FT-2040', 'frame', 20, 40, 85_000, 25_000, 780_000, 690_000, 10, 20, 3_200),
  { name: 'Sidewall, 20 ft x 7 ft, solid', sku: 'SW-207S', kind: 'sidewall' as const, sectionLengthFt: 20, heightFt: 7, quantityOwned: 10, rentalPriceCents: 2_500, extraDayPriceCents: 1_000, replacementValueCents: 22_000, purchaseCostCents: 18_000, description: 'Solid white sidewall section with hook-and-loop edges.' },
  { name: 'Sidewall, 20 ft x 7 ft, window', sku: 'SW-207W', kind: 'sidewall' as const, sectionLengthFt: 20, heightFt: 7, quantityOwned: 4, rentalPriceCents: 3_500, extraDayPriceCents: 1_000, replacementValueCents: 30_000, purchaseCostCents: 24_000, description: 'Sidewall section with clear windows.' },
  { name: '8 ft banquet table', sku: 'TB-8', kind: 'table' as const, lengthFt: 8, seats: 10, quantityOwned: 14, rentalPriceCents: 1_000, extraDayPriceCents: 300, replacementValueCents: 11_000, purchaseCostCents: 8_500, description: 'Folding 8 ft x 30 in table; 4 a side and 1 at each end.' },
  { name: 'White folding chair', sku: 'CH-WF', kind: 'chair' as const, quantityOwned: 100, rentalPriceCents: 200, extraDayPriceCents: 50, replacementValueCents: 2_800, purchaseCostCents: 1_900, description: 'Resin folding chair.' },
  { name: 'String lights, 100 ft', sku: 'LT-S100', kind: 'lighting' as const, lengthFt: 100, quantityOwned: 6, rentalPriceCents: 4_500, extraDayPriceCents: 1_500, replacementValueCents: 16_000, purchaseCostCents: 12_000, description: 'Warm-white bulbs every 2 ft; plugs into a GFCI outlet.' },
  { name: 'Water barrel ballast, 400 lb', sku: 'BL-400', kind: 'accessory' as const, quantityOwned: 8, rentalPriceCents: 1_500, extraDayPriceCents: 0, replacementValueCents: 9_000, purchaseCostCents: 7_000, description: 'For tents on asphalt or concrete where stakes cannot go.' },
  { name: 'Linen, 90x132 white', sku: 'LN-90W', kind: 'accessory' as const, quantityOwned: 20, rentalPriceCents: 1_200, extraDayPriceCents: 0, replacementValueCents: 3_500, purchaseCostCents: 2_200, description: 'Fits an 8 ft banquet table to the floor.' },
  { name: 'Set-up and take-down crew', sku: 'SV-CREW', kind: 'service' as const, serviceType: 'setup' as const, quantityOwned: 0, rentalPriceCents: 15_000, taxable: false, description: 'Two people, up to three hours on site.' },
];
