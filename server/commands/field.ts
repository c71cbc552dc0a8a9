/**
 * Field writes: crew assignment, the site checklist and its ready-to-stake mark, delivered and
 * set-up marks, photos and the return check-in. Each takes the transaction, locks the booking
 * first (so two phones on one booking take turns), and writes an audit row on the booking.
 */
import type { Request } from 'express';
import { Op } from 'sequelize';
import type { z } from 'zod';
import type { CrewAssignmentInput, PhotoFields, ReturnCheckInput, SiteCheckInput } from '../../shared/schemas/field';
import { stakingReadiness } from '../../shared/siteSafety';
import type { Transaction } from '../db';
import { badRequest, conflict, forbidden } from '../errors';
import { Booking, BookingCrew, BookingLine, FieldPhoto, Item, ReturnCheck, ReturnCheckLine, SiteCheck, StoredFile, User } from '../models';
import { authorize, can, sameOrganization } from '../policies';
import { stopItems, type FieldBookingRow } from '../presenters/field';
import { deleteFile, storeFile } from '../services/storage';
import { audit } from './audit';
import { changeBookingStatus } from './bookings';

type Out<S extends z.ZodType> = z.output<S>;

/** Locks the booking row, then loads it (scoped to the actor's company). */
export async function lockBooking(actor: User, bookingId: string, t: Transaction) {
  return sameOrganization(actor, await Booking.findByPk(bookingId, { transaction: t, lock: t.LOCK.UPDATE }), 'That booking');
}

const auditBooking = (actor: User, booking: Booking, action: string, data: Record<string, unknown>, req: Request, t: Transaction) =>
  audit({ organizationId: actor.organizationId, actorUserId: actor.id, action, subjectType: 'booking', subjectId: booking.id, data }, req, t);

async function siteCheckFor(booking: Booking, t: Transaction) {
  return (
    (await SiteCheck.findOne({ where: { bookingId: booking.id }, transaction: t, lock: t.LOCK.UPDATE })) ??
    (await SiteCheck.create(
      // The office's locate details on the booking are the starting point.
      { organizationId: booking.organizationId, bookingId: booking.id, locateNumber: booking.utilityLocateNumber, locateRequestedOn: booking.utilityLocateDate ?? null, locateRequested: !!booking.utilityLocateNumber || !!booking.utilityLocateDate },
      { transaction: t },
    ))
  );
}

/** Replaces a booking's crew with these people (owner, office or crew of the same company, active). */
export async function assignCrew(actor: User, bookingId: string, input: Out<typeof CrewAssignmentInput>, req: Request, t: Transaction) {
  const booking = await lockBooking(actor, bookingId, t);
  authorize(actor, 'field', 'assignCrew', booking);
  const ids = [...new Set(input.userIds)];
  const users = ids.length ? await User.findAll({ where: { id: { [Op.in]: ids }, organizationId: actor.organizationId }, transaction: t }) : [];
  const byId = new Map(users.map((u) => [u.id, u]));
  const fields: Record<string, string> = {};
  input.userIds.forEach((id, i) => {
    const u = byId.get(id);
    if (!u) fields[`userIds.${i}`] = 'Not a person in your company.';
    else if (u.status !== 'active') fields[`userIds.${i}`] = `${u.name} is not active.`;
    else if (!['owner', 'office', 'crew'].includes(u.role)) fields[`userIds.${i}`] = `${u.name} does not go out on site.`;
  });
  if (Object.keys(fields).length) throw badRequest('Choose people of your company who go out on site.', fields);
  await BookingCrew.destroy({ where: { bookingId: booking.id }, transaction: t });
  if (ids.length) await BookingCrew.bulkCreate(ids.map((userId) => ({ organizationId: actor.organizationId, bookingId: booking.id, userId })), { transaction: t });
  await auditBooking(actor, booking, 'booking.crew_assigned', { crew: ids.map((id) => byId.get(id)!.name) }, req, t);
  return booking;
}

/** Saves the checklist. A change that breaks the locate rule takes back the ready-to-stake mark, unless the tent already stands on it. */
export async function saveSiteCheck(actor: User, bookingId: string, input: Out<typeof SiteCheckInput>, req: Request, t: Transaction) {
  const booking = await lockBooking(actor, bookingId, t);
  authorize(actor, 'field', 'work', booking);
  const check = await siteCheckFor(booking, t);
  const readiness = stakingReadiness(input);
  if (check.readyToStakeAt && !readiness.ready) {
    if (check.setUpAt) {
      throw conflict('The tent is already set up on this locate ticket: the ticket number stays on record.', 'already_set_up', { locateNumber: 'Keep the ticket number the tent was staked on.' });
    }
    check.readyToStakeAt = null;
    check.readyToStakeById = null;
  }
  check.set({ ...input, locateRequested: input.locateRequested || input.locateNumber !== '', updatedById: actor.id });
  const changed = check.changed() || [];
  await check.save({ transaction: t });
  await auditBooking(actor, booking, 'field.site_check_saved', { changed }, req, t);
  return check;
}

