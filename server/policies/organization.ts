import type { Organization, User } from '../models';

export const organizationPolicy = {
  read: (actor: User, org: Organization) => actor.organizationId === org.id,
  update: (actor: User, org: Organization) => actor.organizationId === org.id && actor.role === 'owner',
  /**
   * The demo's caught mail holds live sign-in and reset links: the owner's. The route asks the
   * sink for the owner's own company's mail only.
   */
  readCaughtMail: (actor: User) => actor.role === 'owner',
};
