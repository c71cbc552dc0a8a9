import type { UserRow } from '../../shared/schemas/users';
import type { User } from '../models';
import { can } from '../policies';

export function presentUser(user: User, actor: User): UserRow {
  return {
    id: user.id,
    name: user.name,
    email: user.email,
    role: user.role,
    status: user.status,
    createdAt: user.createdAt.toISOString(),
    lastSignInAt: user.lastSignInAt ? user.lastSignInAt.toISOString() : null,
    can: {
      changeRole: can(actor, 'user', 'changeRole', user),
      disable: can(actor, 'user', 'disable', user),
      resendInvite: can(actor, 'user', 'resendInvite', user),
    },
  };
}
