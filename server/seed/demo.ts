import type { Role } from '../../shared/types';
import { hashPassword } from '../commands/accounts';
import { withTransaction } from '../db';
import { Organization, User } from '../models';

/** The invented demo company; every name, address and number here is made up. */
export const DEMO_PASSWORD = 'guyline-demo';
export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
  { email: 'owner@demo.test', name: 'Maren Holt', role: 'owner' },
  { email: 'office@demo.test', name: 'Theo Alvarez', role: 'office' },
  { email: 'crew@demo.test', name: 'Sam Okafor', role: 'crew' },
  { email: 'crew2@demo.test', name: 'Jules Park', role: 'crew' },
  { email: 'books@demo.test', name: 'Priya Nair', role: 'bookkeeper' },
];

/** Loads the demo scenario when the database has no demo company yet. Returns whether it did. */
export async function seedDemo(): Promise<boolean> {
  if (await User.findOne({ where: { email: DEMO_USERS[0].email } })) return false;
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await withTransaction(async (t) => {
    const org = await Organization.create(
      {
        name: 'Foxglove Tent & Table',
        addressLine1: '418 Millrace Road',
        city: 'Alder Falls',
        region: 'Wrenfield County',
        postalCode: '00418',
        country: 'US',
        phone: '555-0142',
        email: 'hello@foxglove-tents.test',
        currency: 'USD',
        timeZone: 'America/Chicago',
      },
      { transaction: t },
    );
    for (const u of DEMO_USERS) {
      await User.create({ organizationId: org.id, ...u, passwordHash, status: 'active' }, { transaction: t });
    }
  });
  return true;
}
