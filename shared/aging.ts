/**
 * Receivables aging: which bucket an open invoice falls in by how many days past its due date it
 * is on the report's date. Pure, shared: the server buckets the report, the client labels it.
 *
 * The buckets (current, 1–30, 31–60, 61–90, over 90 days past due) are the ones issue 8 asks for.
 * Thirty-day buckets counted from the due date are common practice for an aging report; there is
 * no published standard that fixes them, so the edges are the issue's, not a rule's.
 */

export const AGING_BUCKETS = ['current', 'days1to30', 'days31to60', 'days61to90', 'over90'] as const;
export type AgingBucket = (typeof AGING_BUCKETS)[number];

export const AGING_BUCKET_LABELS: Record<AgingBucket, string> = {
  current: 'Current',
  days1to30: '1–30 days',
  days31to60: '31–60 days',
  days61to90: '61–90 days',
  over90: 'Over 90 days',
};

/** Longer words for screen readers and chart text ("1–30 days past due"). */
export const AGING_BUCKET_DESCRIPTIONS: Record<AgingBucket, string> = {
  current: 'not yet due',
  days1to30: '1 to 30 days past due',
  days31to60: '31 to 60 days past due',
  days61to90: '61 to 90 days past due',
  over90: 'over 90 days past due',
};

const DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

function dayNumber(date: string): number {
  const m = DATE.exec(date);
  if (!m) throw new RangeError(`A date is YYYY-MM-DD; got "${date}".`);
  const ms = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]));
  // Refuses 2027-02-30 and the like: the calendar date must read back the same.
  if (new Date(ms).toISOString().slice(0, 10) !== date) throw new RangeError(`Not a calendar date: ${date}.`);
  return ms / 86_400_000;
}

/**
 * Whole calendar days from the due date to the report's date, both YYYY-MM-DD in the company's
 * zone: 0 on the due date itself, negative before it. Calendar days, not 24-hour spans, so a
 * daylight-saving change never shifts a bucket.
 */
export function daysPastDue(dueDate: string, asOf: string): number {
  return dayNumber(asOf) - dayNumber(dueDate);
}

/** The bucket for a number of days past due: due today or later is current. */
export function agingBucket(days: number): AgingBucket {
  if (!Number.isInteger(days)) throw new RangeError(`Days past due are whole days; got ${days}.`);
  if (days <= 0) return 'current';
  if (days <= 30) return 'days1to30';
  if (days <= 60) return 'days31to60';
  if (days <= 90) return 'days61to90';
  return 'over90';
}

/** An empty row of bucket amounts, in cents. */
export function emptyBuckets(): Record<AgingBucket, number> {
  return { current: 0, days1to30: 0, days31to60: 0, days61to90: 0, over90: 0 };
}
