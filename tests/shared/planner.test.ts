import { describe, expect, it } from 'vitest';
import { capacity, exitsFor, increasedLoadCap, occupantLoads, permitLikely, plan, sidewallSections, type PlannerRules } from '../../shared/planner';
import type { PlannerStock } from '../../shared/schemas/planner';
import { DEFAULT_RULES } from '../../shared/schemas/rules';

const rules: PlannerRules = DEFAULT_RULES;

const tent = (itemId: string, widthFt: number, lengthFt: number, quantity = 1) => ({ itemId, name: `${widthFt}x${lengthFt} pole tent`, tentType: 'pole' as const, widthFt, lengthFt, quantity });
const stock = (over: Partial<PlannerStock> = {}): PlannerStock => ({
  tents: [tent('t2020', 20, 20), tent('t2030', 20, 30), tent('t3060', 30, 60, 0), tent('t4060', 40, 60)],
  tables: [{ itemId: 'tbl8', name: '8-ft banquet table', lengthFt: 8, seats: 10, quantity: 40 }],
  chairs: [{ itemId: 'chair', name: 'White folding chair', quantity: 300 }],
  sidewalls: [{ itemId: 'wall', name: 'Sidewall 7x20', sectionLengthFt: 20, heightFt: 7, quantity: 20 }],
  lighting: [{ itemId: 'lights', name: 'String-light set', quantity: 12 }],
  ...over,
});
const lineFor = (lines: { itemId: string; quantity: number; reason: string }[], itemId: string) => lines.find((l) => l.itemId === itemId);

describe('occupant load, IFC 2018 Table 1004.5 and §1004.5.1', () => {
  it('20x20: 400 sq ft', () => {
    expect(occupantLoads(400)).toEqual({
      chairsOnly: 58, // 400 / 7 = 57.1, rounded up (IFC 2018 Table 1004.5, chairs only, not fixed: 7 net)
      standing: 80, // 400 / 5 (IFC 2018 Table 1004.5, standing space: 5 net)
      tablesAndChairs: 27, // 400 / 15 = 26.7, rounded up (IFC 2018 Table 1004.5, unconcentrated: 15 net)
    });
    expect(increasedLoadCap(400)).toBe(57); // 400 / 7 = 57.1, rounded down (IFC 2018 §1004.5.1)
  });

  it('20x40: 800 sq ft, and 30x60: 1,800 sq ft', () => {
    expect(occupantLoads(800)).toEqual({ chairsOnly: 115, standing: 160, tablesAndChairs: 54 }); // 114.3, 160, 53.3 up (IFC 2018 Table 1004.5)
    expect(increasedLoadCap(800)).toBe(114); // IFC 2018 §1004.5.1
    expect(occupantLoads(1800)).toEqual({ chairsOnly: 258, standing: 360, tablesAndChairs: 120 }); // 257.1, 360, 120 (IFC 2018 Table 1004.5)
    expect(increasedLoadCap(1800)).toBe(257); // IFC 2018 §1004.5.1
  });

  it('plan() reports them for a size request', () => {
    const r = plan({ widthFt: 20, lengthFt: 20 }, stock(), rules);
    expect(r.areaSqFt).toBe(400);
    expect(r.occupantLoad).toEqual({ chairsOnly: 58, standing: 80, tablesAndChairs: 27 }); // IFC 2018 Table 1004.5
    expect(r.increasedLoadCap).toBe(57); // IFC 2018 §1004.5.1
    expect(r.designOccupants).toBe(80); // no guest count: the standing load
  });
});

