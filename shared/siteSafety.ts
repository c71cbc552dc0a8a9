/**
 * Site safety before anything is staked: the locate rule, the tent's occupant load and exits
 * from the planner's fire-code values, the company's wind limits with their Beaufort force, and
 * the cautions the crew reads on the site checklist. Pure, so the phone screen previews exactly
 * what the server decides. It informs; the local fire code official, the authority having
 * jurisdiction, the manufacturer's instructions and licensed practice decide.
 */
import { beaufortForMph, describeBeaufort } from './beaufort';
import { exitsFor, LOAD_FOR_SEATING, occupantLoads } from './planner';
import type { CompanyRules, SeatingStyle } from './schemas/rules';

export type SiteSafetyRules = Pick<CompanyRules, 'windLimitMph' | 'occupiedWindLimitMph' | 'permitAreaSqFt'>;

/** What the locate rule reads from a site check. */
export interface LocateState {
  locateNumber: string;
  /** The crew declares a hard surface held down with ballast only: no stake goes into the ground. */
  hardSurfaceBallast: boolean;
}

/**
 * Staking is not marked ready until a utility-locate ticket number is recorded, or the site is
 * declared a hard surface held with ballast (nothing is driven into the ground).
 */
export function stakingReadiness(check: LocateState): { ready: boolean; reason: string | null } {
  if (check.locateNumber.trim() !== '') return { ready: true, reason: null };
  if (check.hardSurfaceBallast) return { ready: true, reason: null };
  return {
    ready: false,
    reason: 'Record the utility-locate ticket number (call 811 or the local one-call center first), or declare the site a hard surface held with ballast only.',
  };
}

export interface TentOnSite {
  name: string;
  widthFt: number;
  lengthFt: number;
  quantity: number;
}

export interface TentSafety {
  name: string;
  widthFt: number;
  lengthFt: number;
  areaSqFt: number;
  /** The occupant load for the booking's seating, IFC 2018 Table 1004.5. */
  occupantLoad: number;
  /** Exits for that load (or the guests, when more), IFC 2018 Table 3103.12.2 and §3103.12. */
  exits: { count: number; minWidthIn: number; totalWidthIn: number };
  permitLikely: boolean;
}

export interface WindLimit {
  mph: number;
  beaufort: number;
  label: string;
}

export interface SiteSafety {
  tents: TentSafety[];
  /** Guests on the booking against the sum of the tents' loads. */
  guestCount: number;
  totalOccupantLoad: number;
  overLoad: boolean;
  wind: { occupied: WindLimit; takeDown: WindLimit };
  cautions: { text: string; source: string }[];
}

const DEFER = 'The local fire code official, the tent maker’s instructions and licensed practice come first.';

function windLimit(mph: number): WindLimit {
  const f = beaufortForMph(mph);
  return { mph, beaufort: f.force, label: describeBeaufort(f) };
}

/** The safety figures and cautions for one delivery's tents, guests and seating. */
export function siteSafety(input: { tents: TentOnSite[]; guestCount: number; seating: SeatingStyle }, rules: SiteSafetyRules): SiteSafety {
  const loadKind = LOAD_FOR_SEATING[input.seating];
  const tents: TentSafety[] = [];
  // With one tent every guest is in it; with several the split is unknown, so each is held to its own load.
  const single = input.tents.length === 1 && input.tents[0].quantity === 1;
  for (const t of input.tents) {
    const areaSqFt = Math.round(t.widthFt * t.lengthFt * 1e6) / 1e6;
    const occupantLoad = occupantLoads(areaSqFt)[loadKind];
    const exits = exitsFor(single ? Math.max(occupantLoad, input.guestCount) : occupantLoad);
    // IFC 2018 §3103.2, held to the enclosed-tent threshold: sidewalls may go up on the day.
    const entry = { name: t.name, widthFt: t.widthFt, lengthFt: t.lengthFt, areaSqFt, occupantLoad, exits, permitLikely: areaSqFt > rules.permitAreaSqFt };
    for (let i = 0; i < t.quantity; i++) tents.push(entry);
  }
  const totalOccupantLoad = tents.reduce((n, t) => n + t.occupantLoad, 0);
  const overLoad = tents.length > 0 && input.guestCount > totalOccupantLoad;
  const occupied = windLimit(rules.occupiedWindLimitMph);
  const takeDown = windLimit(rules.windLimitMph);

  const cautions: SiteSafety['cautions'] = [
    {
      text: 'Before any stake goes in: the utility locate must be requested (811, or the local one-call center) and the lines marked. Stake well clear of every mark; hand-dig near them.',
      source: '811, the U.S. call-before-you-dig number; state one-call laws',
    },
    {
      text: 'The locate marks public lines only. Ask the customer to show private lines (sprinklers, propane, septic, power to outbuildings, pool and lighting cables) and stay clear of them.',
      source: 'Common practice, no published source',
    },
    {
      text: `Keep the tent at least 20 ft from buildings, lot lines, other tents and parked vehicles unless the fire code official allows less. ${DEFER}`,
      source: 'IFC 2018 §3103.8.2',
    },
    {
      text: `Guests leave the tent when sustained wind reaches ${occupied.mph} mph (${occupied.label}); stop work and take the tent down at ${takeDown.mph} mph (${takeDown.label}), sooner when the tent maker rates it lower.`,
      source: 'Company settings; trade-association guidance (above 30–38 mph it is too hazardous to stay inside a tent); Beaufort scale per the U.S. National Weather Service',
    },
    {
      text: `Keep every exit clear and marked, as many and as wide as the occupant load asks. ${DEFER}`,
      source: 'IFC 2018 Table 3103.12.2, §3103.12',
    },
    {
      text: 'Generators, heaters and cooking stay outside the tent at the distances their makers and the fire code ask; power and lighting are run by the book, and hard-wired work is for a licensed electrician.',
      source: "The manufacturer's instructions; licensed practice",
    },
  ];
  if (overLoad) {
    cautions.push({
      text: `${input.guestCount} guests is more than the ${totalOccupantLoad} the tent${tents.length === 1 ? '' : 's'} may hold for this seating. Tell the office before set-up; the fire code official decides.`,
      source: 'IFC 2018 Table 1004.5',
    });
  }
  if (tents.some((t) => t.permitLikely)) {
    cautions.push({ text: `A tent this size likely needs a permit: make sure the office has it before set-up. ${DEFER}`, source: 'IFC 2018 §3103.2' });
  }
  return { tents, guestCount: input.guestCount, totalOccupantLoad, overLoad, wind: { occupied, takeDown }, cautions };
}
