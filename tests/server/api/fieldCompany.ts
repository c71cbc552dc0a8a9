/** A company set up for the field tests: stock with set-up needs and replacement values, a customer, and a way to make reserved bookings. */
import type { Express } from 'express';
import { expect } from 'vitest';
import type { User } from '../../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient } from '../../support';

export const as = async (app: Express, user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);

export async function fieldCompany() {
  const c = await buildCompany();
  const org = c.organization.id;
  const customer = await buildCustomer(org, { name: 'Wren Ashgrove', phone: '555-0199' });
  // Set-up needs and replacement values are this test company's own catalog numbers.
  const tent = await buildItem(org, {
    name: '20x30 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 30, quantityOwned: 3, rentalPriceCents: 45_000,
    replacementValueCents: 600_000, polesPerSetup: 9, stakesPerSetup: 20, ballastPerSetupLbs: 3000,
  });
  const frame = await buildItem(org, {
    name: '20x20 frame tent', kind: 'tent', tentType: 'frame', widthFt: 20, lengthFt: 20, quantityOwned: 3, rentalPriceCents: 38_000,
    replacementValueCents: 450_000, polesPerSetup: 12, stakesPerSetup: 12, ballastPerSetupLbs: 1200,
  });
  const wall = await buildItem(org, { name: 'Sidewall 7x20', kind: 'sidewall', sectionLengthFt: 20, heightFt: 7, quantityOwned: 20, rentalPriceCents: 2_500, replacementValueCents: 35_000 });
  const chairs = await buildItem(org, { name: 'White folding chair', kind: 'chair', quantityOwned: 300, rentalPriceCents: 200, replacementValueCents: 2_400 });
  const tables = await buildItem(org, { name: '8-ft banquet table', kind: 'table', lengthFt: 8, seats: 10, quantityOwned: 40, rentalPriceCents: 1_000, replacementValueCents: 12_000 });
  return { ...c, customer, tent, frame, wall, chairs, tables };
}

type Line = { itemId: string | null; quantity: number; unitPriceCents?: number; description?: string; kind?: 'rental' | 'fee' };

/**
 * A booking whose event is on `eventDate` (bookingBody: delivered the day before 14:00–18:00 UTC,
 * picked up the day after), reserved by the office unless told to stay a draft.
 */
export async function booking(office: ApiClient, customerId: string, eventDate: string, lines: Line[], extra: Record<string, unknown> = {}, reserve = true) {
  const created = await office.post('/api/bookings', bookingBody(customerId, eventDate, lines, { guestCount: 40, siteLine1: '12 Fox Run', siteCity: 'Millbrook', siteRegion: 'IL', sitePostalCode: '60000', ...extra }));
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  if (reserve) {
    const r = await office.post(`/api/bookings/${created.body.id}/status`, { status: 'reserved' });
    expect(r.status, JSON.stringify(r.body)).toBe(200);
  }
  return created.body as { id: string; reference: string };
}

/** Every key anywhere in a JSON answer. */
export function keysOf(value: unknown, into = new Set<string>()): Set<string> {
  if (Array.isArray(value)) value.forEach((v) => keysOf(v, into));
  else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      into.add(k);
      keysOf(v, into);
    }
  }
  return into;
}

/** Every number anywhere in a JSON answer. */
export function numbersOf(value: unknown, into: number[] = []): number[] {
  if (typeof value === 'number') into.push(value);
  else if (Array.isArray(value)) value.forEach((v) => numbersOf(v, into));
  else if (value && typeof value === 'object') Object.values(value).forEach((v) => numbersOf(v, into));
  return into;
}
