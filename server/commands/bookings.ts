import type { Request } from 'express';
import { Op } from 'sequelize';
import type { BookingStatus, BookingValues, ShortfallDetail } from '../../shared/schemas/bookings';
import { HOLDING_STATUSES } from '../../shared/schemas/bookings';
import type { Transaction } from '../db';
import { HttpError, badRequest, conflict } from '../errors';
import { Booking, BookingLine, Customer, Item, Organization, type User } from '../models';
import { checkAvailability, recordShortfalls } from '../services/availability';
import { quoteBooking } from '../services/pricing';
import { rulesOf } from '../services/rules';
import { audit } from './audit';
import { reissueChangedDocuments } from './documents';

/** A 409 that names every short item; the route turns it into `{ error, shortfalls }`. */
export class ShortfallError extends HttpError {
  constructor(public shortfalls: ShortfallDetail[]) {
    super(
      409,
      'shortfall',
      `Not enough stock: ${shortfalls.map((s) => `${s.name} is short by ${s.shortfall} (${s.available} free of ${s.requested} asked)`).join('; ')}.`,
      undefined,
      { shortfalls },
    );
  }
}

/** The window an item is taken for: delivery start to pickup end (the buffer is added by availability). */
export const bookingWindow = (b: { deliveryStart: Date | string; pickupEnd: Date | string }) => ({
  from: new Date(b.deliveryStart),
  to: new Date(b.pickupEnd),
});

async function loadCustomer(actor: User, customerId: string, transaction: Transaction) {
  const customer = await Customer.findOne({ where: { id: customerId, organizationId: actor.organizationId }, transaction });
  if (!customer) throw badRequest('Choose a customer of your company.', { customerId: 'Unknown customer.' });
  return customer;
}

/** Checks that every catalog line names an item of this company; returns the items by id. */
async function loadItems(actor: User, values: BookingValues, transaction: Transaction) {
  const ids = [...new Set(values.lines.map((l) => l.itemId).filter((x): x is string => !!x))];
  const items = ids.length
    ? await Item.findAll({ where: { id: { [Op.in]: ids }, organizationId: actor.organizationId }, transaction })
    : [];
  const byId = new Map(items.map((i) => [i.id, i]));
  const fields: Record<string, string> = {};
  values.lines.forEach((l, i) => {
    if (l.itemId && !byId.has(l.itemId)) fields[`lines.${i}.itemId`] = 'Unknown item: pick one from the catalog.';
  });
  if (Object.keys(fields).length) throw badRequest('Some lines name items that are not in your catalog.', fields);
  return byId;
}

/** Throws a ShortfallError (after recording it) when a holding booking asks for more than is free. */
async function assertAvailable(
  actor: User,
  organization: Organization,
  booking: Pick<Booking, 'id' | 'deliveryStart' | 'pickupEnd'>,
  lines: { itemId: string | null; quantity: number }[],
  transaction: Transaction,
) {
  const { from, to } = bookingWindow(booking);
  const details = await checkAvailability(
    actor.organizationId,
    lines.filter((l): l is { itemId: string; quantity: number } => !!l.itemId),
    from,
    to,
    rulesOf(organization).turnaroundHours,
    { excludeBookingId: booking.id, transaction, lockItems: true },
  );
  const short = details.filter((d) => d.shortfall > 0);
  if (short.length) throw new ShortfallError(short);
}

function bookingAttributes(values: BookingValues, organization: Organization) {
  return {
    customerId: values.customerId,
    eventStart: new Date(values.eventStart),
    eventEnd: new Date(values.eventEnd),
    deliveryStart: new Date(values.deliveryStart),
    deliveryEnd: new Date(values.deliveryEnd),
    pickupStart: new Date(values.pickupStart),
    pickupEnd: new Date(values.pickupEnd),
    siteLine1: values.siteLine1,
    siteLine2: values.siteLine2,
    siteCity: values.siteCity,
    siteRegion: values.siteRegion,
    sitePostalCode: values.sitePostalCode,
    siteNotes: values.siteNotes,
    surface: values.surface,
    anchoring: values.anchoring,
    utilityLocateNumber: values.utilityLocateNumber,
    utilityLocateDate: values.utilityLocateDate,
    guestCount: values.guestCount,
    seating: values.seating,
    afterDark: values.afterDark,
    deliveryMiles: values.deliveryMiles,
    setupLaborCents: values.setupLaborCents,
    discountBp: values.discountBp,
    discountCents: values.discountCents,
    damageWaiver: values.damageWaiver,
    ownInsurance: values.ownInsurance,
    taxRateBp: values.taxRateBp ?? rulesOf(organization).taxRateBp,
    securityDepositCents: values.securityDepositCents,
    notes: values.notes,
  };
}

