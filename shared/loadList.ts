/**
 * The load list: what leaves the yard on a day's deliveries and what comes back on its pickups,
 * totalled by kind of stock, with the hardware each tent needs (poles, and stakes or ballast by
 * how the site is anchored) worked out from the catalog's set-up needs. Pure, so the client and
 * the PDF show exactly what the API answers. No prices: the crew reads this.
 */
import type { ItemKind } from './schemas/items';

export interface LoadListLine {
  itemId: string | null;
  /** The catalog item's name, or the line's own description for a free-text line. */
  name: string;
  kind: ItemKind | null;
  quantity: number;
  lineKind: 'rental' | 'fee';
  polesPerSetup: number | null;
  stakesPerSetup: number | null;
  ballastPerSetupLbs: number | null;
}

export interface LoadListStop {
  bookingId: string;
  reference: string;
  /** A delivery loads the truck; a pickup brings the stock back. */
  stop: 'delivery' | 'pickup';
  anchoring: 'stakes' | 'ballast';
  lines: LoadListLine[];
}

/** The groups a load list reads in, in loading order. Services and fees never load. */
export const LOAD_GROUPS = ['tent', 'sidewall', 'table', 'chair', 'lighting', 'accessory', 'other'] as const;
export type LoadGroup = (typeof LOAD_GROUPS)[number];
export const LOAD_GROUP_LABELS: Record<LoadGroup, string> = {
  tent: 'Tents',
  sidewall: 'Sidewalls',
  table: 'Tables',
  chair: 'Chairs',
  lighting: 'Lighting',
  accessory: 'Accessories',
  other: 'Other lines (not in the catalog)',
};

export interface LoadRow {
  itemId: string | null;
  name: string;
  quantity: number;
  /** The bookings the units go to (or come back from), by reference. */
  references: string[];
}

export interface LoadSection {
  groups: { group: LoadGroup; label: string; total: number; rows: LoadRow[] }[];
  /** Tent hardware: poles for every tent; stakes where the site is staked, ballast where it is weighted. */
  hardware: { poles: number; stakes: number; ballastLbs: number };
  /** Where the catalog does not say what a tent needs: count those by hand. */
  notes: string[];
}

export interface LoadList {
  outgoing: LoadSection;
  returning: LoadSection;
}

function groupOf(line: LoadListLine): LoadGroup | null {
  if (line.lineKind === 'fee' || line.kind === 'service') return null;
  if (!line.itemId || !line.kind) return 'other';
  return line.kind;
}

function section(stops: LoadListStop[]): LoadSection {
  const rows = new Map<string, LoadRow & { group: LoadGroup }>();
  const hardware = { poles: 0, stakes: 0, ballastLbs: 0 };
  const notes = new Set<string>();
  for (const stop of stops) {
    for (const line of stop.lines) {
      const group = groupOf(line);
      if (!group || line.quantity <= 0) continue;
      // Free-text lines with the same words are the same thing on the truck.
      const key = line.itemId ?? `text:${line.name.trim().toLowerCase()}`;
      const row = rows.get(key) ?? { group, itemId: line.itemId, name: line.name, quantity: 0, references: [] };
      row.quantity += line.quantity;
      if (!row.references.includes(stop.reference)) row.references.push(stop.reference);
      rows.set(key, row);

      if (group !== 'tent') continue;
      if (line.polesPerSetup === null) notes.add(`${line.name}: the catalog does not say how many poles it takes; count them by hand.`);
      else hardware.poles += line.quantity * line.polesPerSetup;
      if (stop.anchoring === 'stakes') {
        if (line.stakesPerSetup === null) notes.add(`${line.name}: the catalog does not say how many stakes it takes; count them by hand.`);
        else hardware.stakes += line.quantity * line.stakesPerSetup;
      } else if (line.ballastPerSetupLbs === null) {
        notes.add(`${line.name}: the catalog does not say how much ballast it takes; weigh it out by the maker's table.`);
      } else {
        hardware.ballastLbs += line.quantity * line.ballastPerSetupLbs;
      }
    }
  }
  const groups = LOAD_GROUPS.map((group) => {
    const inGroup = [...rows.values()].filter((r) => r.group === group).sort((a, b) => a.name.localeCompare(b.name));
    return {
      group,
      label: LOAD_GROUP_LABELS[group],
      total: inGroup.reduce((n, r) => n + r.quantity, 0),
      rows: inGroup.map(({ itemId, name, quantity, references }) => ({ itemId, name, quantity, references: [...references].sort() })),
    };
  }).filter((g) => g.rows.length > 0);
  return { groups, hardware, notes: [...notes].sort() };
}

/** Totals a day's stops: deliveries load the truck, pickups come back. */
export function loadList(stops: LoadListStop[]): LoadList {
  return {
    outgoing: section(stops.filter((s) => s.stop === 'delivery')),
    returning: section(stops.filter((s) => s.stop === 'pickup')),
  };
}
