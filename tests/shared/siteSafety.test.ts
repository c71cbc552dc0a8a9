import { describe, expect, it } from 'vitest';
import { DEFAULT_RULES } from '../../shared/schemas/rules';
import { siteSafety, stakingReadiness } from '../../shared/siteSafety';

describe('the locate rule', () => {
  it('staking is ready only with a locate ticket number, or a declared hard surface with ballast', () => {
    expect(stakingReadiness({ locateNumber: '', hardSurfaceBallast: false })).toMatchObject({ ready: false, reason: expect.stringMatching(/811/) });
    expect(stakingReadiness({ locateNumber: '   ', hardSurfaceBallast: false }).ready).toBe(false);
    expect(stakingReadiness({ locateNumber: 'A2027-061-0042', hardSurfaceBallast: false })).toEqual({ ready: true, reason: null });
    expect(stakingReadiness({ locateNumber: '', hardSurfaceBallast: true })).toEqual({ ready: true, reason: null });
  });
});

describe('site safety figures', () => {
  it('defaults: guests out at 30 mph (force 6), take down at 40 mph (force 8)', () => {
    // 30 mph: the trade-association guidance; 40 mph: the existing company default (common practice, no published source).
    expect(DEFAULT_RULES.occupiedWindLimitMph).toBe(30);
    const s = siteSafety({ tents: [], guestCount: 0, seating: 'banquet' }, DEFAULT_RULES);
    expect(s.wind.occupied).toMatchObject({ mph: 30, beaufort: 6 }); // NWS Beaufort table: force 6 is 25–31 mph (from memory of that table)
    expect(s.wind.takeDown).toMatchObject({ mph: 40, beaufort: 8 }); // NWS Beaufort table: force 8 is 39–46 mph (from memory of that table)
    expect(s.cautions.map((c) => c.text).join(' ')).toMatch(/811/);
  });

  it('a 20x30 at banquet tables for 40 guests: load 40, two exits of 72 in', () => {
    const s = siteSafety({ tents: [{ name: '20x30 pole tent', widthFt: 20, lengthFt: 30, quantity: 1 }], guestCount: 40, seating: 'banquet' }, DEFAULT_RULES);
    expect(s.tents).toHaveLength(1);
    expect(s.tents[0].areaSqFt).toBe(600);
    expect(s.tents[0].occupantLoad).toBe(40); // 600 / 15, IFC 2018 Table 1004.5 (unconcentrated, tables and chairs)
    expect(s.tents[0].exits).toMatchObject({ count: 2, minWidthIn: 72 }); // IFC 2018 Table 3103.12.2, 10–199 occupants
    expect(s.tents[0].permitLikely).toBe(true); // 600 > 400 sq ft, IFC 2018 §3103.2
    expect(s.overLoad).toBe(false);
  });

  it('more guests than the load: a caution for the office and the fire code official', () => {
    const s = siteSafety({ tents: [{ name: '20x20 frame tent', widthFt: 20, lengthFt: 20, quantity: 1 }], guestCount: 60, seating: 'banquet' }, DEFAULT_RULES);
    expect(s.totalOccupantLoad).toBe(27); // 400 / 15 = 26.7 up, IFC 2018 Table 1004.5
    expect(s.overLoad).toBe(true);
    expect(s.cautions.some((c) => /60 guests is more than the 27/.test(c.text) && c.source === 'IFC 2018 Table 1004.5')).toBe(true);
  });

  it('follows the owner’s wind settings', () => {
    const s = siteSafety({ tents: [], guestCount: 0, seating: 'standing' }, { ...DEFAULT_RULES, occupiedWindLimitMph: 25, windLimitMph: 35 });
    expect(s.wind.occupied.beaufort).toBe(6); // NWS Beaufort table: 25 mph starts force 6 (from memory of that table)
    expect(s.wind.takeDown.beaufort).toBe(7); // NWS Beaufort table: force 7 is 32–38 mph
    expect(s.cautions.find((c) => /Guests leave/.test(c.text))!.text).toContain('25 mph');
  });
});
