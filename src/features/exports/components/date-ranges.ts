import { addDays } from '@shared/dates';

export interface DateRange {
  from: string;
  to: string;
}

export const QUICK_RANGES = ['lastMonth', 'thisMonth', 'thisYear', 'lastYear'] as const;
export type QuickRange = (typeof QUICK_RANGES)[number];

export const QUICK_RANGE_LABELS: Record<QuickRange, string> = {
  lastMonth: 'Last month',
  thisMonth: 'This month',
  thisYear: 'This year',
  lastYear: 'Last year',
};

const firstOfMonth = (date: string) => `${date.slice(0, 7)}-01`;

/**
 * The quick picks, from today on the company's calendar (YYYY-MM-DD). "This month" and "this
 * year" end today: the books have nothing later, and the trial balance is then today's.
 */
export function quickRange(which: QuickRange, today: string): DateRange {
  const year = Number(today.slice(0, 4));
  switch (which) {
    case 'thisMonth':
      return { from: firstOfMonth(today), to: today };
    case 'lastMonth': {
      const lastDay = addDays(firstOfMonth(today), -1);
      return { from: firstOfMonth(lastDay), to: lastDay };
    }
    case 'thisYear':
      return { from: `${year}-01-01`, to: today };
    case 'lastYear':
      return { from: `${year - 1}-01-01`, to: `${year - 1}-12-31` };
  }
}

/** Which quick pick a range is, if any (its button shows as pressed). */
export const quickRangeOf = (range: DateRange, today: string): QuickRange | null =>
  QUICK_RANGES.find((q) => {
    const r = quickRange(q, today);
    return r.from === range.from && r.to === range.to;
  }) ?? null;
