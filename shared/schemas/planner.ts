import { z } from 'zod';
import { SEATING_STYLES, type SeatingStyle } from './rules';

const Feet = z.number({ error: 'Enter a size in feet.' }).positive('Sizes must be above 0.').max(1000, 'At most 1,000 ft.');

/** POST /api/planner: a tent size, or a guest count with a seating style. */
export const PlannerRequest = z.union([
  z.object({
    widthFt: Feet,
    lengthFt: Feet,
    guests: z.number().int().min(1).max(100_000).optional(),
    seating: z.enum(SEATING_STYLES).optional(),
    openSided: z.boolean().optional(),
    afterDark: z.boolean().optional(),
  }),
  z.object({
    guests: z.number({ error: 'Enter the guest count.' }).int('Guests are whole people.').min(1, 'At least 1 guest.').max(100_000),
    seating: z.enum(SEATING_STYLES, { error: 'Choose banquet, rows, standing or mixed.' }),
    openSided: z.boolean().optional(),
    afterDark: z.boolean().optional(),
  }),
], { error: 'Give widthFt and lengthFt, or guests and seating.' });
export type PlannerRequest = z.infer<typeof PlannerRequest>;

/** What the planner knows of the company's stock (the server fills it from the catalog). */
export interface PlannerStock {
  tents: { itemId: string; name: string; tentType: 'pole' | 'frame'; widthFt: number; lengthFt: number; quantity: number }[];
  tables: { itemId: string; name: string; lengthFt: number; seats: number; quantity: number }[];
  chairs: { itemId: string; name: string; quantity: number }[];
  sidewalls: { itemId: string; name: string; sectionLengthFt: number; heightFt: number; quantity: number }[];
  lighting: { itemId: string; name: string; quantity: number }[];
}

export interface PlannerCaution {
  text: string;
  source: string;
}

export interface PlannerLine {
  itemId: string;
  name: string;
  quantity: number;
  /** Why this many, in plain words. */
  reason: string;
}

export interface TentRecommendation {
  itemId: string;
  name: string;
  widthFt: number;
  lengthFt: number;
  areaSqFt: number;
  /** Guests this tent holds for the seating style by the company's sizing rule, within the code's cap. */
  capacity: number;
  lines: PlannerLine[];
  /** Notes that apply to this choice (for instance: needs a permit). */
  notes: string[];
}

export interface PlannerResult {
  areaSqFt: number;
  /** IFC 2018 Table 1004.5 occupant loads, rounded up: chairs only 7, standing 5, tables and chairs 15 net sq ft. */
  occupantLoad: { chairsOnly: number; standing: number; tablesAndChairs: number };
  /** IFC 2018 §1004.5.1: never more than one occupant per 7 sq ft, rounded down. */
  increasedLoadCap: number;
  /** The occupant load the exits are sized for (guests when given, else the standing load). */
  designOccupants: number;
  /** IFC 2018 Table 3103.12.2 and §3103.12: for an enclosed tent; null when no area is known. */
  exits: { count: number; minWidthIn: number; totalWidthIn: number } | null;
  permitLikely: boolean;
  /** Sidewall sections for the perimeter: perimeter / section length, rounded up. */
  sidewallSections: number;
  /** Guests over the table load for their seating style, and what that means. */
  overLoad: { guests: number; load: number; seating: SeatingStyle; message: string } | null;
  recommendations: TentRecommendation[];
  cautions: PlannerCaution[];
}
