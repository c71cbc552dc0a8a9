import { Op } from 'sequelize';
import { sequelize, type Transaction } from '../db';
import { Booking, BookingLine, Customer, Invoice, Item, User } from '../models';

export type PricedBooking = Booking & { customer: Customer; lines: BookingLine[] };

/**
 * A booking's lines (each with its item's kind) as one JSON column of the booking's own row,
 * keyed as the presenter and the quote read them, for lists: a page of bookings and all their
 * lines in one query, without a Sequelize instance per line. Amounts are bigint cents, which JSON
 * carries as exact numbers.
 */
export const LINES_AS_JSON = sequelize.literal(`(
  SELECT coalesce(json_agg(json_build_object(
           'id', bl.id, 'position', bl.position, 'itemId', bl.item_id, 'item', json_build_object('kind', i.kind), 'description', bl.description,
           'quantity', bl.quantity, 'unitPriceCents', bl.unit_price_cents, 'extraDays', bl.extra_days, 'extraDayPriceCents', bl.extra_day_price_cents,
           'discountBp', bl.discount_bp, 'discountCents', bl.discount_cents, 'taxable', bl.taxable, 'kind', bl.kind) ORDER BY bl.position), '[]')
    FROM booking_lines bl LEFT JOIN items i ON i.id = bl.item_id
   WHERE bl.booking_id = "Booking"."id")`);

/** A booking of the company with its customer and lines (each with its item's kind): what a quote or document needs. */
export async function findPricedBooking(organizationId: string, bookingId: string, transaction?: Transaction) {
  return (await Booking.findOne({
    where: { id: bookingId, organizationId },
    include: [
      { model: Customer, as: 'customer' },
      { model: BookingLine, as: 'lines', include: [{ model: Item, as: 'item', attributes: ['id', 'kind'] }] },
    ],
    transaction,
  })) as PricedBooking | null;
}

/** The documents that are invoice records' PDFs: never versions of the booking's own invoice. */
export async function invoiceRecordDocumentIds(bookingId: string, transaction?: Transaction) {
  return (await Invoice.findAll({ where: { bookingId }, attributes: ['documentId'], transaction }))
    .map((i) => i.documentId)
    .filter((x): x is string => !!x);
}

/** E-mail addresses of the company's active owners and office staff: who is told when something needs the desk. */
export async function deskEmails(organizationId: string, transaction?: Transaction) {
  const users = await User.findAll({ where: { organizationId, role: { [Op.in]: ['owner', 'office'] }, status: 'active' }, attributes: ['email'], transaction });
  return users.map((u) => u.email);
}