describe('exits, IFC 2018 Table 3103.12.2 and §3103.12', () => {
  it('takes the row for the occupant load', () => {
    // IFC 2018 Table 3103.12.2 (tents and membrane structures)
    expect(exitsFor(80)).toEqual({ count: 2, minWidthIn: 72, totalWidthIn: 144 }); // 10-199
    expect(exitsFor(199)).toMatchObject({ count: 2, minWidthIn: 72 });
    expect(exitsFor(200)).toMatchObject({ count: 3, minWidthIn: 72 }); // 200-499
    expect(exitsFor(250)).toEqual({ count: 3, minWidthIn: 72, totalWidthIn: 216 });
    expect(exitsFor(499)).toMatchObject({ count: 3, minWidthIn: 72 });
    expect(exitsFor(500)).toMatchObject({ count: 4, minWidthIn: 96 }); // 500-999
    expect(exitsFor(600)).toEqual({ count: 4, minWidthIn: 96, totalWidthIn: 384 });
    expect(exitsFor(1000)).toMatchObject({ count: 5, minWidthIn: 120 }); // 1,000-1,999
    expect(exitsFor(1500)).toEqual({ count: 5, minWidthIn: 120, totalWidthIn: 600 });
    expect(exitsFor(2000)).toMatchObject({ count: 6, minWidthIn: 120 }); // 2,000-2,999
    expect(exitsFor(2500)).toEqual({ count: 6, minWidthIn: 120, totalWidthIn: 720 });
    expect(exitsFor(2999)).toMatchObject({ count: 6 });
    expect(exitsFor(3000)).toMatchObject({ count: 7, minWidthIn: 120 }); // 3,000 and over
  });

  it('uses the 10-199 row below 10 occupants', () => {
    expect(exitsFor(5)).toEqual({ count: 2, minWidthIn: 72, totalWidthIn: 144 }); // our conservative reading of Table 3103.12.2
  });

  it('takes the larger of the exits width and 0.2 in per occupant (IFC 2018 §3103.12)', () => {
    // 3,200: 7 x 120 = 840 in is more than 3,200 x 0.2 = 640 in
    expect(exitsFor(3200).totalWidthIn).toBe(840);
    // 5,000: 5,000 x 0.2 = 1,000 in is more than 7 x 120 = 840 in
    expect(exitsFor(5000).totalWidthIn).toBe(1000);
    // 4,203 x 0.2 = 840.6 in, rounded up to 841
    expect(exitsFor(4203).totalWidthIn).toBe(841);
  });

  it('sizes the exits for the guests when given', () => {
    const r = plan({ widthFt: 40, lengthFt: 60, guests: 250, seating: 'banquet' }, stock(), rules);
    expect(r.designOccupants).toBe(250);
    expect(r.exits).toEqual({ count: 3, minWidthIn: 72, totalWidthIn: 216 }); // IFC 2018 Table 3103.12.2, 200-499
  });
});

describe('permit, IFC 2018 §3103.2', () => {
  it('above 400 sq ft, or above 700 sq ft for a tent open on all sides', () => {
    expect(permitLikely(400, false, rules)).toBe(false); // IFC 2018 §3103.2: "in excess of 400 square feet"
    expect(permitLikely(401, false, rules)).toBe(true);
    expect(permitLikely(700, true, rules)).toBe(false); // IFC 2018 §3103.2 exception: open on all sides, up to 700 sq ft
    expect(permitLikely(701, true, rules)).toBe(true);
    expect(permitLikely(500, false, { ...rules, permitAreaSqFt: 900 })).toBe(false); // a state amendment
  });

  it('plan() reports it and adds the permit caution', () => {
    expect(plan({ widthFt: 20, lengthFt: 20 }, stock(), rules).permitLikely).toBe(false);
    const r = plan({ widthFt: 20, lengthFt: 20.05 }, stock(), rules); // 401 sq ft
    expect(r.areaSqFt).toBe(401);
    expect(r.permitLikely).toBe(true);
    expect(r.cautions.some((c) => c.source === 'IFC 2018 §3103.2' && /fire code official/.test(c.text))).toBe(true);
    expect(plan({ widthFt: 20, lengthFt: 35, openSided: true }, stock(), rules).permitLikely).toBe(false); // 700 sq ft open-sided
    expect(plan({ widthFt: 20, lengthFt: 35 }, stock(), rules).permitLikely).toBe(true); // 700 sq ft enclosed
  });
});

describe('the trade’s rules of thumb (common practice, stated by a practitioner, no published source)', () => {
  it('sidewall sections are 20 ft long: a 20x20 takes 4, a 20x30 takes 5', () => {
    expect(sidewallSections(20, 20, 20)).toBe(4);
    expect(sidewallSections(20, 30, 20)).toBe(5);
    expect(sidewallSections(30, 45, 20)).toBe(8); // 150 ft / 20 = 7.5, rounded up
    expect(plan({ widthFt: 20, lengthFt: 30 }, stock({ sidewalls: [] }), rules).sidewallSections).toBe(5); // 20 ft when the stock says nothing
    expect(plan({ widthFt: 20, lengthFt: 20 }, stock({ sidewalls: [{ itemId: 'w15', name: 'Sidewall 7x15', sectionLengthFt: 15, heightFt: 7, quantity: 10 }] }), rules).sidewallSections).toBe(6); // 80 / 15 = 5.3 up
  });

  it('a 20x20 seats about 50 guests at about 6 banquet tables', () => {
    const cap = capacity(400, 'banquet', rules);
    expect(Math.abs(cap - 50)).toBeLessThanOrEqual(5); // within 10% of 50
    const r = plan({ guests: cap, seating: 'banquet' }, stock(), rules);
    expect(r.recommendations[0].itemId).toBe('t2020');
    expect(Math.abs(lineFor(r.recommendations[0].lines, 'tbl8')!.quantity - 6)).toBeLessThanOrEqual(1); // within a table of 6
  });

  it('a 20x30 seats about 75 guests at about 8 banquet tables', () => {
    const cap = capacity(600, 'banquet', rules);
    expect(Math.abs(cap - 75)).toBeLessThanOrEqual(7.5); // within 10% of 75
    const r = plan({ guests: cap, seating: 'banquet' }, stock(), rules);
    expect(r.recommendations[0].itemId).toBe('t2030');
    expect(Math.abs(lineFor(r.recommendations[0].lines, 'tbl8')!.quantity - 8)).toBeLessThanOrEqual(1); // within a table of 8
  });

  it('lights after dark: one string-light set per 10 ft of tent length, rounded up', () => {
    const r = plan({ guests: 60, seating: 'banquet', afterDark: true }, stock(), rules);
    expect(lineFor(r.recommendations[0].lines, 'lights')?.quantity).toBe(3); // a 20x30: 30 / 10
    const r2 = plan({ widthFt: 45, lengthFt: 20, afterDark: true }, stock({ tents: [tent('t2045', 20, 45)] }), rules);
    expect(lineFor(r2.recommendations[0].lines, 'lights')?.quantity).toBe(5); // 45 ft long: 4.5, rounded up
    expect(lineFor(plan({ guests: 60, seating: 'banquet' }, stock(), rules).recommendations[0].lines, 'lights')).toBeUndefined();
  });
});

