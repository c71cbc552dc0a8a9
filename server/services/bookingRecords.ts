import { Op } from 'sequelize';
import type { Transaction } from '../db';
import { Booking, BookingLine, Customer, Invoice, Item, User } from '../models';

export type PricedBooking = Booking & { customer: Customer; lines: BookingLine[] };

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
