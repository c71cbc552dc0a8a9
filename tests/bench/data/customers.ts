/**
 * 8,000 invented customers: people and organizations (churches, schools, clubs, venues and
 * companies), spread over the towns the company serves. Names are made from invented parts; every
 * address, e-mail and phone number is fictitious (555-01xx numbers, .test domains).
 */
import type { Rand } from './catalog';

export const CUSTOMER_COUNT = 8_000;

const FIRST = [
  'Avery', 'Blake', 'Corin', 'Dana', 'Elliot', 'Frances', 'Gale', 'Harper', 'Imani', 'Jonah', 'Kerry', 'Lena', 'Marlow', 'Nico', 'Odette', 'Perry',
  'Quinn', 'Rosalind', 'Soren', 'Tamsin', 'Ulla', 'Vance', 'Wren', 'Yara', 'Zoë', 'Amara', 'Bastian', 'Celeste', 'Dorian', 'Esme', 'Flint', 'Greer',
  'Hollis', 'Ines', 'Jasper', 'Kit', 'Linnea', 'Magnus', 'Nell', 'Orrin', 'Petra', 'Rafe', 'Sable', 'Tobias', 'Una', 'Vesna', 'Wilder', 'Xavi',
];
const LAST = [
  'Ashgrove', 'Brindle', 'Callow', 'Dunmore', 'Ellery', 'Fairweather', 'Greaves', 'Hollin', 'Ives', 'Juniper', 'Kettering', 'Lowry', 'Merriam',
  'Northcote', 'Oakes', 'Pellow', 'Quarry', 'Rooke', 'Sallow', 'Thorne', 'Underhill', 'Vail', 'Whitlock', 'Yarrow', 'Abernathy', 'Birchall',
  'Crane', 'Delacroix', 'Eastwood', 'Fenwick', 'Gilchrist', "O'Hara", 'Halloran', 'Ingram', 'Jessop', 'Kimball', 'Larkspur', 'Mayhew', 'Nightingale',
  'Oldfield', 'Penrose', 'Quennell', 'Redfern', 'Sutcliffe', 'Tremaine', 'Upton', 'Verity', 'Wakefield',
];
const ORG_KINDS = [
  ['Garden Society', false], ['Volunteer Fire Auxiliary', true], ['Elementary Parents Group', true], ['Vineyard', false], ['Community Church', true],
  ['4-H Club', true], ['Chamber of Commerce', false], ['Golf Club', false], ['Rotary Club', false], ['High School Boosters', true], ['Brewing Company', false],
  ['Country Club', false], ['Historical Society', true], ['Farmers Market', false], ['Lutheran Church', true], ['Arts Council', true], ['Law Offices', false],
  ['Dental Group', false], ['Family Farm', false], ['Events LLC', false],
] as const;
const PLACES = ['Alder Falls', 'Stonebridge', 'Hollow Creek', 'Wrenfield', 'Millrace', 'Copperleaf', 'Fernhollow', 'Quillbrook', 'Larch Point', 'Sorrel Valley'];
const STREETS = ['Birch Lane', 'Orchard Road', 'Quarry Hill Road', 'Meadow Court', 'Old Mill Road', 'Lantern Way', 'Fox Run', 'Cedar Bend', 'Main Street', 'Church Street', 'County Road 12', 'Harvest Drive'];

export interface BenchCustomer {
  id: string;
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
  createdAt: Date;
}

export function benchCustomers(rand: Rand, newId: () => string, firstDay: Date): BenchCustomer[] {
  const pick = <T,>(xs: readonly T[]) => xs[Math.floor(rand() * xs.length)];
  const span = Date.now() - firstDay.getTime();
  const out: BenchCustomer[] = [];
  for (let i = 0; i < CUSTOMER_COUNT; i++) {
    const town = pick(PLACES);
    const common = {
      id: newId(),
      phone: `555-01${String(i % 100).padStart(2, '0')} x${i}`,
      billingLine1: `${10 + Math.floor(rand() * 990)} ${pick(STREETS)}`,
      billingCity: town,
      billingRegion: 'Wrenfield County',
      billingPostalCode: `00${400 + PLACES.indexOf(town) * 3}`,
      // Customers arrive over the years; most of them come back for more than one event.
      createdAt: new Date(firstDay.getTime() - 90 * 86_400_000 + Math.floor(rand() ** 1.3 * span)),
    };
    if (rand() < 0.14) {
      const [kind, exempt] = pick(ORG_KINDS);
      const name = `${town} ${kind}${i >= PLACES.length * ORG_KINDS.length ? ` #${i}` : ''}`;
      out.push({
        ...common, type: 'organization', name, contactName: `${pick(FIRST)} ${pick(LAST)}`,
        email: `events${i}@${name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/-$/, '')}.test`,
        // Churches, schools and volunteer groups are often exempt; the rest are not.
        taxExempt: exempt && rand() < 0.7,
        notes: rand() < 0.1 ? 'Asphalt lot: ballast only there.' : '',
      });
    } else {
      const name = `${pick(FIRST)} ${pick(LAST)}`;
      out.push({
        ...common, type: 'person', name, contactName: '',
        email: rand() < 0.95 ? `${name.toLowerCase().replace(/[^a-z]+/g, '.')}.${i}@example.test` : '',
        taxExempt: false, notes: rand() < 0.05 ? 'Prefers a call, not e-mail.' : '',
      });
    }
  }
  return out;
}
