import type { User } from '../models';

/**
 * Closing the books is the bookkeeper's errand once a month's figures are handed over, and the
 * owner's. Reopening a closed period (moving the lock date back, or clearing it) changes figures
 * already reported, so it is the owner's alone; the bookkeeper asks. The office and the crew get
 * 403. The lock date is the actor's own company's; there is no record to check.
 */
export const ledgerPolicy = {
  readLockDate: (actor: User) => actor.role === 'owner' || actor.role === 'bookkeeper',
  close: (actor: User) => actor.role === 'owner' || actor.role === 'bookkeeper',
  reopen: (actor: User) => actor.role === 'owner',
};
