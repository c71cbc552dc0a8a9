import type { Item, User } from '../models';

export const itemPolicy = {
  list: (_actor: User) => true,
  read: (actor: User, item: Item) => actor.organizationId === item.organizationId,
  /** Crew see what to load, not what it costs. */
  seePrices: (actor: User) => actor.role !== 'crew',
  create: (actor: User) => actor.role === 'owner',
  update: (actor: User, item: Item) => actor.organizationId === item.organizationId && actor.role === 'owner',
  import: (actor: User) => actor.role === 'owner',
};
