import type { User } from '../models';

/**
 * Exports hand the company's books over as files: the bookkeeper's job, and the owner's. The
 * office and the crew get 403; rows are always the actor's own company's (the queries filter by
 * organization), so there is no record to check here.
 */
export const exportPolicy = {
  run: (actor: User) => actor.role === 'owner' || actor.role === 'bookkeeper',
  history: (actor: User) => actor.role === 'owner' || actor.role === 'bookkeeper',
};
