import type { BookingStatus } from '../../shared/schemas/bookings';
import { BOOKING_TRANSITIONS } from '../../shared/schemas/bookings';
import type { Booking, User } from '../models';

const desk = (actor: User) => actor.role === 'owner' || actor.role === 'office';

export const bookingPolicy = {
  list: (_actor: User) => true,
  read: (actor: User, booking: Booking) => actor.organizationId === booking.organizationId,
  seePrices: (actor: User) => actor.role !== 'crew',
  create: (actor: User) => desk(actor),
  update: (actor: User, booking: Booking) =>
    actor.organizationId === booking.organizationId && desk(actor) && ['draft', 'quoted', 'reserved'].includes(booking.status),
  /** The office moves a booking along; the crew marks it out and back. */
  changeStatus: (actor: User, booking: Booking, to: BookingStatus) => {
    if (actor.organizationId !== booking.organizationId) return false;
    if (!BOOKING_TRANSITIONS[booking.status].includes(to)) return false;
    if (desk(actor)) return true;
    return actor.role === 'crew' && ((booking.status === 'reserved' && to === 'out') || (booking.status === 'out' && to === 'returned'));
  },
  previewQuote: (actor: User) => actor.role !== 'crew',
};