/** Marks staking ready: only with a locate ticket number, or a hard surface held with ballast. */
export async function markReadyToStake(actor: User, bookingId: string, req: Request, t: Transaction) {
  const booking = await lockBooking(actor, bookingId, t);
  authorize(actor, 'field', 'work', booking);
  const check = await siteCheckFor(booking, t);
  if (check.readyToStakeAt) return check;
  const readiness = stakingReadiness(check);
  if (!readiness.ready) throw conflict(readiness.reason!, 'locate_required', { locateNumber: readiness.reason! });
  check.readyToStakeAt = new Date();
  check.readyToStakeById = actor.id;
  await check.save({ transaction: t });
  await auditBooking(actor, booking, 'field.ready_to_stake', { locateNumber: check.locateNumber, hardSurfaceBallast: check.hardSurfaceBallast }, req, t);
  return check;
}

/** Delivered: the stock is out (a reserved booking becomes out). Set up: after delivery, and for a tent only once staking is ready. */
export async function markStop(actor: User, bookingId: string, mark: 'delivered' | 'set_up', req: Request, t: Transaction) {
  const booking = await lockBooking(actor, bookingId, t);
  const check = await siteCheckFor(booking, t);
  if (mark === 'delivered') {
    authorize(actor, 'field', 'markDelivered', booking);
    if (check.deliveredAt) return check;
    if (booking.status === 'reserved') {
      if (!can(actor, 'booking', 'changeStatus', booking, 'out')) throw forbidden();
      await changeBookingStatus(actor, booking, 'out', 'Delivered to the site.', req, t);
    }
    check.deliveredAt = new Date();
    check.deliveredById = actor.id;
  } else {
    if (!check.deliveredAt) throw conflict('Mark the delivery first.', 'not_delivered');
    authorize(actor, 'field', 'markSetUp', booking);
    if (check.setUpAt) return check;
    const lines = await BookingLine.findAll({ where: { bookingId: booking.id }, include: [{ model: Item, as: 'item', attributes: ['id', 'kind'] }], transaction: t });
    const hasTent = lines.some((l) => l.kind === 'rental' && l.item?.kind === 'tent');
    if (hasTent && !check.readyToStakeAt) {
      const reason = stakingReadiness(check).reason ?? 'Mark staking ready on the site checklist first.';
      throw conflict(`Staking is not marked ready. ${reason}`, 'not_ready_to_stake', { locateNumber: reason });
    }
    check.setUpAt = new Date();
    check.setUpById = actor.id;
  }
  await check.save({ transaction: t });
  await auditBooking(actor, booking, mark === 'delivered' ? 'field.delivered' : 'field.set_up', {}, req, t);
  return check;
}

/** Stores a checked photo with the booking. */
export async function addPhoto(
  actor: User,
  bookingId: string,
  file: { filename: string; contentType: string; data: Buffer },
  fields: Out<typeof PhotoFields>,
  req: Request,
  t: Transaction,
) {
  const booking = await lockBooking(actor, bookingId, t);
  authorize(actor, 'field', 'work', booking);
  if (fields.lineKey) {
    const lines = await BookingLine.findAll({ where: { bookingId: booking.id }, include: [{ model: Item, as: 'item', attributes: ['id', 'name', 'kind'] }], transaction: t });
    const keys = stopItems({ lines }).map((i) => i.key);
    if (!keys.includes(fields.lineKey)) throw badRequest('Say which line of this booking the photo shows.', { lineKey: 'Not a line of this booking.' });
  }
  const stored = await storeFile({ organizationId: actor.organizationId, filename: file.filename, contentType: file.contentType, data: file.data, purpose: 'field_photo' }, t);
  const photo = await FieldPhoto.create(
    { organizationId: actor.organizationId, bookingId: booking.id, storedFileId: stored.id, stage: fields.stage, lineKey: fields.lineKey, caption: fields.caption, uploadedById: actor.id },
    { transaction: t },
  );
  await auditBooking(actor, booking, 'field.photo_added', { photoId: photo.id, stage: photo.stage, sha256: stored.sha256, size: stored.size }, req, t);
  return photo;
}

