import { zonedTimeToInstant, addDays } from '../../shared/dates';

/** A small deterministic random generator, so the demo season is the same on every machine. */
export function seededRandom(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const FIRST = ['Avery', 'Blake', 'Corin', 'Dana', 'Elliot', 'Frances', 'Gale', 'Harper', 'Imani', 'Jonah', 'Kerry', 'Lena', 'Marlow', 'Nico', 'Odette', 'Perry', 'Quinn', 'Rosalind', 'Soren', 'Tamsin', 'Ulla', 'Vance', 'Wren', 'Yara'];
const LAST = ['Ashgrove', 'Brindle', 'Callow', 'Dunmore', 'Ellery', 'Fairweather', 'Greaves', 'Hollin', 'Ives', 'Juniper', 'Kettering', 'Lowry', 'Merriam', 'Northcote', 'Oakes', 'Pellow', 'Quarry', 'Rooke', 'Sallow', 'Thorne'];
const GROUPS = [
  'Wrenfield Garden Society', 'Alder Falls Volunteer Fire Auxiliary', 'Millrace Elementary Parents Group', 'Copperleaf Vineyard',
  'Hollow Creek Community Church', 'Wrenfield County 4-H Club', 'Alder Falls Chamber of Commerce', 'Stonebridge Golf Club',
];
const STREETS = ['Birch Lane', 'Orchard Road', 'Quarry Hill Road', 'Meadow Court', 'Old Mill Road', 'Lantern Way', 'Fox Run', 'Cedar Bend'];
const TOWNS = ['Alder Falls', 'Stonebridge', 'Hollow Creek', 'Wrenfield'];

export interface DemoCustomer {
  type: 'person' | 'organization';
  name: string;
  contactName: string;
  email: string;
  phone: string;
  billingLine1: string;
  billingCity: string;
  billingRegion: string;
  billingPostalCode: string;
  taxExempt: boolean;
  notes: string;
}

export function demoCustomers(rand: () => number): DemoCustomer[] {
  const pick = <T,>(xs: T[]) => xs[Math.floor(rand() * xs.length)];
  const people: DemoCustomer[] = [];
  const used = new Set<string>();
  while (people.length < 26) {
    const name = `${pick(FIRST)} ${pick(LAST)}`;
    if (used.has(name)) continue;
    used.add(name);
    people.push({
      type: 'person', name, contactName: '',
      email: `${name.toLowerCase().replace(/ /g, '.')}@example.test`,
      phone: `555-01${String(10 + people.length).padStart(2, '0')}`,
      billingLine1: `${100 + Math.floor(rand() * 800)} ${pick(STREETS)}`, billingCity: pick(TOWNS), billingRegion: 'Wrenfield County',
      billingPostalCode: `004${10 + Math.floor(rand() * 80)}`, taxExempt: false, notes: '',
    });
  }
  const groups = GROUPS.map((name, i) => ({
    type: 'organization' as const, name, contactName: `${pick(FIRST)} ${pick(LAST)}`,
    email: `events@${name.toLowerCase().replace(/[^a-z]+/g, '-').replace(/-$/, '')}.test`,
    phone: `555-02${String(10 + i).padStart(2, '0')}`,
    billingLine1: `${10 + Math.floor(rand() * 90)} ${pick(STREETS)}`, billingCity: pick(TOWNS), billingRegion: 'Wrenfield County',
    billingPostalCode: `004${10 + Math.floor(rand() * 80)}`,
    // Churches, schools and volunteer groups are often exempt; the certificate is asked for in the app.
    taxExempt: /Church|Elementary|Fire|4-H/.test(name),
    notes: /Vineyard|Golf/.test(name) ? 'Asphalt lot on the east side: ballast only there.' : '',
  }));
  return [...people, ...groups];
}

export interface DemoBookingPlan {
  date: string;
  guests: number;
  seating: 'banquet' | 'rows' | 'standing' | 'mixed';
  tentSku: string | null;
  afterDark: boolean;
  status: 'draft' | 'quoted' | 'reserved' | 'out' | 'returned' | 'closed' | 'cancelled';
  surface: 'grass' | 'soil' | 'gravel' | 'asphalt' | 'concrete';
  occasion: string;
}

/** Saturdays from a first date for n weeks. */
function saturdays(first: string, weeks: number) {
  return Array.from({ length: weeks }, (_, i) => addDays(first, i * 7));
}

/**
 * The season: last summer's events (closed or cancelled), this week's (out or reserved), and next
 * season's enquiries and reservations — with one busy weekend where three parties want the same tents.
 */
export function demoSeason(rand: () => number): DemoBookingPlan[] {
  const occasions = ['Backyard wedding', 'Graduation party', 'Family reunion', 'Fundraiser dinner', 'Birthday party', 'Church picnic', 'Anniversary party', 'Company picnic'];
  const tents = ['PT-2020', 'PT-2030', 'FT-2040'];
  const plans: DemoBookingPlan[] = [];
  const pick = <T,>(xs: T[]) => xs[Math.floor(rand() * xs.length)];
  const plan = (date: string, status: DemoBookingPlan['status'], tentSku: string | null): DemoBookingPlan => {
    const guests = tentSku === 'PT-2020' ? 30 + Math.floor(rand() * 20) : tentSku === 'PT-2030' ? 50 + Math.floor(rand() * 25) : 60 + Math.floor(rand() * 30);
    return { date, guests, seating: rand() < 0.8 ? 'banquet' : 'mixed', tentSku, afterDark: rand() < 0.5, status, surface: rand() < 0.8 ? 'grass' : pick(['gravel', 'asphalt'] as const), occasion: pick(occasions) };
  };
  // Last season, May to September 2026: done and closed, one cancelled for weather.
  saturdays('2026-05-02', 22).forEach((d, i) => plans.push(plan(d, i === 7 ? 'cancelled' : 'closed', tents[i % 3])));
  // Early autumn: returned, not yet closed.
  plans.push(plan('2026-11-21', 'returned', 'PT-2020'));
  // This week: a holiday party out now, one reserved for Saturday.
  plans.push(plan('2026-11-30', 'out', 'FT-2040'));
  plans.push(plan('2026-12-05', 'reserved', 'PT-2030'));
  // Next season: reservations and quotes.
  saturdays('2027-05-01', 6).forEach((d, i) => plans.push(plan(d, i % 2 ? 'quoted' : 'reserved', tents[(i + 1) % 3])));
  // The busy weekend: graduations on 2027-06-12 all want the 20x30.
  plans.push({ ...plan('2027-06-12', 'reserved', 'PT-2030'), occasion: 'Graduation party' });
  plans.push({ ...plan('2027-06-12', 'quoted', 'PT-2030'), occasion: 'Graduation party' });
  plans.push({ ...plan('2027-06-12', 'draft', 'PT-2030'), occasion: 'Graduation party' });
  plans.push({ ...plan('2027-06-19', 'draft', null), occasion: 'Birthday party', guests: 25, seating: 'standing' });
  return plans;
}

/** Event 2 pm to 10 pm local; delivery the day before, pickup the morning after. */
export function demoWindows(date: string, timeZone: string) {
  const at = (d: string, t: string) => zonedTimeToInstant(d, t, timeZone);
  return {
    eventStart: at(date, '14:00'), eventEnd: at(date, '22:00'),
    deliveryStart: at(addDays(date, -1), '08:00'), deliveryEnd: at(addDays(date, -1), '12:00'),
    pickupStart: at(addDays(date, 1), '09:00'), pickupEnd: at(addDays(date, 1), '13:00'),
  };
}
