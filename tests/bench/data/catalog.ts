/**
 * The benchmark company's stock: 500 items of an established tent and party rental company
 * (tents from 10x10 to 60x90, sidewalls, tables, chairs, lighting, linens and the rest, and the
 * service lines). Names and prices are invented; every item passes the app's own ItemInput schema.
 */
import { ItemInput, type ItemKind } from '../../../shared/schemas/items';

export type Rand = () => number;
export type CatalogItem = ReturnType<typeof ItemInput.parse> & { id: string };

export const ITEM_COUNT = 500;

const tentPrice = (w: number, l: number, frame: boolean) => Math.round((w * l * (frame ? 140 : 110)) / 500) * 500;

function tents(): ItemInput[] {
  const out: ItemInput[] = [];
  const pole = [[20, 20], [20, 30], [20, 40], [30, 30], [30, 45], [30, 60], [30, 75], [40, 40], [40, 60], [40, 80], [40, 100], [60, 60], [60, 90], [60, 120]];
  const frame = [[10, 10], [10, 20], [15, 15], [20, 20], [20, 30], [20, 40], [20, 60], [30, 30], [30, 45], [30, 60], [30, 90], [40, 40], [40, 60], [40, 80], [40, 120]];
  for (const style of ['white', 'sailcloth', 'clear-top']) {
    for (const [w, l] of pole) {
      if (style === 'clear-top' && w > 40) continue;
      const sqft = w * l;
      out.push({
        name: `${w}x${l} pole tent, ${style}`, kind: 'tent', tentType: 'pole', widthFt: w, lengthFt: l, heightFt: w >= 40 ? 20 : 16,
        quantityOwned: Math.max(1, Math.round(4000 / sqft)), rentalPriceCents: tentPrice(w, l, false) + (style === 'white' ? 0 : 15_000),
        extraDayPriceCents: Math.round(tentPrice(w, l, false) / 4), replacementValueCents: sqft * 950, purchaseCostCents: sqft * 800,
        polesPerSetup: 2 + Math.ceil(l / 10) * 2, stakesPerSetup: Math.ceil((2 * (w + l)) / 10) + 4, ballastPerSetupLbs: Math.ceil((2 * (w + l)) / 10) * 500,
        description: `${w} x ${l} ft pole tent with a ${style} top; stakes or ballast per the set-up sheet.`,
      });
    }
    for (const [w, l] of frame) {
      if (style === 'sailcloth') continue;
      const sqft = w * l;
      out.push({
        name: `${w}x${l} frame tent, ${style}`, kind: 'tent', tentType: 'frame', widthFt: w, lengthFt: l, heightFt: 10 + w / 5,
        quantityOwned: Math.max(1, Math.round(3000 / sqft)), rentalPriceCents: tentPrice(w, l, true) + (style === 'white' ? 0 : 20_000),
        extraDayPriceCents: Math.round(tentPrice(w, l, true) / 4), replacementValueCents: sqft * 1400, purchaseCostCents: sqft * 1200,
        polesPerSetup: 4 + Math.ceil(l / 10) * 2, stakesPerSetup: Math.ceil((2 * (w + l)) / 10) + 4, ballastPerSetupLbs: Math.ceil((2 * (w + l)) / 10) * 400,
        description: `${w} x ${l} ft frame tent, ${style} top, free-standing.`,
      });
    }
  }
  return out;
}

function sidewalls(): ItemInput[] {
  const out: ItemInput[] = [];
  for (const style of ['solid', 'window', 'clear', 'mesh', 'french window', 'sailcloth']) {
    for (const len of [10, 15, 20, 30]) {
      for (const h of [7, 8]) {
        if (out.length >= 40) return out;
        out.push({
          name: `Sidewall, ${len} ft x ${h} ft, ${style}`, kind: 'sidewall', sectionLengthFt: len, heightFt: h,
          quantityOwned: 12 + ((len * h) % 30), rentalPriceCents: 1_500 + len * 100 + (style === 'solid' ? 0 : 1_000), extraDayPriceCents: 500,
          replacementValueCents: len * 1_300, purchaseCostCents: len * 1_000, description: `${style} sidewall section with hook-and-loop edges.`,
        });
      }
    }
  }
  return out;
}

function tables(): ItemInput[] {
  const rows: [string, number, number, number][] = [
    ['4 ft banquet table', 4, 4, 800], ['6 ft banquet table', 6, 8, 900], ['8 ft banquet table', 8, 10, 1_000], ['8 ft farm table', 8, 8, 6_500],
    ['30 in round table', 2.5, 2, 700], ['36 in round table', 3, 4, 800], ['48 in round table', 4, 6, 900], ['60 in round table', 5, 8, 1_000],
    ['66 in round table', 5.5, 9, 1_100], ['72 in round table', 6, 10, 1_200], ['30 in cocktail table', 2.5, 0, 1_200], ['36 in cocktail table', 3, 0, 1_400],
    ['Serpentine table', 5, 4, 1_500], ['Half-round table', 5, 4, 1_000], ['Kids table, 6 ft', 6, 6, 900],
  ];
  const out: ItemInput[] = [];
  for (const finish of ['', ' (white)']) {
    for (const [name, len, seats, price] of rows) {
      out.push({
        name: `${name}${finish}`, kind: 'table', lengthFt: len, seats, quantityOwned: 40 + Math.round((len * 37) % 160),
        rentalPriceCents: price + (finish ? 200 : 0), extraDayPriceCents: 300, replacementValueCents: price * 11, purchaseCostCents: price * 8,
        description: `${name}, folding.`,
      });
    }
  }
  return out;
}

