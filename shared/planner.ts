/**
 * The tent planner: from a tent size or a guest count, the occupant loads and exits the fire code
 * asks for, whether a permit is likely, and which tent, tables, chairs, sidewalls and lights from
 * the company's stock would serve. Pure, so the enquiry form previews what the server answers.
 *
 * It informs, it does not approve: every figure defers to the local fire code, the authority
 * having jurisdiction and the manufacturer's instructions, and the cautions say so.
 */
import type { CompanyRules, SeatingStyle } from './schemas/rules';
import type { PlannerCaution, PlannerLine, PlannerRequest, PlannerResult, PlannerStock, TentRecommendation } from './schemas/planner';

/** The company settings the planner reads. */
export type PlannerRules = Pick<CompanyRules, 'permitAreaSqFt' | 'permitOpenSidedAreaSqFt' | 'sqFtPerGuest' | 'seatsPerBanquetTable' | 'windLimitMph'>;

type LoadKind = keyof PlannerResult['occupantLoad'];

/** IFC 2018 Table 1004.5 (same as IBC 2018 Table 1004.5), net sq ft per occupant. */
export const OCCUPANT_LOAD_FACTOR: Record<LoadKind, number> = {
  chairsOnly: 7, // assembly, concentrated: chairs only, not fixed
  standing: 5, // assembly: standing space
  tablesAndChairs: 15, // assembly, unconcentrated: tables and chairs
};

/** IFC 2018 §1004.5.1: an approved increase never goes beyond one occupant per 7 sq ft. */
const INCREASED_LOAD_SQFT = 7;

/**
 * Which occupant load a seating style is held to. Mixed (some seated at tables, some standing)
 * is held to tables and chairs, the strictest of the two, to stay on the safe side.
 */
export const LOAD_FOR_SEATING: Record<SeatingStyle, LoadKind> = {
  banquet: 'tablesAndChairs',
  rows: 'chairsOnly',
  standing: 'standing',
  mixed: 'tablesAndChairs',
};

const SEATING_WORDS: Record<SeatingStyle, string> = {
  banquet: 'seated at banquet tables',
  rows: 'seated in rows of chairs',
  standing: 'standing',
  mixed: 'partly seated at tables, partly standing',
};

/** Section length when the stock lists no sidewalls: 20 ft (common practice, no published source). */
const DEFAULT_SIDEWALL_SECTION_FT = 20;
/** One string-light set per 10 ft of tent length (common practice, no published source). */
const FEET_PER_LIGHT_SET = 10;

// Tent sizes may be fractional feet; a product like 20.1 x 10 can land a hair off a whole number,
// so round-up and round-down ignore float noise below a millionth.
const ceil = (x: number) => Math.ceil(x - 1e-9);
const floor = (x: number) => Math.floor(x + 1e-9);
const areaOf = (widthFt: number, lengthFt: number) => Math.round(widthFt * lengthFt * 1e6) / 1e6;

/** IFC 2018 Table 1004.5: the load is "not less than" area / factor, so it rounds up. */
export function occupantLoads(areaSqFt: number): PlannerResult['occupantLoad'] {
  return {
    chairsOnly: ceil(areaSqFt / OCCUPANT_LOAD_FACTOR.chairsOnly),
    standing: ceil(areaSqFt / OCCUPANT_LOAD_FACTOR.standing),
    tablesAndChairs: ceil(areaSqFt / OCCUPANT_LOAD_FACTOR.tablesAndChairs),
  };
}

/** IFC 2018 §1004.5.1: the most a fire code official may approve, one occupant per 7 sq ft. */
export function increasedLoadCap(areaSqFt: number): number {
  return floor(areaSqFt / INCREASED_LOAD_SQFT);
}

/**
 * IFC 2018 Table 3103.12.2 (means of egress for tents) rows: the lowest occupant load of each
 * row, exits and the least width of each. Below 10 occupants the table asks nothing specific;
 * we use the 10-199 row anyway, to stay on the safe side.
 */
const EXIT_TABLE: { from: number; count: number; minWidthIn: number }[] = [
  { from: 3000, count: 7, minWidthIn: 120 },
  { from: 2000, count: 6, minWidthIn: 120 },
  { from: 1000, count: 5, minWidthIn: 120 },
  { from: 500, count: 4, minWidthIn: 96 },
  { from: 200, count: 3, minWidthIn: 72 },
  { from: 0, count: 2, minWidthIn: 72 },
];

