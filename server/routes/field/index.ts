import { Router, type NextFunction, type Request, type Response } from 'express';
import { fileTypeFromBuffer } from 'file-type';
import { Op } from 'sequelize';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { z } from 'zod';
import {
  BookingIdParams, CrewAssignmentInput, DayParams, FieldMarkInput, PHOTO_MAX_BYTES, PHOTO_TYPES, PhotoFields, ReturnCheckInput, SiteCheckInput,
  type CalendarFeedCreated, type CalendarFeedState, type CrewMember,
} from '../../../shared/schemas/field';
import { IdParams } from '../../../shared/schemas/common';
import { dateInZone } from '../../../shared/dates';
import { addPhoto, assignCrew, markReadyToStake, markStop, removePhoto, saveReturnCheck, saveSiteCheck } from '../../commands/field';
import { createCalendarFeed, revokeCalendarFeed } from '../../commands/fieldCalendar';
import { sequelize, withTransaction } from '../../db';
import { renderDaySheetPdf } from '../../documents/daySheet';
import { env } from '../../env';
import { HttpError, notFound } from '../../errors';
import { auth, authenticate } from '../../middlewares/authenticate';
import { singleFile } from '../../middlewares/upload';
import { parsed, validate } from '../../middlewares/validate';
import { Booking, CalendarFeed, FieldPhoto, Organization, User } from '../../models';
import { authorize, can, sameOrganization } from '../../policies';
import { calendarFor } from '../../services/calendarFeed';
import { crewOf, daySheet, fieldBooking } from '../../services/fieldDay';
import { contentDisposition } from '../../services/downloads';
import { documentLogo, keptImage } from '../../services/images';
import { readFile } from '../../services/storage';
import { hashToken } from '../../services/tokens';
import { chargesRouter } from './charges';

export const fieldRouter = Router();

type BookingParams = { bookingId: string };
const bookingId = (res: Response) => parsed<BookingParams>(res, 'params').bookingId;

/** After a write: the booking's field page as the writer now sees it. */
async function answer(req: Request, res: Response, status = 200) {
  const { user, organization } = auth(req);
  res.status(status).json(await fieldBooking(user, organization, bookingId(res)));
}

// --- day sheets and load lists -------------------------------------------------------------

/** The crew's home: today on the company's calendar. */
fieldRouter.get('/today', authenticate, async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'field', 'read');
  res.json(await daySheet(user, organization, dateInZone(new Date(), organization.timeZone)));
});

fieldRouter.get('/days/:date', authenticate, validate(DayParams, 'params'), async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'field', 'read');
  res.json(await daySheet(user, organization, parsed<DayParams>(res, 'params').date));
});

fieldRouter.get('/days/:date/pdf', authenticate, validate(DayParams, 'params'), async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'field', 'read');
  const { date } = parsed<DayParams>(res, 'params');
  const sheet = await daySheet(user, organization, date);
  const pdf = await renderDaySheetPdf(sheet, { name: organization.name, logo: await documentLogo(organization) });
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', contentDisposition(`day-sheet-${date}.pdf`, 'inline'));
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Cache-Control', 'private, no-cache');
  res.send(pdf);
});

// --- one booking in the field ------------------------------------------------------------------

fieldRouter.get('/bookings/:bookingId', authenticate, validate(BookingIdParams, 'params'), async (req, res) => {
  authorize(auth(req).user, 'field', 'read');
  await answer(req, res);
});

fieldRouter.put('/bookings/:bookingId/site-check', authenticate, validate(BookingIdParams, 'params'), validate(SiteCheckInput), async (req, res) => {
  const { user } = auth(req);
  await withTransaction((t) => saveSiteCheck(user, bookingId(res), parsed<z.output<typeof SiteCheckInput>>(res), req, t));
  await answer(req, res);
});

fieldRouter.post('/bookings/:bookingId/ready-to-stake', authenticate, validate(BookingIdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  await withTransaction((t) => markReadyToStake(user, bookingId(res), req, t));
  await answer(req, res);
});