function chairs(): ItemInput[] {
  const names = [
    'White folding chair', 'Black folding chair', 'Padded white folding chair', 'Brown wood folding chair', 'Natural wood folding chair',
    'Gold chiavari chair', 'Silver chiavari chair', 'White chiavari chair', 'Natural chiavari chair', 'Mahogany chiavari chair', 'Black chiavari chair',
    'Crossback chair', 'Ghost chair', 'Kids folding chair', 'Bar stool, black', 'Bar stool, white', 'Bench, 8 ft', 'Lounge chair, white',
    'Lounge sofa, white', 'Adirondack chair', 'Rocking chair', 'Highchair', 'Resin garden chair', 'Stacking banquet chair', 'Director chair',
  ];
  return names.map((name, i) => ({
    name, kind: 'chair' as const, quantityOwned: i < 5 ? 1500 - i * 150 : 150 + i * 10, rentalPriceCents: i < 5 ? 200 + i * 50 : 600 + i * 40,
    extraDayPriceCents: 50, replacementValueCents: 2_800 + i * 300, purchaseCostCents: 1_900 + i * 200, description: `${name}.`,
  }));
}

function lighting(): ItemInput[] {
  const out: ItemInput[] = [];
  const kinds: [string, number][] = [
    ['String lights', 4_500], ['Bistro lights', 5_500], ['Globe lights', 6_000], ['Edison bulb strand', 6_500], ['Fairy lights', 3_500],
    ['Pole light', 4_000], ['Uplight, LED', 2_500], ['Chandelier, crystal', 12_500], ['Chandelier, iron', 9_500], ['Lantern, paper', 1_000],
  ];
  for (const [name, price] of kinds) {
    for (const len of [25, 50, 100, 150, 200, 300]) {
      out.push({
        name: `${name}, ${len} ft run`, kind: 'lighting', lengthFt: len, quantityOwned: 6 + ((len / 25) % 12), rentalPriceCents: price + len * 10,
        extraDayPriceCents: 1_000, replacementValueCents: price * 4 + len * 40, purchaseCostCents: price * 3 + len * 30,
        description: `${name}, ${len} ft; plugs into a GFCI outlet.`,
      });
    }
  }
  return out;
}

function services(): ItemInput[] {
  const rows: [string, 'delivery' | 'setup' | 'takedown' | 'other', number][] = [
    ['Set-up and take-down crew, 2 people', 'setup', 15_000], ['Set-up and take-down crew, 4 people', 'setup', 28_000], ['Tent installation, large', 'setup', 45_000],
    ['Take-down only', 'takedown', 9_000], ['After-hours pickup', 'takedown', 12_500], ['Sunday delivery', 'delivery', 10_000],
    ['Stairs carry fee', 'delivery', 5_000], ['Long-haul delivery', 'delivery', 30_000], ['Site visit', 'other', 7_500],
    ['Tent permit filing', 'other', 12_000], ['Fire marshal inspection', 'other', 15_000], ['Utility locate coordination', 'other', 2_500],
    ['Dance floor installation', 'setup', 20_000], ['Lighting installation', 'setup', 17_500], ['Linen pressing', 'other', 4_000],
    ['Rush order fee', 'other', 10_000], ['Weekend surcharge', 'other', 7_500], ['Generator fueling', 'other', 9_000],
    ['Cleaning fee', 'other', 6_000], ['Rain-plan standby', 'other', 20_000],
  ];
  return rows.map(([name, serviceType, price]) => ({
    name, kind: 'service' as const, serviceType, quantityOwned: 0, rentalPriceCents: price, taxable: false, description: `${name}.`,
  }));
}

