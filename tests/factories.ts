import bcrypt from 'bcryptjs';
import type { Role } from '../shared/types';
import { Organization, User } from '../server/models';
import { uniqueEmail } from './support';

export const TEST_PASSWORD = 'correct-horse-battery';
// Hashed once per test file with few rounds: the factories make many users.
let hash: string | null = null;
const passwordHash = () => (hash ??= bcrypt.hashSync(TEST_PASSWORD, 4));

export async function buildOrganization(attrs: Partial<{ name: string }> = {}) {
  return Organization.create({ name: attrs.name ?? `Test Rentals ${Math.random().toString(36).slice(2, 7)}` });
}

export async function buildUser(attrs: Partial<{ organizationId: string; role: Role; name: string; email: string; status: 'active' | 'invited' | 'disabled' }> = {}) {
  const organizationId = attrs.organizationId ?? (await buildOrganization()).id;
  const role = attrs.role ?? 'owner';
  return User.create({
    organizationId,
    role,
    name: attrs.name ?? `Test ${role}`,
    email: attrs.email ?? uniqueEmail(role),
    passwordHash: attrs.status === 'invited' ? null : passwordHash(),
    status: attrs.status ?? 'active',
  });
}

/** A company with one active user of every role. */
export async function buildCompany() {
  const organization = await buildOrganization();
  const [owner, office, crew, bookkeeper] = await Promise.all(
    (['owner', 'office', 'crew', 'bookkeeper'] as const).map((role) => buildUser({ organizationId: organization.id, role })),
  );
  return { organization, owner, office, crew, bookkeeper };
}
