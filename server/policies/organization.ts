import type { Organization, User } from '../models';

export const organizationPolicy = {
  read: (actor: User, org: Organization) => actor.organizationId === org.id,
  update: (actor: User, org: Organization) => actor.organizationId === org.id && actor.role === 'owner',
};