const LINEN_COLORS = ['white', 'ivory', 'black', 'navy', 'blush', 'sage', 'burgundy', 'champagne', 'silver', 'gold', 'dusty blue', 'charcoal', 'eggplant', 'terracotta', 'emerald'];
const LINEN_SIZES = ['90x132', '90x156', '120 round', '132 round', '108 round', '54x54 overlay', 'napkin', 'runner'];
const ACCESSORIES: [string, number, number][] = [
  ['Dance floor panel, 3x3 ft, parquet', 600, 300], ['Dance floor panel, 4x4 ft, white', 300, 900], ['Stage deck, 4x8 ft', 80, 4_500], ['Stage stairs', 20, 2_500],
  ['Patio heater, propane', 60, 7_500], ['Tent heater, 150k BTU', 20, 22_500], ['Evaporative cooler', 15, 17_500], ['Box fan, 24 in', 60, 2_500],
  ['Generator, 7 kW', 12, 17_500], ['Generator, 20 kW', 6, 35_000], ['Power distribution box', 20, 6_500], ['Extension cord, 50 ft', 200, 500],
  ['Water barrel ballast, 400 lb', 120, 1_500], ['Concrete block ballast, 1,000 lb', 80, 3_500], ['Cable ramp', 60, 1_200], ['Rain gutter, 20 ft', 40, 2_000],
  ['Bar, 8 ft, white', 20, 12_500], ['Bar, 6 ft, rustic', 12, 15_000], ['Buffet riser set', 40, 1_500], ['Chafing dish, full size', 150, 1_800],
  ['Beverage dispenser, 3 gal', 80, 1_400], ['Coffee urn, 100 cup', 30, 2_800], ['Cake stand', 40, 1_500], ['Champagne flute, rack of 25', 80, 2_000],
  ['Wine glass, rack of 25', 120, 2_000], ['Dinner plate, 10 in, dozen', 300, 700], ['Flatware set, dozen', 300, 800], ['Charger plate, gold, dozen', 100, 1_800],
  ['Podium', 10, 5_000], ['PA system, small', 8, 15_000], ['Wireless microphone', 16, 4_500], ['Projector and screen', 6, 22_500],
  ['Arch, wood', 8, 17_500], ['Arch, metal', 10, 12_500], ['Pipe and drape, 10 ft section', 120, 2_500], ['Market umbrella', 40, 3_500],
  ['Coat rack', 20, 3_000], ['Trash can with liner', 120, 800], ['Portable handwash station', 20, 9_500], ['Flooring, carpet, 10x10 ft', 60, 4_000],
  ['Flooring, interlocking tile, 10x10 ft', 80, 5_500], ['Astroturf, 10x10 ft', 40, 4_500], ['Cocktail table spandex cover', 100, 1_200], ['Lawn game set', 20, 4_500],
  ['Photo booth backdrop', 10, 15_000], ['Easel', 40, 1_000], ['Card box', 20, 1_500], ['Fire extinguisher, 10 lb', 60, 1_500], ['Exit sign, lighted', 60, 2_500],
  ['No-smoking sign', 100, 300],
];

function accessories(rand: Rand, n: number): ItemInput[] {
  const out: ItemInput[] = ACCESSORIES.map(([name, qty, price]) => ({
    name, kind: 'accessory' as const, quantityOwned: qty, rentalPriceCents: price, extraDayPriceCents: Math.round(price / 4),
    replacementValueCents: price * 6, purchaseCostCents: price * 4, description: `${name}.`,
  }));
  for (const color of LINEN_COLORS) {
    for (const size of LINEN_SIZES) {
      const napkin = size === 'napkin';
      out.push({
        name: `Linen, ${size}, ${color}`, kind: 'accessory', quantityOwned: napkin ? 600 : 60 + Math.floor(rand() * 200),
        rentalPriceCents: napkin ? 75 : 1_200 + Math.floor(rand() * 10) * 100, replacementValueCents: napkin ? 400 : 3_500, purchaseCostCents: napkin ? 250 : 2_200,
        description: `${color} polyester ${size}.`,
      });
    }
  }
  // Centerpieces and decor in many styles make up the rest of a long catalog.
  const decor = ['Centerpiece vase', 'Hurricane candle holder', 'Lantern centerpiece', 'Mirror tile', 'Table number stand', 'Votive holder, dozen', 'Gold candelabra', 'Wood slice', 'Bud vase, dozen', 'Greenery garland, 6 ft'];
  const finishes = ['clear', 'gold', 'silver', 'black', 'white', 'copper', 'rustic', 'rose gold', 'smoked', 'amber', 'green'];
  for (let i = 0; out.length < n; i++) {
    const name = `${decor[i % decor.length]}, ${finishes[Math.floor(i / decor.length) % finishes.length]}`;
    out.push({ name, kind: 'accessory', quantityOwned: 20 + Math.floor(rand() * 120), rentalPriceCents: 300 + Math.floor(rand() * 30) * 100, replacementValueCents: 2_500, purchaseCostCents: 1_500, description: `${name}.` });
  }
  return out;
}

const SKU_PREFIX: Record<ItemKind, string> = { tent: 'TN', sidewall: 'SW', table: 'TB', chair: 'CH', lighting: 'LT', accessory: 'AC', service: 'SV' };

/** Exactly ITEM_COUNT items, each checked by the app's ItemInput schema, with a unique SKU. */
export function benchCatalog(rand: Rand, newId: () => string): CatalogItem[] {
  const fixed = [...tents(), ...sidewalls(), ...tables(), ...chairs(), ...lighting(), ...services()];
  const all = [...fixed, ...accessories(rand, ITEM_COUNT - fixed.length)].slice(0, ITEM_COUNT);
  const counters = new Map<ItemKind, number>();
  return all.map((raw) => {
    const n = (counters.get(raw.kind) ?? 0) + 1;
    counters.set(raw.kind, n);
    return { ...ItemInput.parse({ ...raw, sku: `${SKU_PREFIX[raw.kind]}-${String(n).padStart(4, '0')}` }), id: newId() };
  });
}
