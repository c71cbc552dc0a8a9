/**
 * Reads for the field screens: a day's stops with their crew, checks and load list, and one
 * booking's field page. Scoped to the actor's organization throughout.
 */
import { Op } from 'sequelize';
import { addDays, zonedTimeToInstant } from '../../shared/dates';
import { loadList } from '../../shared/loadList';
import type { CrewMember, DaySheet, FieldBooking } from '../../shared/schemas/field';
import { siteSafety } from '../../shared/siteSafety';
import { conflict } from '../errors';
import { Booking, BookingCrew, BookingLine, Customer, FieldPhoto, Item, Organization, ReturnCheck, ReturnCheckLine, SiteCheck, StoredFile, User } from '../models';
import { can, sameOrganization } from '../policies';
import { FIELD_STATUSES } from '../policies/field';
import {
  loadListStop, loads, presentPhoto, presentReturnCheck, presentSiteCheck, presentStop, stopItems, type FieldBookingRow,
} from '../presenters/field';
import { rulesOf } from './rules';

const ITEM_FIELDS = ['id', 'name', 'kind', 'polesPerSetup', 'stakesPerSetup', 'ballastPerSetupLbs', 'widthFt', 'lengthFt'] as const;

const withParts = [
  { model: Customer, as: 'customer', attributes: ['id', 'name', 'phone'] },
  { model: BookingLine, as: 'lines', include: [{ model: Item, as: 'item', attributes: [...ITEM_FIELDS] }] },
];

/** The crew of each booking, by booking id. */
export async function crewOf(organizationId: string, bookingIds: string[]): Promise<Map<string, CrewMember[]>> {
  const rows = bookingIds.length
    ? ((await BookingCrew.findAll({
        where: { organizationId, bookingId: { [Op.in]: bookingIds } },
        include: [{ model: User, as: 'user', attributes: ['id', 'name', 'role'] }],
      })) as (BookingCrew & { user: User })[])
    : [];
  const map = new Map<string, CrewMember[]>();
  for (const r of rows.sort((a, b) => a.user.name.localeCompare(b.user.name))) {
    const list = map.get(r.bookingId) ?? [];
    list.push({ id: r.user.id, name: r.user.name, role: r.user.role as CrewMember['role'] });
    map.set(r.bookingId, list);
  }
  return map;
}

async function userNames(organizationId: string, ids: (string | null | undefined)[]) {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))];
  const users = wanted.length ? await User.findAll({ where: { id: { [Op.in]: wanted }, organizationId }, attributes: ['id', 'name'] }) : [];
  return new Map(users.map((u) => [u.id, u.name]));
}

/** Every delivery and pickup of a calendar day in the company's zone, with the day's load list. */
export async function daySheet(viewer: User, organization: Organization, date: string): Promise<DaySheet> {
  const tz = organization.timeZone;
  const start = zonedTimeToInstant(date, '00:00', tz);
  const end = zonedTimeToInstant(addDays(date, 1), '00:00', tz);
  const inDay = { [Op.gte]: start, [Op.lt]: end };
  const bookings = (await Booking.findAll({
    where: {
      organizationId: viewer.organizationId,
      status: { [Op.in]: FIELD_STATUSES },
      [Op.or]: [{ deliveryStart: inDay }, { pickupStart: inDay }],
    },
    include: withParts,
  })) as FieldBookingRow[];
  const ids = bookings.map((b) => b.id);
  const [crew, checks, returns] = await Promise.all([
    crewOf(viewer.organizationId, ids),
    ids.length ? SiteCheck.findAll({ where: { bookingId: { [Op.in]: ids }, organizationId: viewer.organizationId } }) : [],
    ids.length ? ReturnCheck.findAll({ where: { bookingId: { [Op.in]: ids }, organizationId: viewer.organizationId } }) : [],
  ]);
  const checkBy = new Map(checks.map((c) => [c.bookingId, c]));
  const returnBy = new Map(returns.map((r) => [r.bookingId, r]));
  const stops = [];
  const forLoad = [];
  for (const b of bookings) {
    const parts = { crew: crew.get(b.id) ?? [], viewerId: viewer.id, siteCheck: checkBy.get(b.id) ?? null, returnCheck: returnBy.get(b.id) ?? null };
    for (const stop of ['delivery', 'pickup'] as const) {
      const at = stop === 'delivery' ? b.deliveryStart : b.pickupStart;
      if (at < start || at >= end) continue;
      stops.push(presentStop(b, stop, parts));
      forLoad.push(loadListStop(b, stop));
    }
  }
  stops.sort((a, b) => a.windowStart.localeCompare(b.windowStart) || a.reference.localeCompare(b.reference) || a.stop.localeCompare(b.stop));
  return { date, timeZone: tz, stops, loadList: loadList(forLoad) };
}

