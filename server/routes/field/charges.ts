import { Router } from 'express';
import type { z } from 'zod';
import { BookingIdParams, ChargesInput } from '../../../shared/schemas/field';
import { invoiceCharges, proposedCharges } from '../../commands/fieldCharges';
import { withTransaction } from '../../db';
import { auth, authenticate } from '../../middlewares/authenticate';
import { parsed, validate } from '../../middlewares/validate';
import { Booking } from '../../models';
import { sameOrganization } from '../../policies';

/** The office's side of the check-in: proposed damage and missing charges, made into a draft invoice. */
export const chargesRouter = Router();

const bookingOf = async (req: Parameters<typeof auth>[0], id: string) => sameOrganization(auth(req).user, await Booking.findByPk(id), 'That booking');

chargesRouter.get('/bookings/:bookingId/charges', authenticate, validate(BookingIdParams, 'params'), async (req, res) => {
  const booking = await bookingOf(req, parsed<{ bookingId: string }>(res, 'params').bookingId);
  res.json(await proposedCharges(auth(req).user, booking));
});

chargesRouter.post('/bookings/:bookingId/charges', authenticate, validate(BookingIdParams, 'params'), validate(ChargesInput), async (req, res) => {
  const { user } = auth(req);
  const { bookingId } = parsed<{ bookingId: string }>(res, 'params');
  await withTransaction((t) => invoiceCharges(user, bookingId, parsed<z.output<typeof ChargesInput>>(res), req, t));
  res.status(201).json(await proposedCharges(user, await bookingOf(req, bookingId)));
});
