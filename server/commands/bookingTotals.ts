import type { Transaction } from 'sequelize';
import { sequelize } from '../db';
import { Booking, Customer, type BookingLine, type Organization } from '../models';
import { LINES_AS_JSON } from '../services/bookingRecords';
import { quoteBooking } from '../services/pricing';

type Quoted = Booking & { customer: Pick<Customer, 'taxExempt'>; lines: BookingLine[] };

/**
 * Quotes the company's bookings again (or one customer's) and stores the totals that moved. A quote
 * reads more than its booking: the customer's tax exemption and the company's pricing rules, so a
 * change to either changes the totals that the bookings list shows from bookings.total_cents.
 */
export async function requoteBookings(organization: Organization, transaction: Transaction, only: { customerId?: string } = {}) {
  const bookings = (await Booking.findAll({
    where: { organizationId: organization.id, ...(only.customerId ? { customerId: only.customerId } : {}) },
    attributes: { include: [[LINES_AS_JSON, 'lines']] },
    include: [{ model: Customer, as: 'customer', attributes: ['taxExempt'] }],
    raw: true,
    nest: true,
    transaction,
  })) as unknown as Quoted[];
  const moved = bookings
    .map((b) => ({ id: b.id, totalCents: quoteBooking(b, b.lines, b.customer, organization).totalCents, was: Number(b.totalCents) }))
    .filter((b) => b.totalCents !== b.was);
  if (!moved.length) return 0;
  await sequelize.query(
    `UPDATE bookings b SET total_cents = v.total_cents
       FROM unnest(ARRAY[:ids]::uuid[], ARRAY[:totals]::bigint[]) AS v(id, total_cents)
      WHERE b.id = v.id AND b.organization_id = :organizationId`,
    { replacements: { ids: moved.map((b) => b.id), totals: moved.map((b) => b.totalCents), organizationId: organization.id }, transaction },
  );
  return moved.length;
}
