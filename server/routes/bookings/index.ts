import { Router } from 'express';
import { Op } from 'sequelize';
import { BOOKING_STATUS_LABELS, BOOKING_TRANSITIONS, BookingInput, BookingListQuery, BookingStatusChange, type BookingValues } from '../../../shared/schemas/bookings';
import { IdParams } from '../../../shared/schemas/common';
import { ShortfallError, bookingWindow, changeBookingStatus, createBooking, rememberShortfall, updateBooking } from '../../commands/bookings';
import { withTransaction } from '../../db';
import { conflict, forbidden } from '../../errors';
import { auth, authenticate, requireClaims, resolveSession } from '../../middlewares/authenticate';
import { parsed, validate } from '../../middlewares/validate';
import { AuditLog, Booking, BookingLine, Customer, Item, User, type Organization } from '../../models';
import { authorize, can, sameOrganization } from '../../policies';
import { presentBooking } from '../../presenters/booking';
import { checkAvailability } from '../../services/availability';
import { listBookings, withoutPrices } from '../../services/bookingList';
import { rulesOf } from '../../services/rules';

export const bookingsRouter = Router();

const withParts = [
  { model: Customer, as: 'customer' },
  { model: BookingLine, as: 'lines', include: [{ model: Item, as: 'item', attributes: ['id', 'kind'] }] },
];

type Full = Booking & { customer: Customer; lines: BookingLine[] };

async function loadFull(actor: User, id: string) {
  return sameOrganization(actor, await Booking.findByPk(id, { include: withParts }), 'That booking') as Full;
}

/** Presents one booking with each catalog line's availability over its window (not counting itself). */
async function presentOne(actor: User, organization: Organization, booking: Full) {
  const { from, to } = bookingWindow(booking);
  const availability = await checkAvailability(
    actor.organizationId,
    booking.lines.filter((l) => l.itemId).map((l) => ({ itemId: l.itemId!, quantity: l.quantity })),
    from,
    to,
    rulesOf(organization).turnaroundHours,
    { excludeBookingId: booking.id },
  );
  return presentBooking(booking, actor, organization, availability);
}

bookingsRouter.get('/', requireClaims, validate(BookingListQuery, 'query'), async (req, res) => {
  const claims = req.claims!;
  const q = parsed<BookingListQuery>(res, 'query');
  // List rows, not bookings: no lines and no quote per row. The page is read for the company the
  // signed token names while the session is checked, so the two database round trips overlap
  // (npm run bench, bookings list); nothing is answered unless the check passes for that company.
  const early = claims.org ? listBookings(claims.org, q) : null;
  early?.catch(() => undefined);
  const { user } = (req.auth = await resolveSession(claims, res));
  authorize(user, 'booking', 'list');
  const page = early && claims.org === user.organizationId ? await early : await listBookings(user.organizationId, q);
  res.json(can(user, 'booking', 'seePrices') ? page : withoutPrices(page));
});

bookingsRouter.post('/', authenticate, validate(BookingInput), async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'booking', 'create');
  const values = parsed<BookingValues>(res);
  const booking = await withTransaction((t) => createBooking(user, values, req, t));
  res.status(201).json(await presentOne(user, organization, await loadFull(user, booking.id)));
});

bookingsRouter.get('/:id', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user, organization } = auth(req);
  const booking = await loadFull(user, parsed<{ id: string }>(res, 'params').id);
  authorize(user, 'booking', 'read', booking);
  res.json(await presentOne(user, organization, booking));
});

bookingsRouter.put('/:id', authenticate, validate(IdParams, 'params'), validate(BookingInput), async (req, res) => {
  const { user, organization } = auth(req);
  const { id } = parsed<{ id: string }>(res, 'params');
  const values = parsed<BookingValues>(res);
  try {
    await withTransaction(async (t) => {
      const booking = sameOrganization(user, await Booking.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE }), 'That booking');
      authorize(user, 'booking', 'update', booking);
      return updateBooking(user, booking, values, req, t);
    });
  } catch (err) {
    if (err instanceof ShortfallError) await rememberShortfall(user.organizationId, { id, ...bookingWindowOf(values) }, err);
    throw err;
  }
  res.json(await presentOne(user, organization, await loadFull(user, id)));
});

const bookingWindowOf = (v: BookingValues) => ({ deliveryStart: new Date(v.deliveryStart), pickupEnd: new Date(v.pickupEnd) });

bookingsRouter.post('/:id/status', authenticate, validate(IdParams, 'params'), validate(BookingStatusChange), async (req, res) => {
  const { user, organization } = auth(req);
  const { id } = parsed<{ id: string }>(res, 'params');
  const { status, note } = parsed<{ status: Booking['status']; note: string }>(res);
  let window: { id: string; deliveryStart: Date; pickupEnd: Date } | null = null;
  try {
    await withTransaction(async (t) => {
      const booking = sameOrganization(user, await Booking.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE }), 'That booking');
      window = { id: booking.id, deliveryStart: booking.deliveryStart, pickupEnd: booking.pickupEnd };
      if (!BOOKING_TRANSITIONS[booking.status].includes(status) && user.role !== 'bookkeeper') {
        throw conflict(`A ${BOOKING_STATUS_LABELS[booking.status].toLowerCase()} booking cannot become ${BOOKING_STATUS_LABELS[status].toLowerCase()}.`, 'invalid_transition', {
          status: `Not allowed from ${BOOKING_STATUS_LABELS[booking.status].toLowerCase()}.`,
        });
      }
      if (!can(user, 'booking', 'changeStatus', booking, status)) throw forbidden();
      return changeBookingStatus(user, booking, status, note, req, t);
    });
  } catch (err) {
    if (err instanceof ShortfallError && window) await rememberShortfall(user.organizationId, window, err);
    throw err;
  }
  res.json(await presentOne(user, organization, await loadFull(user, id)));
});

bookingsRouter.get('/:id/history', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  const booking = sameOrganization(user, await Booking.findByPk(parsed<{ id: string }>(res, 'params').id), 'That booking');
  authorize(user, 'booking', 'read', booking);
  const rows = await AuditLog.findAll({
    where: { organizationId: user.organizationId, subjectType: 'booking', subjectId: booking.id },
    order: [['createdAt', 'DESC']],
    limit: 200,
  });
  const actors = new Map(
    (await User.findAll({ where: { id: { [Op.in]: rows.map((r) => r.actorUserId).filter((x): x is string => !!x) }, organizationId: user.organizationId }, attributes: ['id', 'name'] })).map((u) => [u.id, u.name]),
  );
  // The trail records invoice totals, payments and refunds: who may not see prices sees it without the amounts.
  const seePrices = can(user, 'booking', 'seePrices');
  const shown = (data: Record<string, unknown>) => (seePrices ? data : Object.fromEntries(Object.entries(data ?? {}).filter(([k]) => !k.endsWith('Cents'))));
  res.json({
    data: rows.map((r) => ({ id: r.id, action: r.action, at: r.createdAt.toISOString(), actorName: r.actorUserId ? (actors.get(r.actorUserId) ?? 'Former user') : 'System', data: shown(r.data) })),
    total: rows.length,
  });
});
