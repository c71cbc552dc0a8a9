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

import { ItemInput, type ItemInput as ItemInputT } from '../shared/schemas/items';
import { Customer, Item } from '../server/models';

export async function buildItem(organizationId: string, attrs: Partial<ItemInputT> = {}) {
  const values = ItemInput.parse({ name: 'White folding chair', kind: 'chair', quantityOwned: 10, rentalPriceCents: 200, ...attrs });
  return Item.create({ ...values, organizationId });
}

export async function buildCustomer(organizationId: string, attrs: Partial<{ name: string; email: string; phone: string; taxExempt: boolean }> = {}) {
  return Customer.create({ organizationId, name: attrs.name ?? 'Test Customer', email: attrs.email ?? '', phone: attrs.phone ?? '', taxExempt: attrs.taxExempt ?? false });
}

/** A booking request body for POST /api/bookings: an event on `date` (UTC), delivered the day before. */
export function bookingBody(customerId: string, date: string, lines: { itemId: string | null; quantity: number; unitPriceCents?: number; description?: string; taxable?: boolean; kind?: 'rental' | 'fee' }[], extra: Record<string, unknown> = {}) {
  const d = (offsetDays: number, time: string) => {
    const base = new Date(`${date}T${time}:00Z`);
    return new Date(base.getTime() + offsetDays * 86_400_000).toISOString();
  };
  return {
    customerId,
    eventStart: d(0, '18:00'),
    eventEnd: d(0, '23:00'),
    deliveryStart: d(-1, '14:00'),
    deliveryEnd: d(-1, '18:00'),
    pickupStart: d(1, '14:00'),
    pickupEnd: d(1, '18:00'),
    lines: lines.map((l) => ({ description: l.description ?? 'Line', unitPriceCents: l.unitPriceCents ?? 1000, taxable: l.taxable ?? true, kind: l.kind ?? 'rental', itemId: l.itemId, quantity: l.quantity })),
    ...extra,
  };
}
