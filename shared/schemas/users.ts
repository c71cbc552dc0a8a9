import { z } from 'zod';
import { ROLES, USER_STATUSES } from '../types';
import { Email, PersonName } from './auth';
import { ListQuery } from './common';

export const Role = z.enum(ROLES, { error: 'Choose a role: owner, office, crew or bookkeeper.' });

export const InviteUserRequest = z.object({ email: Email, name: PersonName, role: Role });
export type InviteUserRequest = z.infer<typeof InviteUserRequest>;

export const UpdateUserRequest = z
  .object({
    role: Role.optional(),
    disabled: z.boolean({ error: 'Choose whether the user is disabled.' }).optional(),
  })
  .refine((v) => v.role !== undefined || v.disabled !== undefined, {
    message: 'Change the role or whether the user is disabled.',
    path: ['role'],
  });
export type UpdateUserRequest = z.infer<typeof UpdateUserRequest>;

export { ListQuery };

export const UserRow = z.object({
  id: z.string(),
  name: z.string(),
  email: z.string(),
  role: Role,
  status: z.enum(USER_STATUSES),
  createdAt: z.string(),
  lastSignInAt: z.string().nullable(),
  /** What the current user may do with this row (the server decides). */
  can: z.object({ changeRole: z.boolean(), disable: z.boolean(), resendInvite: z.boolean() }),
});
export type UserRow = z.infer<typeof UserRow>;
