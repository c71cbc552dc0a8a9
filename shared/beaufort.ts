/**
 * The Beaufort wind scale as the U.S. National Weather Service tabulates it ("Beaufort Wind
 * Scale" table): each force with its sustained wind in knots and in miles per hour. The site
 * checklist names the force of the company's wind limits, so a crew reading a marine or
 * weather forecast in Beaufort terms knows where the limit falls.
 */

export interface BeaufortForce {
  force: number;
  /** The NWS table's description. */
  name: string;
  /** Lowest sustained speed of the force, knots and mph (whole numbers, as the table gives them). */
  minKnots: number;
  /** Highest; null for force 12 (64 knots / 73 mph and above). */
  maxKnots: number | null;
  minMph: number;
  maxMph: number | null;
}

// U.S. National Weather Service, Beaufort wind scale table (force: knots; mph).
export const BEAUFORT_SCALE: readonly BeaufortForce[] = [
  { force: 0, name: 'Calm', minKnots: 0, maxKnots: 0, minMph: 0, maxMph: 0 }, // < 1 knot, < 1 mph
  { force: 1, name: 'Light air', minKnots: 1, maxKnots: 3, minMph: 1, maxMph: 3 },
  { force: 2, name: 'Light breeze', minKnots: 4, maxKnots: 6, minMph: 4, maxMph: 7 },
  { force: 3, name: 'Gentle breeze', minKnots: 7, maxKnots: 10, minMph: 8, maxMph: 12 },
  { force: 4, name: 'Moderate breeze', minKnots: 11, maxKnots: 16, minMph: 13, maxMph: 18 },
  { force: 5, name: 'Fresh breeze', minKnots: 17, maxKnots: 21, minMph: 19, maxMph: 24 },
  { force: 6, name: 'Strong breeze', minKnots: 22, maxKnots: 27, minMph: 25, maxMph: 31 },
  { force: 7, name: 'Near gale', minKnots: 28, maxKnots: 33, minMph: 32, maxMph: 38 },
  { force: 8, name: 'Gale', minKnots: 34, maxKnots: 40, minMph: 39, maxMph: 46 },
  { force: 9, name: 'Strong gale', minKnots: 41, maxKnots: 47, minMph: 47, maxMph: 54 },
  { force: 10, name: 'Storm', minKnots: 48, maxKnots: 55, minMph: 55, maxMph: 63 },
  { force: 11, name: 'Violent storm', minKnots: 56, maxKnots: 63, minMph: 64, maxMph: 72 },
  { force: 12, name: 'Hurricane', minKnots: 64, maxKnots: null, minMph: 73, maxMph: null },
];

/**
 * The force of a sustained wind in mph. The table gives whole-mph bands with gaps between them
 * (31 | 32), so a fractional speed belongs to the highest force whose lowest speed it reaches:
 * 31.5 mph is still force 6, 32 mph is force 7.
 */
export function beaufortForMph(mph: number): BeaufortForce {
  if (!Number.isFinite(mph) || mph < 0) throw new RangeError('A wind speed is a number of mph, 0 or more.');
  const whole = Math.floor(mph);
  let found = BEAUFORT_SCALE[0];
  for (const f of BEAUFORT_SCALE) if (whole >= f.minMph) found = f;
  return found;
}

/** "Beaufort force 7 (near gale, 32–38 mph)". */
export function describeBeaufort(f: BeaufortForce): string {
  const range = f.maxMph === null ? `${f.minMph} mph and above` : f.force === 0 ? 'under 1 mph' : `${f.minMph}–${f.maxMph} mph`;
  return `Beaufort force ${f.force} (${f.name.toLowerCase()}, ${range})`;
}
