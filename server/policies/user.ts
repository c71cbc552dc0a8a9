import type { User } from '../models';

/** Who may do what with a user account. Every rule checks the organization first. */
export const userPolicy = {
  list: (actor: User) => actor.role === 'owner',
  read: (actor: User, target: User) => actor.organizationId === target.organizationId && (actor.role === 'owner' || actor.id === target.id),
  invite: (actor: User) => actor.role === 'owner',
  changeRole: (actor: User, target: User) => actor.organizationId === target.organizationId && actor.role === 'owner',
  disable: (actor: User, target: User) =>
    actor.organizationId === target.organizationId && actor.role === 'owner' && actor.id !== target.id,
  resendInvite: (actor: User, target: User) =>
    actor.organizationId === target.organizationId && actor.role === 'owner' && target.status === 'invited',
};