/** Exits for an enclosed tent, and their total width: at least 0.2 in per occupant (IFC 2018 §3103.12). */
export function exitsFor(occupants: number): NonNullable<PlannerResult['exits']> {
  const row = EXIT_TABLE.find((r) => occupants >= r.from) ?? EXIT_TABLE[EXIT_TABLE.length - 1];
  const byOccupants = Math.ceil(Math.max(0, occupants) / 5); // 0.2 in each, in whole inches
  return { count: row.count, minWidthIn: row.minWidthIn, totalWidthIn: Math.max(row.count * row.minWidthIn, byOccupants) };
}

/** IFC 2018 §3103.2: a permit above permitAreaSqFt, or above permitOpenSidedAreaSqFt for a tent open on all sides. */
export function permitLikely(areaSqFt: number, openSided: boolean, rules: PlannerRules): boolean {
  return areaSqFt > (openSided ? rules.permitOpenSidedAreaSqFt : rules.permitAreaSqFt);
}

/** The sidewall item to plan with: the first one in stock (the first listed when none is), as for tables, chairs and lights. */
function sidewallItem(stock: PlannerStock): PlannerStock['sidewalls'][number] | undefined {
  return stock.sidewalls.find((s) => s.quantity > 0) ?? stock.sidewalls[0];
}

function sectionLength(stock: PlannerStock): number {
  return sidewallItem(stock)?.sectionLengthFt || DEFAULT_SIDEWALL_SECTION_FT;
}

/** Sidewall sections around the perimeter, rounded up: a 20x20 takes 4 sections of 20 ft. */
export function sidewallSections(widthFt: number, lengthFt: number, sectionLengthFt = DEFAULT_SIDEWALL_SECTION_FT): number {
  return ceil((2 * (widthFt + lengthFt)) / sectionLengthFt);
}

/**
 * Guests a tent holds for a seating style by the company's sizing rule (area / sq ft per guest,
 * rounded down), never above what the code could allow at most: the larger of the table load
 * and the §1004.5.1 cap.
 */
export function capacity(areaSqFt: number, seating: SeatingStyle, rules: PlannerRules): number {
  const bySizing = floor(areaSqFt / rules.sqFtPerGuest[seating]);
  const codeMost = Math.max(occupantLoads(areaSqFt)[LOAD_FOR_SEATING[seating]], increasedLoadCap(areaSqFt));
  return Math.min(bySizing, codeMost);
}

