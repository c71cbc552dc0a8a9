import { describe, expect, it } from 'vitest';
import { loadList, type LoadListLine, type LoadListStop } from '../../shared/loadList';

// Set-up needs are this test's own catalog values; every total below is worked by hand from them.
const tent2030: Omit<LoadListLine, 'quantity'> = { itemId: 'tent-2030', name: '20x30 pole tent', kind: 'tent', lineKind: 'rental', polesPerSetup: 9, stakesPerSetup: 20, ballastPerSetupLbs: 3000 };
const tent2020: Omit<LoadListLine, 'quantity'> = { itemId: 'tent-2020', name: '20x20 frame tent', kind: 'tent', lineKind: 'rental', polesPerSetup: 12, stakesPerSetup: 12, ballastPerSetupLbs: 1200 };
const item = (itemId: string | null, name: string, kind: LoadListLine['kind'], quantity: number): LoadListLine => ({
  itemId, name, kind, quantity, lineKind: 'rental', polesPerSetup: null, stakesPerSetup: null, ballastPerSetupLbs: null,
});

const stops: LoadListStop[] = [
  {
    bookingId: 'a', reference: 'B-1001', stop: 'delivery', anchoring: 'stakes',
    lines: [
      { ...tent2030, quantity: 1 },
      item('wall', 'Sidewall 7x20', 'sidewall', 5),
      item('table', '8-ft banquet table', 'table', 8),
      item('chair', 'White folding chair', 'chair', 75),
      item('lights', 'String-light set', 'lighting', 3),
      item('svc', 'Set-up labor', 'service', 1),
      { ...item(null, 'Delivery', null, 1), lineKind: 'fee' },
    ],
  },
  {
    bookingId: 'b', reference: 'B-1002', stop: 'delivery', anchoring: 'ballast',
    lines: [
      { ...tent2020, quantity: 2 },
      item('chair', 'White folding chair', 'chair', 40),
      item(null, 'Cake table skirt', null, 2),
    ],
  },
  {
    bookingId: 'c', reference: 'B-0998', stop: 'pickup', anchoring: 'stakes',
    lines: [{ ...tent2020, quantity: 1 }, item('chair', 'White folding chair', 'chair', 30), item('table', '8-ft banquet table', 'table', 4)],
  },
];

describe('load list for a day with several bookings', () => {
  const list = loadList(stops);

  it('totals what leaves the yard by kind, naming the bookings', () => {
    const out = Object.fromEntries(list.outgoing.groups.map((g) => [g.group, g]));
    expect(list.outgoing.groups.map((g) => g.group)).toEqual(['tent', 'sidewall', 'table', 'chair', 'lighting', 'other']);
    expect(out.tent.total).toBe(3); // 1 + 2
    expect(out.tent.rows).toEqual([
      { itemId: 'tent-2020', name: '20x20 frame tent', quantity: 2, references: ['B-1002'] },
      { itemId: 'tent-2030', name: '20x30 pole tent', quantity: 1, references: ['B-1001'] },
    ]);
    expect(out.chair.rows).toEqual([{ itemId: 'chair', name: 'White folding chair', quantity: 115, references: ['B-1001', 'B-1002'] }]); // 75 + 40
    expect(out.sidewall.total).toBe(5);
    expect(out.table.total).toBe(8);
    expect(out.lighting.total).toBe(3);
    expect(out.other.rows).toEqual([{ itemId: null, name: 'Cake table skirt', quantity: 2, references: ['B-1002'] }]);
  });

  it('leaves services and fees off the truck', () => {
    const names = list.outgoing.groups.flatMap((g) => g.rows.map((r) => r.name));
    expect(names).not.toContain('Set-up labor');
    expect(names).not.toContain('Delivery');
  });

  it('works out tent hardware from each tent’s set-up needs and how its site is anchored', () => {
    // Poles: 1 x 9 + 2 x 12 = 33. Stakes: only B-1001 is staked, 1 x 20 = 20. Ballast: only B-1002, 2 x 1,200 = 2,400 lb.
    expect(list.outgoing.hardware).toEqual({ poles: 33, stakes: 20, ballastLbs: 2400 });
    expect(list.outgoing.notes).toEqual([]);
  });

  it('totals what comes back from the day’s pickups separately', () => {
    const back = Object.fromEntries(list.returning.groups.map((g) => [g.group, g.total]));
    expect(back).toEqual({ tent: 1, table: 4, chair: 30 });
    expect(list.returning.hardware).toEqual({ poles: 12, stakes: 12, ballastLbs: 0 }); // one staked 20x20: 12 poles, 12 stakes
  });

  it('says so when the catalog does not give a tent’s needs, instead of counting zero silently', () => {
    const r = loadList([{ bookingId: 'd', reference: 'B-2000', stop: 'delivery', anchoring: 'ballast', lines: [{ ...tent2030, ballastPerSetupLbs: null, polesPerSetup: null, quantity: 1 }] }]);
    expect(r.outgoing.hardware).toEqual({ poles: 0, stakes: 0, ballastLbs: 0 });
    expect(r.outgoing.notes).toHaveLength(2);
    expect(r.outgoing.notes.join(' ')).toMatch(/poles.*count them by hand/);
    expect(r.outgoing.notes.join(' ')).toMatch(/ballast/);
  });

  it('an empty day has empty sections', () => {
    expect(loadList([])).toEqual({ outgoing: { groups: [], hardware: { poles: 0, stakes: 0, ballastLbs: 0 }, notes: [] }, returning: { groups: [], hardware: { poles: 0, stakes: 0, ballastLbs: 0 }, notes: [] } });
  });
});