describe('capacity stays within what the code could allow', () => {
  it('is capped by the larger of the table load and one per 7 sq ft', () => {
    // rows at 6 sq ft would give 66 in a 20x20; IFC 2018 Table 1004.5 chairs only gives 58, §1004.5.1 57
    expect(capacity(400, 'rows', rules)).toBe(58);
    expect(capacity(400, 'standing', rules)).toBe(80); // 400 / 5 (IFC 2018 Table 1004.5 standing)
    // a company rule of 4 sq ft a banquet guest cannot beat the §1004.5.1 cap of 57
    expect(capacity(400, 'banquet', { ...rules, sqFtPerGuest: { ...rules.sqFtPerGuest, banquet: 4 } })).toBe(57);
  });
});

describe('recommendations for a guest count', () => {
  it('lists the tents in stock that hold the guests, smallest first, with their lines', () => {
    const r = plan({ guests: 60, seating: 'banquet' }, stock(), rules);
    // 20x20 holds 50 (too few); 30x60 has none in stock
    expect(r.recommendations.map((t) => t.itemId)).toEqual(['t2030', 't4060']);
    const first = r.recommendations[0];
    expect(first.capacity).toBe(75);
    expect(first.lines.map((l) => [l.itemId, l.quantity])).toEqual([
      ['t2030', 1],
      ['tbl8', 6], // 60 / 10
      ['chair', 60],
      ['wall', 5],
    ]);
    expect(lineFor(first.lines, 'tbl8')!.reason).toBe('60 guests at 10 a table');
    expect(first.notes).toContain('Needs a permit: ask the local fire code official.');
    // the result describes the smallest recommended tent
    expect(r.areaSqFt).toBe(600);
    expect(r.sidewallSections).toBe(5);
    expect(r.exits).toEqual({ count: 2, minWidthIn: 72, totalWidthIn: 144 });
  });

  it('flags guests over the table load and says what the fire code official may allow', () => {
    const r = plan({ guests: 60, seating: 'banquet' }, stock(), rules);
    // 600 sq ft / 15 = 40 (IFC 2018 Table 1004.5); 600 / 7 = 85 at most (IFC 2018 §1004.5.1)
    expect(r.overLoad).toMatchObject({ guests: 60, load: 40, seating: 'banquet' });
    expect(r.overLoad!.message).toMatch(/fire code official may approve more/);
    expect(r.overLoad!.message).toMatch(/85/);
    expect(r.overLoad!.message).toMatch(/exits/);
    expect(r.recommendations[0].notes).toContain('Over the table load: ask the fire code official.');
    expect(r.cautions.some((c) => /Table 1004\.5/.test(c.source))).toBe(true);
  });

  it('says when the tent is too small even for the most the official may approve', () => {
    const r = plan({ widthFt: 20, lengthFt: 20, guests: 70, seating: 'banquet' }, stock(), rules);
    // 400 / 15 = 27 (Table 1004.5); 400 / 7 = 57 (§1004.5.1); 70 is over both
    expect(r.overLoad).toMatchObject({ guests: 70, load: 27 });
    expect(r.overLoad!.message).toMatch(/too small/);
    expect(r.overLoad!.message).not.toMatch(/may approve more/);
    expect(plan({ widthFt: 20, lengthFt: 20, guests: 58, seating: 'rows' }, stock(), rules).overLoad).toBeNull(); // 58 = chairs-only load
    expect(plan({ widthFt: 20, lengthFt: 20, guests: 59, seating: 'rows' }, stock(), rules).overLoad?.message).toMatch(/too small/);
  });

  it('says when no tent is big enough alone', () => {
    const r = plan({ guests: 2000, seating: 'banquet' }, stock(), rules);
    expect(r.recommendations).toEqual([]);
    expect(r.exits).toBeNull();
    expect(r.areaSqFt).toBe(0);
    expect(r.designOccupants).toBe(2000);
    expect(r.cautions.some((c) => /two tents/.test(c.text) && /sub-rent/.test(c.text))).toBe(true);
  });

  it('plans chairs and tables by seating style', () => {
    const mixed = plan({ guests: 61, seating: 'mixed' }, stock(), rules).recommendations[0].lines;
    expect(lineFor(mixed, 'tbl8')?.quantity).toBe(7); // 61 / 10, rounded up
    expect(lineFor(mixed, 'chair')?.quantity).toBe(31); // half of 61, rounded up
    const standing = plan({ guests: 60, seating: 'standing' }, stock(), rules).recommendations[0];
    expect(standing.itemId).toBe('t2020'); // 400 / 5 = 80 standing
    expect(lineFor(standing.lines, 'tbl8')).toBeUndefined();
    expect(lineFor(standing.lines, 'chair')).toBeUndefined();
    const rows = plan({ guests: 50, seating: 'rows' }, stock(), rules).recommendations[0].lines;
    expect(lineFor(rows, 'chair')?.quantity).toBe(50);
    expect(lineFor(rows, 'tbl8')).toBeUndefined();
    const eightSeat = stock({ tables: [{ itemId: 'tbl6', name: '6-ft banquet table', lengthFt: 6, seats: 8, quantity: 20 }] });
    expect(lineFor(plan({ guests: 50, seating: 'banquet' }, eightSeat, rules).recommendations[0].lines, 'tbl6')?.quantity).toBe(7); // 50 / 8 = 6.25 up
  });

  it('leaves out what the stock lacks and says so', () => {
    const r = plan({ guests: 40, seating: 'banquet', afterDark: true }, stock({ chairs: [], lighting: [] }), rules).recommendations[0];
    expect(r.lines.map((l) => l.itemId)).toEqual(['t2020', 'tbl8', 'wall']);
    expect(r.notes.some((n) => /chairs/i.test(n))).toBe(true);
    expect(r.notes.some((n) => /lighting/i.test(n))).toBe(true);
  });

  it('notes a shortfall in stock', () => {
    const r = plan({ guests: 60, seating: 'banquet' }, stock({ chairs: [{ itemId: 'chair', name: 'chairs', quantity: 45 }] }), rules);
    expect(r.recommendations[0].notes).toContain('Only 45 chairs in stock for 60: sub-rent 15 more.');
  });
});

