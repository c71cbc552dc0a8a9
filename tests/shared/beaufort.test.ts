import { describe, expect, it } from 'vitest';
import { BEAUFORT_SCALE, beaufortForMph, describeBeaufort } from '../../shared/beaufort';

describe('the Beaufort scale, U.S. National Weather Service table', () => {
  it('force 7 is 28–33 knots, 32–38 mph', () => {
    // U.S. National Weather Service, Beaufort wind scale table, force 7 (as the issue quotes it).
    expect(BEAUFORT_SCALE[7]).toMatchObject({ force: 7, minKnots: 28, maxKnots: 33, minMph: 32, maxMph: 38 });
  });

  it('places the wind limits in their force', () => {
    // NWS Beaufort table: force 6 is 25–31 mph (from memory of that table), so the default 30 mph occupied limit is force 6.
    expect(beaufortForMph(30).force).toBe(6);
    expect(beaufortForMph(31.9).force).toBe(6); // the table's bands are whole mph: below 32 is still force 6
    expect(beaufortForMph(32).force).toBe(7); // NWS Beaufort table, force 7 starts at 32 mph
    expect(beaufortForMph(38).force).toBe(7); // NWS Beaufort table, force 7 ends at 38 mph
    // NWS Beaufort table: force 8 (gale) is 39–46 mph (from memory of that table): the default 40 mph take-down limit.
    expect(beaufortForMph(40).force).toBe(8);
    expect(beaufortForMph(0).force).toBe(0); // NWS Beaufort table: calm, under 1 mph
    expect(beaufortForMph(73).force).toBe(12); // NWS Beaufort table: 73 mph and above is force 12 (from memory of that table)
    expect(beaufortForMph(150).force).toBe(12);
  });

  it('has no gaps or overlaps between forces, and refuses nonsense', () => {
    for (let f = 1; f < BEAUFORT_SCALE.length; f++) {
      expect(BEAUFORT_SCALE[f].minMph).toBe(BEAUFORT_SCALE[f - 1].maxMph! + 1);
      expect(BEAUFORT_SCALE[f].minKnots).toBe(BEAUFORT_SCALE[f - 1].maxKnots! + 1);
    }
    expect(() => beaufortForMph(-1)).toThrow(RangeError);
    expect(() => beaufortForMph(Number.NaN)).toThrow(RangeError);
  });

  it('reads as words on the checklist', () => {
    expect(describeBeaufort(beaufortForMph(35))).toBe('Beaufort force 7 (near gale, 32–38 mph)');
    expect(describeBeaufort(beaufortForMph(80))).toBe('Beaufort force 12 (hurricane, 73 mph and above)');
  });
});