fieldRouter.post('/bookings/:bookingId/marks', authenticate, validate(BookingIdParams, 'params'), validate(FieldMarkInput), async (req, res) => {
  const { user } = auth(req);
  await withTransaction((t) => markStop(user, bookingId(res), parsed<z.output<typeof FieldMarkInput>>(res).mark, req, t));
  await answer(req, res);
});

fieldRouter.put('/bookings/:bookingId/return-check', authenticate, validate(BookingIdParams, 'params'), validate(ReturnCheckInput), async (req, res) => {
  const { user } = auth(req);
  await withTransaction((t) => saveReturnCheck(user, bookingId(res), parsed<z.output<typeof ReturnCheckInput>>(res), req, t));
  await answer(req, res);
});

// --- photos --------------------------------------------------------------------------------

fieldRouter.post(
  '/bookings/:bookingId/photos',
  authenticate,
  validate(BookingIdParams, 'params'),
  // Authorize before reading the upload, so a forbidden user's file is never taken in.
  async (req: Request, res: Response, next: NextFunction) => {
    const { user } = auth(req);
    const booking = sameOrganization(user, await Booking.findByPk(bookingId(res)), 'That booking');
    authorize(user, 'field', 'work', booking);
    next();
  },
  // What the photo shows travels in the query string, beside the one file of the form.
  validate(PhotoFields, 'query'),
  singleFile(PHOTO_MAX_BYTES),
  async (req, res) => {
    const { user } = auth(req);
    const file = req.file!;
    if (file.size === 0) throw new HttpError(400, 'empty_file', 'The file is empty: take the photo again.', { file: 'Empty file.' });
    // The type comes from the bytes, never from the name or the browser's word for it.
    const detected = await fileTypeFromBuffer(file.buffer);
    if (!detected || !(PHOTO_TYPES as readonly string[]).includes(detected.mime)) {
      throw new HttpError(415, 'unsupported_media_type', 'Upload a photo: a JPEG, PNG, WEBP or AVIF image.', { file: 'Not a photo.' });
    }
    // Refused by its header when too large; kept as a JPEG at most 2560 px on the long side.
    const photo = await keptImage(file.buffer, 'photo');
    const base = (file.originalname.replace(/\.[^.]*$/, '').replace(/[^\w .-]+/g, '_').trim() || 'photo').slice(0, 200);
    await withTransaction((t) =>
      addPhoto(user, bookingId(res), { filename: `${base}.${photo.ext}`, contentType: photo.contentType, data: photo.data }, parsed<z.output<typeof PhotoFields>>(res, 'query'), req, t),
    );
    await answer(req, res, 201);
  },
);

fieldRouter.get('/photos/:id', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'field', 'read');
  const photo = sameOrganization(user, await FieldPhoto.findByPk(parsed<{ id: string }>(res, 'params').id), 'That photo');
  const file = await readFile(user.organizationId, photo.storedFileId);
  if (!file) throw notFound('That photo');
  // An image, by the type read from its bytes at upload; never sniffed, never a page that could run.
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Content-Security-Policy', "default-src 'none'; sandbox");
  res.setHeader('Content-Disposition', contentDisposition(file.filename, 'inline'));
  res.setHeader('Cache-Control', 'private, max-age=3600');
  res.send(file.data);
});

/** A photo taken by mistake comes off (see fieldPolicy.removePhoto); answers its booking's field page. */
fieldRouter.delete('/photos/:id', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user, organization } = auth(req);
  const booking = await withTransaction((t) => removePhoto(user, parsed<{ id: string }>(res, 'params').id, req, t));
  res.json(await fieldBooking(user, organization, booking.id));
});

// --- crew ------------------------------------------------------------------------------------

/** People who can go out on site, for the office's crew picker. */
fieldRouter.get('/crew-members', authenticate, async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'field', 'read');
  const people = await User.findAll({
    where: { organizationId: user.organizationId, status: 'active', role: { [Op.in]: ['owner', 'office', 'crew'] } },
    attributes: ['id', 'name', 'role'],
    order: [['name', 'ASC']],
  });
  const data: CrewMember[] = people.map((p) => ({ id: p.id, name: p.name, role: p.role as CrewMember['role'] }));
  res.json({ data, total: data.length });
});