describe('a size request', () => {
  it('recommends the matching stock tent with its capacity, either way round', () => {
    const r = plan({ widthFt: 30, lengthFt: 20 }, stock(), rules);
    expect(r.recommendations.map((t) => [t.itemId, t.capacity])).toEqual([['t2030', 75]]);
    expect(lineFor(r.recommendations[0].lines, 'tbl8')?.quantity).toBe(8); // 75 / 10 up
    expect(r.overLoad).toBeNull();
  });

  it('recommends nothing when the stock has no such tent', () => {
    expect(plan({ widthFt: 30, lengthFt: 60 }, stock(), rules).recommendations).toEqual([]); // none in stock
    const r = plan({ widthFt: 25, lengthFt: 25 }, stock(), rules);
    expect(r.recommendations).toEqual([]);
    expect(r.areaSqFt).toBe(625);
    expect(r.exits).not.toBeNull();
  });
});

describe('cautions', () => {
  it('always cover clearance, fabric, flame, buried utilities and wind, each with a source', () => {
    const r = plan({ widthFt: 20, lengthFt: 20 }, stock(), rules);
    const sources = r.cautions.map((c) => c.source);
    expect(sources).toContain('IFC 2018 §3103.8.2');
    expect(sources).toContain('NFPA 701; IFC 2018 §3104');
    expect(sources).toContain('IFC 2018 §3107');
    expect(r.cautions.find((c) => c.source === 'IFC 2018 §3103.8.2')!.text).toMatch(/20 ft/);
    expect(r.cautions.some((c) => /811/.test(c.text))).toBe(true);
    expect(r.cautions.some((c) => /40 mph/.test(c.text) && /manufacturer/i.test(c.source))).toBe(true);
    expect(r.cautions.every((c) => c.text.length > 0 && c.source.length > 0)).toBe(true);
    expect(r.cautions.some((c) => c.source === 'IFC 2018 §3103.2')).toBe(false); // 400 sq ft: no permit caution
  });

  it('use the company’s wind limit', () => {
    const r = plan({ widthFt: 20, lengthFt: 20 }, stock(), { ...rules, windLimitMph: 30 });
    expect(r.cautions.some((c) => /30 mph/.test(c.text))).toBe(true);
  });
});
