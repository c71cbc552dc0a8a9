import type { Role } from '../../shared/types';
import { hashPassword } from '../commands/accounts';
import { withTransaction } from '../db';
import { Booking, BookingLine, Customer, Item, Organization, User } from '../models';
import { ensureCompanyCertificate } from '../services/companyCertificate';
import { DEMO_PASSWORD } from '../services/passwords';
import { quoteBooking } from '../services/pricing';
import { demoCustomers, demoSeason, demoWindows, seededRandom } from './demoBookings';
import { DEMO_STOCK } from './demoStock';
import { seedDemoMoney } from './demoMoney';
import { ItemInput } from '../../shared/schemas/items';

// Kept in one place: the sign-in refuses it outside the demo (services/passwords.ts).
export { DEMO_PASSWORD };

/** The invented demo company; every name, address and number here is made up. */
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
  const rand = seededRandom(20260501);
  const organizationId = await withTransaction(async (t) => {
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
        rules: { taxRateBp: 725 },
      },
      { transaction: t },
    );
    await ensureCompanyCertificate(org.id, t);
    for (const u of DEMO_USERS) {
      await User.create({ organizationId: org.id, ...u, passwordHash, status: 'active' }, { transaction: t });
    }
    const items = await Item.bulkCreate(
      DEMO_STOCK.map((i) => ({ ...ItemInput.parse(i), organizationId: org.id })),
      { transaction: t, returning: true },
    );
    const bySku = new Map(items.map((i) => [i.sku, i]));
    const customers = await Customer.bulkCreate(
      demoCustomers(rand).map((c) => ({ ...c, organizationId: org.id })),
      { transaction: t, returning: true },
    );

    let number = org.nextBookingNumber;
    for (const [n, p] of demoSeason(rand).entries()) {
      const customer = customers[(n * 7) % customers.length];
      const tent = p.tentSku ? bySku.get(p.tentSku)! : null;
      const booking = await Booking.create(
        {
          organizationId: org.id,
          reference: `B-${number++}`,
          status: p.status,
          customerId: customer.id,
          ...demoWindows(p.date, org.timeZone),
          siteLine1: customer.billingLine1,
          siteCity: customer.billingCity,
          siteRegion: 'Wrenfield County',
          sitePostalCode: customer.billingPostalCode,
          siteNotes: `${p.occasion}. ${p.surface === 'asphalt' ? 'Asphalt lot: ballast, no stakes.' : 'Back lawn; truck can reach the side gate (10 ft wide).'}`,
          surface: p.surface,
          anchoring: p.surface === 'asphalt' || p.surface === 'concrete' ? 'ballast' : 'stakes',
          utilityLocateNumber: p.status === 'draft' || p.status === 'quoted' || !tent ? '' : `WC-${p.date.replace(/-/g, '')}-${100 + n}`,
          utilityLocateDate: p.status === 'draft' || p.status === 'quoted' || !tent ? null : p.date,
          guestCount: p.guests,
          seating: p.seating,
          afterDark: p.afterDark,
          deliveryMiles: Math.round((3 + rand() * 35) * 10) / 10,
          damageWaiver: rand() < 0.7,
          taxRateBp: 725,
          securityDepositCents: tent?.sku === 'FT-2040' ? 25_000 : 10_000,
          currency: 'USD',
          notes: p.status === 'cancelled' ? 'Cancelled three days out: wind forecast above our limit.' : '',
        },
        { transaction: t },
      );
      const lines: { item: Item; quantity: number; description?: string }[] = [];
      if (tent) lines.push({ item: tent, quantity: 1 });
      if (p.seating !== 'standing') lines.push({ item: bySku.get('TB-8')!, quantity: Math.min(14, Math.ceil(p.guests / 10)) });
      if (p.seating !== 'standing') lines.push({ item: bySku.get('CH-WF')!, quantity: p.seating === 'mixed' ? Math.ceil(p.guests / 2) : p.guests });
      if (tent && rand() < 0.4) lines.push({ item: bySku.get('SW-207S')!, quantity: Math.ceil((2 * (tent.widthFt! + tent.lengthFt!)) / 20) });
      if (tent && p.afterDark) lines.push({ item: bySku.get('LT-S100')!, quantity: Math.min(6, Math.ceil(tent.lengthFt! / 10)) });
      if (p.surface === 'asphalt' && tent) lines.push({ item: bySku.get('BL-400')!, quantity: Math.min(8, tent.lengthFt! >= 40 ? 8 : 6) });
      if (tent) lines.push({ item: bySku.get('SV-CREW')!, quantity: 1 });
      const created = await BookingLine.bulkCreate(
        lines.map((l, position) => ({
          organizationId: org.id, bookingId: booking.id, position, itemId: l.item.id, description: l.item.name,
          quantity: l.quantity, unitPriceCents: l.item.rentalPriceCents, extraDayPriceCents: l.item.extraDayPriceCents,
          taxable: l.item.taxable, kind: l.item.kind === 'service' ? ('fee' as const) : ('rental' as const),
        })),
        { transaction: t, returning: true },
      );
      booking.totalCents = quoteBooking(booking, created, customer, org, new Date('2026-04-15T12:00:00Z')).totalCents;
      await booking.save({ transaction: t });
    }
    org.nextBookingNumber = number;
    await org.save({ transaction: t });
    return org.id;
  });
  await seedDemoMoney(organizationId, rand);
  return true;
}