/** Takes a photo off its booking (and its stored file), with an audit row that keeps its hash. */
export async function removePhoto(actor: User, photoId: string, req: Request, t: Transaction) {
  const photo = sameOrganization(actor, await FieldPhoto.findByPk(photoId, { transaction: t, lock: t.LOCK.UPDATE }), 'That photo');
  const booking = await lockBooking(actor, photo.bookingId, t);
  authorize(actor, 'field', 'removePhoto', booking, photo);
  const file = await StoredFile.findOne({ where: { id: photo.storedFileId, organizationId: actor.organizationId }, attributes: ['id', 'sha256', 'size'], transaction: t });
  await photo.destroy({ transaction: t });
  await deleteFile(actor.organizationId, photo.storedFileId, t);
  await auditBooking(actor, booking, 'field.photo_removed', { photoId: photo.id, stage: photo.stage, sha256: file?.sha256 ?? null, size: file?.size ?? null }, req, t);
  return booking;
}

/**
 * Saves the pickup count; with `submit` it finishes the check-in and the booking becomes
 * returned, in the same transaction. Every line must be counted to finish, damaged units need a
 * note, and nothing can come back that did not go out.
 */
export async function saveReturnCheck(actor: User, bookingId: string, input: Out<typeof ReturnCheckInput>, req: Request, t: Transaction) {
  const locked = await lockBooking(actor, bookingId, t);
  authorize(actor, 'field', 'checkIn', locked);
  const booking = (await Booking.findByPk(locked.id, {
    include: [{ model: BookingLine, as: 'lines', include: [{ model: Item, as: 'item', attributes: ['id', 'name', 'kind'] }] }],
    transaction: t,
  })) as FieldBookingRow;
  const existing = await ReturnCheck.findOne({ where: { bookingId: booking.id }, transaction: t, lock: t.LOCK.UPDATE });
  if (existing?.submittedAt) throw conflict('The check-in is already finished.', 'already_checked_in');

  const expected = new Map(stopItems(booking).map((it) => [it.key, it]));
  const fields: Record<string, string> = {};
  const seen = new Set<string>();
  input.lines.forEach((l, i) => {
    const it = expected.get(l.key);
    if (!it) return void (fields[`lines.${i}.key`] = 'Not a line of this booking.');
    if (seen.has(l.key)) return void (fields[`lines.${i}.key`] = 'This line is counted twice.');
    seen.add(l.key);
    if (l.returned > it.quantity) fields[`lines.${i}.returned`] = `Only ${it.quantity} went out.`;
    if (l.damaged > l.returned) fields[`lines.${i}.damaged`] = `At most the ${l.returned} that came back.`;
    if (input.submit && l.damaged > 0 && !l.notes) fields[`lines.${i}.notes`] = 'Say what is damaged.';
  });
  if (input.submit) {
    const uncounted = [...expected.values()].filter((it) => !seen.has(it.key));
    if (uncounted.length) fields.lines = `Count every line before finishing: ${uncounted.map((u) => u.name).join(', ')}.`;
  }
  if (Object.keys(fields).length) {
    throw badRequest(Object.keys(fields).length === 1 ? Object.values(fields)[0] : `Check the ${Object.keys(fields).length} highlighted fields.`, fields);
  }

  const check =
    existing ?? (await ReturnCheck.create({ organizationId: actor.organizationId, bookingId: booking.id }, { transaction: t }));
  check.notes = input.notes;
  check.savedById = actor.id;
  if (input.submit) {
    check.submittedAt = new Date();
    check.submittedById = actor.id;
  }
  check.changed('updatedAt', true);
  await check.save({ transaction: t });
  await ReturnCheckLine.destroy({ where: { returnCheckId: check.id }, transaction: t });
  await ReturnCheckLine.bulkCreate(
    input.lines.map((l) => {
      const it = expected.get(l.key)!;
      return { organizationId: actor.organizationId, returnCheckId: check.id, lineKey: l.key, itemId: it.itemId, description: it.name.slice(0, 200), sent: it.quantity, returned: l.returned, damaged: l.damaged, notes: l.notes };
    }),
    { transaction: t },
  );
  const missing = input.lines.reduce((n, l) => n + (expected.get(l.key)!.quantity - l.returned), 0);
  const damaged = input.lines.reduce((n, l) => n + l.damaged, 0);
  if (input.submit) {
    if (!can(actor, 'booking', 'changeStatus', locked, 'returned')) throw forbidden();
    await changeBookingStatus(actor, locked, 'returned', damaged || missing ? `Checked in: ${damaged} damaged, ${missing} missing.` : 'Checked in: everything back.', req, t);
  }
  await auditBooking(actor, booking, input.submit ? 'field.checked_in' : 'field.check_in_saved', { damaged, missing }, req, t);
  return check;
}
