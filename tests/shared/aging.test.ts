import { describe, expect, it } from 'vitest';
import { AGING_BUCKETS, agingBucket, daysPastDue, emptyBuckets } from '../../shared/aging';

// The bucket edges are issue 8's ("current, 1–30, 31–60, 61–90 and over 90 days past due").
// Thirty-day buckets from the due date are common practice, no published source.
describe('aging buckets at their edges', () => {
  it('due today or later is current', () => {
    expect(agingBucket(0)).toBe('current'); // exactly 0 days past due: due today, not late yet (common practice, no published source)
    expect(agingBucket(-1)).toBe('current');
    expect(agingBucket(-400)).toBe('current');
  });

  it('1 and 30 days are the first bucket, 31 the second', () => {
    expect(agingBucket(1)).toBe('days1to30'); // issue 8: 1–30
    expect(agingBucket(30)).toBe('days1to30'); // issue 8: 1–30
    expect(agingBucket(31)).toBe('days31to60'); // issue 8: 31–60
  });

  it('60 is the second bucket, 61 the third', () => {
    expect(agingBucket(60)).toBe('days31to60'); // issue 8: 31–60
    expect(agingBucket(61)).toBe('days61to90'); // issue 8: 61–90
  });

  it('90 is the third bucket, 91 is over 90', () => {
    expect(agingBucket(90)).toBe('days61to90'); // issue 8: 61–90
    expect(agingBucket(91)).toBe('over90'); // issue 8: over 90
    expect(agingBucket(3650)).toBe('over90');
  });

  it('every whole day from -5 to 200 lands in exactly one bucket, in order, with no gap', () => {
    let previous = 0;
    for (let d = -5; d <= 200; d++) {
      const index = AGING_BUCKETS.indexOf(agingBucket(d));
      expect(index).toBeGreaterThanOrEqual(previous);
      expect(index - previous).toBeLessThanOrEqual(1);
      previous = index;
    }
    expect(previous).toBe(AGING_BUCKETS.length - 1);
  });

  it('refuses parts of days', () => {
    expect(() => agingBucket(30.5)).toThrow(RangeError);
    expect(() => agingBucket(Number.NaN)).toThrow(RangeError);
  });
});

describe('days past due, in calendar days', () => {
  it('counts from the due date to the report date', () => {
    expect(daysPastDue('2027-03-01', '2027-03-01')).toBe(0);
    expect(daysPastDue('2027-03-01', '2027-03-02')).toBe(1);
    expect(daysPastDue('2027-03-01', '2027-02-28')).toBe(-1);
    // 2027-01-31 + 30 days = 2027-03-02 (January 31 days, February 28 in 2027: calendar arithmetic)
    expect(daysPastDue('2027-01-31', '2027-03-02')).toBe(30);
    expect(daysPastDue('2027-01-31', '2027-03-03')).toBe(31);
    // 2028 is a leap year: 2028-02-01 to 2028-03-01 is 29 days (Gregorian calendar)
    expect(daysPastDue('2028-02-01', '2028-03-01')).toBe(29);
  });

  it('is not moved by a daylight-saving change (US clocks go forward on 2027-03-14: 2nd Sunday of March, 15 U.S.C. §260a, from memory)', () => {
    expect(daysPastDue('2027-03-13', '2027-03-15')).toBe(2);
    expect(agingBucket(daysPastDue('2027-02-12', '2027-03-14'))).toBe('days1to30'); // 30 days
    expect(agingBucket(daysPastDue('2027-02-12', '2027-03-15'))).toBe('days31to60'); // 31 days
  });

  it('refuses what is not a calendar date', () => {
    expect(() => daysPastDue('2027-02-30', '2027-03-01')).toThrow(RangeError);
    expect(() => daysPastDue('03/01/2027', '2027-03-01')).toThrow(RangeError);
  });

  it('starts a row of buckets at zero', () => {
    expect(Object.values(emptyBuckets())).toEqual([0, 0, 0, 0, 0]);
    expect(Object.keys(emptyBuckets())).toEqual([...AGING_BUCKETS]);
  });
});