function overLoadFor(guests: number, seating: SeatingStyle, areaSqFt: number): PlannerResult['overLoad'] {
  const load = occupantLoads(areaSqFt)[LOAD_FOR_SEATING[seating]];
  if (guests <= load) return null;
  const cap = increasedLoadCap(areaSqFt);
  const over = `${guests} guests ${SEATING_WORDS[seating]} is more than the ${load} that IFC 2018 Table 1004.5 allows in ${areaSqFt} sq ft.`;
  const message =
    guests <= cap
      ? `${over} The fire code official may approve more, but never more than ${cap} (one per 7 sq ft, IFC 2018 §1004.5.1), and only when the exits suffice. Ask before you book it.`
      : `${over} That is also more than the ${cap} (one per 7 sq ft, IFC 2018 §1004.5.1) that the fire code official could ever approve: the tent is too small for this many guests.`;
  return { guests, load, seating, message };
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

function recommend(
  tent: PlannerStock['tents'][number],
  guestsAsked: number | undefined,
  seating: SeatingStyle,
  openSided: boolean,
  afterDark: boolean,
  stock: PlannerStock,
  rules: PlannerRules,
): TentRecommendation {
  const areaSqFt = areaOf(tent.widthFt, tent.lengthFt);
  const cap = capacity(areaSqFt, seating, rules);
  // A size-only request plans the tables and chairs for the tent's own capacity.
  const guests = guestsAsked ?? cap;
  const lines: PlannerLine[] = [];
  const notes: string[] = [];
  const stockNote = (name: string, need: number, have: number) => {
    if (need > have) notes.push(`Only ${have} ${name} in stock for ${need}: sub-rent ${need - have} more.`);
  };

  lines.push({
    itemId: tent.itemId,
    name: tent.name,
    quantity: 1,
    reason: `${tent.widthFt} x ${tent.lengthFt} ft ${tent.tentType} tent, ${areaSqFt} sq ft: holds ${plural(cap, 'guest')} ${SEATING_WORDS[seating]}`,
  });

  if (seating === 'banquet' || seating === 'mixed') {
    const table = stock.tables.find((t) => t.quantity > 0) ?? stock.tables[0];
    if (table) {
      const seats = table.seats || rules.seatsPerBanquetTable;
      const quantity = Math.ceil(guests / seats);
      lines.push({ itemId: table.itemId, name: table.name, quantity, reason: `${plural(guests, 'guest')} at ${seats} a table` });
      stockNote(table.name, quantity, table.quantity);
    } else {
      notes.push('No banquet tables in stock: add them to the catalog or sub-rent them.');
    }
  }

  if (seating !== 'standing') {
    const quantity = seating === 'mixed' ? Math.ceil(guests / 2) : guests;
    const chair = stock.chairs.find((c) => c.quantity > 0) ?? stock.chairs[0];
    if (chair) {
      const reason = seating === 'mixed' ? `a seat for half of ${plural(guests, 'guest')}` : `a seat for each of ${plural(guests, 'guest')}`;
      lines.push({ itemId: chair.itemId, name: chair.name, quantity, reason });
      stockNote(chair.name, quantity, chair.quantity);
    } else {
      notes.push('No chairs in stock: add them to the catalog or sub-rent them.');
    }
  }

  const wall = sidewallItem(stock);
  if (wall) {
    const length = sectionLength(stock);
    const quantity = sidewallSections(tent.widthFt, tent.lengthFt, length);
    const perimeter = 2 * (tent.widthFt + tent.lengthFt);
    lines.push({ itemId: wall.itemId, name: wall.name, quantity, reason: `${perimeter} ft of perimeter in ${length}-ft sections, in case the weather turns` });
    stockNote(wall.name, quantity, wall.quantity);
  } else {
    notes.push('No sidewalls in stock: the tent stays open if the weather turns.');
  }

  if (afterDark) {
    const light = stock.lighting.find((l) => l.quantity > 0) ?? stock.lighting[0];
    // The tent's length is its longer side, whichever way the catalog lists it.
    const length = Math.max(tent.widthFt, tent.lengthFt);
    if (light) {
      const quantity = ceil(length / FEET_PER_LIGHT_SET);
      lines.push({ itemId: light.itemId, name: light.name, quantity, reason: `one set per ${FEET_PER_LIGHT_SET} ft of a ${length}-ft tent, for after dark` });
      stockNote(light.name, quantity, light.quantity);
    } else {
      notes.push('No lighting in stock: the party runs after dark, so add lights or sub-rent them.');
    }
  }

  if (permitLikely(areaSqFt, openSided, rules)) notes.push('Needs a permit: ask the local fire code official.');
  const load = occupantLoads(areaSqFt)[LOAD_FOR_SEATING[seating]];
  if (guestsAsked !== undefined && guestsAsked > increasedLoadCap(areaSqFt) && guestsAsked > load) {
    notes.push(`Too small for ${guestsAsked} guests under the fire code.`);
  } else if (guestsAsked !== undefined && guestsAsked > load) {
    notes.push('Over the table load: ask the fire code official.');
  }

  return { itemId: tent.itemId, name: tent.name, widthFt: tent.widthFt, lengthFt: tent.lengthFt, areaSqFt, capacity: cap, lines, notes };
}

const DEFER = 'The local fire code, the fire code official and the tent maker’s instructions come first.';

function cautions(rules: PlannerRules, permit: boolean, openSided: boolean, overLoad: PlannerResult['overLoad'], noFit: number | null): PlannerCaution[] {
  const list: PlannerCaution[] = [
    {
      text: `Keep the tent at least 20 ft from buildings, lot lines, other tents and parked vehicles unless the fire code official allows less. ${DEFER}`,
      source: 'IFC 2018 §3103.8.2',
    },
    {
      text: `Carry the tent fabric's flame-resistance certificate (NFPA 701) to the site; the fire code official may ask for it. ${DEFER}`,
      source: 'NFPA 701; IFC 2018 §3104',
    },
    {
      text: `No smoking and no open flame in or near the tent; post "No Smoking" signs. Heaters, cooking and generators need the clearances the fire code and their makers ask for. ${DEFER}`,
      source: 'IFC 2018 §3107',
    },
    {
      text: 'Call the utility-locate service (811 in the US) a few working days before driving stakes, and wait until the lines are marked. Stake clear of the marks.',
      source: 'Common practice; state one-call laws',
    },
    {
      text: `Stop setting up and clear the tent when sustained wind reaches ${rules.windLimitMph} mph, or sooner if the tent maker rates it lower. Check ballast and stakes before guests arrive.`,
      source: "The manufacturer's instructions; common practice, no published source",
    },
  ];
  if (permit) {
    list.push({
      text: `A tent this size likely needs a permit: ask the local fire code official well before the event. ${DEFER}`,
      source: 'IFC 2018 §3103.2',
    });
  }
  if (openSided) {
    list.push({
      text: 'The larger permit threshold for open-sided tents holds only when every side stays open, the tents side by side total no more than the threshold, and there is 12 ft of clearance to structures and other tents. Sidewalls put up on the day end it.',
      source: 'IFC 2018 §3103.2 exception',
    });
  }
  if (overLoad) {
    list.push({
      text: `${overLoad.message} Check the exits (count and width) with the fire code official for the number of guests you expect.`,
      source: 'IFC 2018 Table 1004.5, §1004.5.1, Table 3103.12.2',
    });
  }
  if (noFit !== null) {
    list.push({
      text: `No tent in stock holds ${noFit} guests on its own. Consider two tents side by side (with the clearance the fire code asks between them), a bigger tent sub-rented from another company, or fewer guests under cover.`,
      source: 'Common practice, no published source',
    });
  }
  return list;
}

/**
 * Plans a tent. For a guest-count request the figures (area, loads, exits, permit, sidewalls)
 * are those of the smallest recommended tent; when no tent in stock fits, no area is known:
 * area and loads are 0, exits null, and a caution says so.
 */
export function plan(request: PlannerRequest, stock: PlannerStock, rules: PlannerRules): PlannerResult {
  const openSided = request.openSided ?? false;
  const afterDark = request.afterDark ?? false;
  const guests = request.guests;
  const seating: SeatingStyle = request.seating ?? 'banquet';
  const inStock = stock.tents.filter((t) => t.quantity > 0);

  let recommendations: TentRecommendation[];
  let size: { widthFt: number; lengthFt: number } | null;
  let noFit: number | null = null;

  if ('widthFt' in request) {
    size = { widthFt: request.widthFt, lengthFt: request.lengthFt };
    const same = (t: PlannerStock['tents'][number]) =>
      (t.widthFt === request.widthFt && t.lengthFt === request.lengthFt) || (t.widthFt === request.lengthFt && t.lengthFt === request.widthFt);
    recommendations = inStock.filter(same).slice(0, 3).map((t) => recommend(t, guests, seating, openSided, afterDark, stock, rules));
  } else {
    const g = request.guests;
    recommendations = inStock
      .map((t, i) => ({ t, i, area: areaOf(t.widthFt, t.lengthFt) }))
      .filter(({ area }) => capacity(area, seating, rules) >= g)
      .sort((a, b) => a.area - b.area || a.i - b.i)
      .slice(0, 3)
      .map(({ t }) => recommend(t, g, seating, openSided, afterDark, stock, rules));
    const first = recommendations[0];
    size = first ? { widthFt: first.widthFt, lengthFt: first.lengthFt } : null;
    if (!first) noFit = g;
  }

  const areaSqFt = size ? areaOf(size.widthFt, size.lengthFt) : 0;
  const occupantLoad = occupantLoads(areaSqFt);
  const designOccupants = guests ?? occupantLoad.standing;
  const permit = size ? permitLikely(areaSqFt, openSided, rules) : false;
  const overLoad = size && guests !== undefined ? overLoadFor(guests, seating, areaSqFt) : null;

  return {
    areaSqFt,
    occupantLoad,
    increasedLoadCap: increasedLoadCap(areaSqFt),
    designOccupants,
    exits: size ? exitsFor(designOccupants) : null,
    permitLikely: permit,
    sidewallSections: size ? sidewallSections(size.widthFt, size.lengthFt, sectionLength(stock)) : 0,
    overLoad,
    recommendations,
    cautions: cautions(rules, permit, openSided, overLoad, noFit),
  };
}