fieldRouter.get('/bookings/:bookingId/crew', authenticate, validate(BookingIdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'field', 'read');
  const booking = sameOrganization(user, await Booking.findByPk(bookingId(res)), 'That booking');
  const data = (await crewOf(user.organizationId, [booking.id])).get(booking.id) ?? [];
  res.json({ data, total: data.length, can: { assign: can(user, 'field', 'assignCrew', booking) } });
});

fieldRouter.put('/bookings/:bookingId/crew', authenticate, validate(BookingIdParams, 'params'), validate(CrewAssignmentInput), async (req, res) => {
  const { user } = auth(req);
  const booking = await withTransaction((t) => assignCrew(user, bookingId(res), parsed<z.output<typeof CrewAssignmentInput>>(res), req, t));
  const data = (await crewOf(user.organizationId, [booking.id])).get(booking.id) ?? [];
  res.json({ data, total: data.length, can: { assign: true } });
});

// --- calendar feed ---------------------------------------------------------------------------

const feedState = (feed: CalendarFeed | null): CalendarFeedState => ({
  active: !!feed,
  createdAt: feed ? feed.createdAt.toISOString() : null,
  lastUsedAt: feed?.lastUsedAt ? feed.lastUsedAt.toISOString() : null,
});

fieldRouter.get('/calendar-feed', authenticate, async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'field', 'calendar');
  res.json(feedState(await CalendarFeed.findOne({ where: { userId: user.id, revokedAt: null } })));
});

/** A new secret address; any older one stops working. The address is shown this once. */
fieldRouter.post('/calendar-feed', authenticate, async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'field', 'calendar');
  const { feed, token } = await withTransaction((t) => createCalendarFeed(user, req, t));
  const body: CalendarFeedCreated = { ...feedState(feed), url: `${env.APP_URL}/api/field/calendar/${token}.ics` };
  res.status(201).json(body);
});

fieldRouter.delete('/calendar-feed', authenticate, async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'field', 'calendar');
  await withTransaction((t) => revokeCalendarFeed(user, req, t));
  res.json(feedState(null));
});

// Calendar apps poll the feed; the secret is long, but a cap per address keeps guessing pointless.
const feedLimiter = new RateLimiterPostgres({
  storeClient: sequelize, storeType: 'sequelize', tableName: 'rate_limits', tableCreated: true, keyPrefix: 'calendar_feed_ip', points: 240, duration: 60 * 60,
});

const FeedParams = z.object({ file: z.string().regex(/^[A-Za-z0-9_-]{43}\.ics$/, 'Not a calendar address.') });

/** The feed itself: no session, the token in the address is the key. */
fieldRouter.get('/calendar/:file', validate(FeedParams, 'params'), async (req, res) => {
  try {
    await feedLimiter.consume(req.ip ?? 'unknown');
  } catch (r) {
    if (r instanceof RateLimiterRes) throw new HttpError(429, 'rate_limited', 'Too many requests for calendars from this address. Try again later.');
    throw r;
  }
  const token = parsed<{ file: string }>(res, 'params').file.slice(0, -4);
  const feed = await CalendarFeed.findOne({ where: { tokenHash: hashToken(token), revokedAt: null } });
  if (!feed) throw notFound('That calendar');
  const user = await User.findOne({ where: { id: feed.userId, organizationId: feed.organizationId, status: 'active' } });
  const organization = await Organization.findByPk(feed.organizationId);
  // The owner's role and status as they are now, at every read: a person moved to a role without
  // the calendar (or disabled) loses the feed at once, without waiting for anyone to revoke it.
  if (!user || !organization || !can(user, 'field', 'calendar')) throw notFound('That calendar');
  await feed.update({ lastUsedAt: new Date() });
  res.setHeader('Content-Type', 'text/calendar; charset=utf-8');
  res.setHeader('Content-Disposition', contentDisposition('stops.ics', 'inline'));
  res.setHeader('Cache-Control', 'private, max-age=300');
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.send(await calendarFor(user, organization));
});

fieldRouter.use('/', chargesRouter);
