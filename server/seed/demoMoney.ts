import { addDays, zonedTimeToInstant } from '../../shared/dates';
import { createInvoice, issueInvoice, moveSecurityDeposit, recordPayment } from '../commands/invoices';
import { withTransaction } from '../db';
import { Booking, BookingCrew, Invoice, Organization, User } from '../models';
import type { seededRandom } from './demoBookings';

type Rand = ReturnType<typeof seededRandom>;
const METHODS = ['check', 'transfer', 'cash', 'check', 'transfer'] as const;

/**
 * The demo's money, dated as it would have happened: a deposit invoice when the booking was
 * reserved and its payment a few days later, the balance invoice two weeks before the event and
 * its payment before the event for closed bookings; the security deposit taken at delivery and
 * returned after pickup. No e-mail goes out for any of it. Crew are assigned to this week's stops.
 */
export async function seedDemoMoney(organizationId: string, rand: Rand) {
  const organization = (await Organization.findByPk(organizationId))!;
  const owner = (await User.findOne({ where: { organizationId, role: 'owner' } }))!;
  const crew = await User.findAll({ where: { organizationId, role: 'crew' }, order: [['email', 'ASC']] });
  const bookings = await Booking.findAll({ where: { organizationId }, order: [['eventStart', 'ASC']] });
  const zone = organization.timeZone;
  const at = (day: string, time = '10:00') => zonedTimeToInstant(day, time, zone);
  const today = new Date();

  for (const booking of bookings) {
    if (!['reserved', 'out', 'returned', 'closed'].includes(booking.status)) continue;
    const eventDay = new Intl.DateTimeFormat('en-CA', { timeZone: zone }).format(booking.eventStart);
    const reservedOn = addDays(eventDay, -(30 + Math.floor(rand() * 40)));
    const notAfterToday = (d: Date) => (d > today ? today : d);
    await withTransaction(async (t) => {
      const method = () => METHODS[Math.floor(rand() * METHODS.length)];
      const deposit = await createInvoice(owner, booking.id, 'deposit', null, t);
      await issueInvoice(owner, deposit.id, null, t, { at: notAfterToday(at(reservedOn)), email: false });
      // Next season's reservations: about half have paid their deposit so far.
      const depositPaid = booking.eventStart < today || rand() < 0.5;
      if (depositPaid) {
        const m = method();
        await recordPayment(
          owner,
          {
            method: m, reference: m === 'check' ? `Check ${1000 + Math.floor(rand() * 8000)}` : m === 'transfer' ? `Transfer ${Math.floor(rand() * 900000)}` : '',
            receivedAt: notAfterToday(at(addDays(reservedOn, 3), '15:00')), allocations: [{ invoiceId: deposit.id, amountCents: (await Invoice.findByPk(deposit.id, { transaction: t }))!.totalCents }],
            fieldFor: () => 'amountCents', email: false,
          },
          null,
          t,
        );
      }
      if (!['out', 'returned', 'closed'].includes(booking.status)) return;
      const balance = await createInvoice(owner, booking.id, 'balance', null, t);
      await issueInvoice(owner, balance.id, null, t, { at: notAfterToday(at(addDays(eventDay, -14))), email: false });
      if (booking.securityDepositCents > 0) {
        await moveSecurityDeposit(owner, booking.id, { action: 'collect', amountCents: booking.securityDepositCents, method: 'check', reason: '' }, null, t);
      }
      if (booking.status === 'closed') {
        const m = method();
        await recordPayment(
          owner,
          {
            method: m, reference: m === 'check' ? `Check ${1000 + Math.floor(rand() * 8000)}` : '', receivedAt: notAfterToday(at(addDays(eventDay, -3), '11:00')),
            allocations: [{ invoiceId: balance.id, amountCents: (await Invoice.findByPk(balance.id, { transaction: t }))!.totalCents }], fieldFor: () => 'amountCents', email: false,
          },
          null,
          t,
        );
        if (booking.securityDepositCents > 0) {
          await moveSecurityDeposit(owner, booking.id, { action: 'refund', amountCents: booking.securityDepositCents, method: 'check', reason: '' }, null, t);
        }
      }
    });
    if (['reserved', 'out'].includes(booking.status) && booking.eventStart > addDaysDate(today, -7) && booking.eventStart < addDaysDate(today, 14)) {
      for (const c of crew) await BookingCrew.findOrCreate({ where: { organizationId, bookingId: booking.id, userId: c.id } });
    }
  }
}

const addDaysDate = (d: Date, days: number) => new Date(d.getTime() + days * 86_400_000);