/** One booking as the field sees it: both stops, the checklist with its safety figures, photos and the check-in. */
export async function fieldBooking(viewer: User, organization: Organization, bookingId: string): Promise<FieldBooking> {
  const booking = sameOrganization(viewer, (await Booking.findByPk(bookingId, { include: withParts })) as FieldBookingRow | null, 'That booking');
  if (!FIELD_STATUSES.includes(booking.status)) {
    throw conflict('This booking is not reserved, so it is on no day sheet yet.', 'not_scheduled');
  }
  const [crew, check, returnCheck, photos] = await Promise.all([
    crewOf(viewer.organizationId, [booking.id]),
    SiteCheck.findOne({ where: { bookingId: booking.id, organizationId: viewer.organizationId } }),
    ReturnCheck.findOne({
      where: { bookingId: booking.id, organizationId: viewer.organizationId },
      include: [{ model: ReturnCheckLine, as: 'lines' }],
    }) as Promise<(ReturnCheck & { lines: ReturnCheckLine[] }) | null>,
    FieldPhoto.findAll({ where: { bookingId: booking.id, organizationId: viewer.organizationId }, order: [['createdAt', 'ASC'], ['id', 'ASC']] }),
  ]);
  const files = photos.length
    ? await StoredFile.findAll({ where: { id: { [Op.in]: photos.map((p) => p.storedFileId) }, organizationId: viewer.organizationId }, attributes: ['id', 'contentType', 'size'] })
    : [];
  const fileBy = new Map(files.map((f) => [f.id, f]));
  const names = await userNames(viewer.organizationId, [
    check?.updatedById, returnCheck?.submittedById, ...photos.map((p) => p.uploadedById),
  ]);
  const parts = { crew: crew.get(booking.id) ?? [], viewerId: viewer.id, siteCheck: check, returnCheck };
  const rules = rulesOf(organization);
  const tents = booking.lines
    .filter((l) => loads(l) && l.item?.kind === 'tent' && l.item.widthFt && l.item.lengthFt)
    .map((l) => ({ name: l.item!.name, widthFt: Number(l.item!.widthFt), lengthFt: Number(l.item!.lengthFt), quantity: l.quantity }));
  const hasTent = stopItems(booking).some((i) => i.kind === 'tent');
  return {
    delivery: presentStop(booking, 'delivery', parts),
    pickup: presentStop(booking, 'pickup', parts),
    siteCheck: presentSiteCheck(booking, check, names),
    safety: siteSafety({ tents, guestCount: booking.guestCount, seating: booking.seating }, rules),
    photos: photos.filter((p) => fileBy.has(p.storedFileId)).map((p) => presentPhoto(p, fileBy.get(p.storedFileId)!, names, can(viewer, 'field', 'removePhoto', booking, p))),
    returnCheck: presentReturnCheck(booking, returnCheck, names),
    timeZone: organization.timeZone,
    can: {
      work: can(viewer, 'field', 'work', booking),
      markDelivered: can(viewer, 'field', 'markDelivered', booking) && !check?.deliveredAt,
      markSetUp: can(viewer, 'field', 'markSetUp', booking) && !!check?.deliveredAt && !check?.setUpAt && (!hasTent || !!check?.readyToStakeAt),
      checkIn: can(viewer, 'field', 'checkIn', booking) && !returnCheck?.submittedAt,
      assignCrew: can(viewer, 'field', 'assignCrew', booking),
      reviewCharges: can(viewer, 'field', 'reviewCharges', booking),
    },
  };
}

export { withParts as fieldBookingParts };