async function writeLines(booking: Booking, values: BookingValues, transaction: Transaction) {
  await BookingLine.destroy({ where: { bookingId: booking.id }, transaction });
  return BookingLine.bulkCreate(
    values.lines.map((l, position) => ({ ...l, position, organizationId: booking.organizationId, bookingId: booking.id })),
    { transaction, returning: true },
  );
}

async function storeTotal(booking: Booking, lines: BookingLine[], customer: Customer, organization: Organization, transaction: Transaction) {
  booking.totalCents = quoteBooking(booking, lines, customer, organization).totalCents;
  await booking.save({ transaction });
}

export async function createBooking(actor: User, values: BookingValues, req: Request, transaction: Transaction) {
  const organization = (await Organization.findByPk(actor.organizationId, { transaction, lock: transaction.LOCK.UPDATE }))!;
  const customer = await loadCustomer(actor, values.customerId, transaction);
  await loadItems(actor, values, transaction);
  const reference = `B-${organization.nextBookingNumber}`;
  organization.nextBookingNumber += 1;
  await organization.save({ transaction });
  const booking = await Booking.create(
    { ...bookingAttributes(values, organization), organizationId: actor.organizationId, reference, status: 'draft', currency: organization.currency },
    { transaction },
  );
  const lines = await writeLines(booking, values, transaction);
  await storeTotal(booking, lines, customer, organization, transaction);
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'booking.created', subjectType: 'booking', subjectId: booking.id, data: { reference } }, req, transaction);
  return booking;
}

export async function updateBooking(actor: User, booking: Booking, values: BookingValues, req: Request, transaction: Transaction) {
  const organization = (await Organization.findByPk(actor.organizationId, { transaction }))!;
  const customer = await loadCustomer(actor, values.customerId, transaction);
  await loadItems(actor, values, transaction);
  booking.set(bookingAttributes(values, organization));
  if (HOLDING_STATUSES.includes(booking.status)) await assertAvailable(actor, organization, booking, values.lines, transaction);
  const changed = booking.changed() || [];
  await booking.save({ transaction });
  const lines = await writeLines(booking, values, transaction);
  await storeTotal(booking, lines, customer, organization, transaction);
  // Issued agreements and invoices follow the booking: a changed one gets a new version.
  await reissueChangedDocuments(actor, booking.id, req, transaction);
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'booking.updated', subjectType: 'booking', subjectId: booking.id, data: { changed, lines: lines.length } }, req, transaction);
  return booking;
}

export async function changeBookingStatus(
  actor: User,
  booking: Booking,
  to: BookingStatus,
  note: string,
  req: Request,
  transaction: Transaction,
) {
  const from = booking.status;
  if (HOLDING_STATUSES.includes(to) && !HOLDING_STATUSES.includes(from)) {
    const organization = (await Organization.findByPk(actor.organizationId, { transaction }))!;
    const lines = await BookingLine.findAll({ where: { bookingId: booking.id }, transaction });
    if (!lines.some((l) => l.itemId)) throw conflict('Add at least one item from the catalog before reserving.', 'empty_booking');
    await assertAvailable(actor, organization, booking, lines, transaction);
  }
  booking.status = to;
  await booking.save({ transaction });
  await audit(
    { organizationId: actor.organizationId, actorUserId: actor.id, action: 'booking.status_changed', subjectType: 'booking', subjectId: booking.id, data: { from, to, note } },
    req,
    transaction,
  );
  return booking;
}

/** After a rolled-back reservation: keep the shortfall for the purchasing report. */
export async function rememberShortfall(organizationId: string, booking: Pick<Booking, 'id' | 'deliveryStart' | 'pickupEnd'>, err: ShortfallError) {
  const { from, to } = bookingWindow(booking);
  await recordShortfalls(organizationId, booking.id, err.shortfalls, from, to);
}
