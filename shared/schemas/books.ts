import { z } from 'zod';
import { addDays } from '../dates';

/**
 * Closed periods. The bookkeeper (or the owner) closes the books through a day once its figures
 * are handed over: nothing is then posted on or before that day, on the company's calendar.
 * Mistakes found later are corrected in the open period. Moving the date back (reopening) is the
 * owner's alone.
 */

/** GET /api/ledger/lock-date (owner and bookkeeper). */
export interface LockDateRow {
  /** YYYY-MM-DD, or null when no period is closed. */
  closedThrough: string | null;
  /** When and by whom the date was last set (null when never, or the person was removed). */
  closedAt: string | null;
  closedBy: string | null;
  /** The latest day that can be closed now: yesterday on the company's calendar. */
  latestClosable: string;
  can: { close: boolean; reopen: boolean };
}

/** PUT /api/ledger/lock-date: close through this day; null reopens every period (the owner). */
export const LockDateRequest = z.object({
  closedThrough: z.iso
    .date({ error: 'Enter the last day to close as YYYY-MM-DD.' })
    .refine((d) => d >= '1900-01-01', 'Enter a day after 1900.')
    .nullable(),
});
export type LockDateRequest = z.infer<typeof LockDateRequest>;

/**
 * What is wrong with closing through `closedThrough` when it is `today` on the company's calendar,
 * or null. Today is never closed: its money is still coming in (and entries the company does not
 * date itself, from the card processor and the deposit job, are posted today when their own day
 * is closed, so today must stay open).
 */
export function lockDateProblem(closedThrough: string | null, today: string): string | null {
  if (closedThrough === null || closedThrough < today) return null;
  return `Close through yesterday (${addDays(today, -1)}) at the latest: today’s money is still coming in.`;
}

/** The request schema with the check that needs today's date: the screen's form and the server say the same. */
export const lockDateRequestOn = (today: string) =>
  LockDateRequest.superRefine((v, ctx) => {
    const problem = lockDateProblem(v.closedThrough, today);
    if (problem) ctx.addIssue({ code: 'custom', path: ['closedThrough'], message: problem });
  });

/** The 409 `period_closed` message: the day, and what to do. */
export const periodClosedMessage = (closedThrough: string) =>
  `The books are closed through ${closedThrough}: nothing can be dated on or before that day. Use a later date, or ask the owner to reopen the books.`;
