import type { User } from '../models';

/**
 * The reports are the owner's (what to price, chase and buy); the bookkeeper reads them to close
 * the month. The office and the crew get 403: the office works invoices one by one, and the crew
 * sees no money at all. Every report query filters by the actor's organization, so there is no
 * record to check here.
 */
export const reportPolicy = {
  read: (actor: User) => actor.role === 'owner' || actor.role === 'bookkeeper',
};
