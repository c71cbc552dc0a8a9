import type { Booking, User } from '../models';

const desk = (actor: User) => actor.role === 'owner' || actor.role === 'office';
/** Who goes out on site: the crew, and in a small company the owner and the office too. */
const fieldHand = (actor: User) => desk(actor) || actor.role === 'crew';

/** Bookings that are on a day sheet: reserved and later, never cancelled. */
export const FIELD_STATUSES: Booking['status'][] = ['reserved', 'out', 'returned', 'closed'];

export const fieldPolicy = {
  /** Day sheets, load lists and a booking's field page. */
  read: (actor: User) => fieldHand(actor),
  /** The site checklist and photos, while the stock is booked or on site. */
  work: (actor: User, booking: Booking) => actor.organizationId === booking.organizationId && fieldHand(actor) && ['reserved', 'out', 'returned'].includes(booking.status),
  markDelivered: (actor: User, booking: Booking) => actor.organizationId === booking.organizationId && fieldHand(actor) && ['reserved', 'out'].includes(booking.status),
  markSetUp: (actor: User, booking: Booking) => actor.organizationId === booking.organizationId && fieldHand(actor) && booking.status === 'out',
  /**
   * A photo taken by mistake comes off while the stock is booked or out: by whoever took it, or
   * the office. Once the stock is back and checked in, the photos are the record of its state.
   */
  removePhoto: (actor: User, booking: Booking, photo: { uploadedById: string | null }) =>
    actor.organizationId === booking.organizationId && fieldHand(actor) && ['reserved', 'out'].includes(booking.status) && (desk(actor) || photo.uploadedById === actor.id),
  /** The pickup check-in happens while the stock is out. */
  checkIn: (actor: User, booking: Booking) => actor.organizationId === booking.organizationId && fieldHand(actor) && booking.status === 'out',
  assignCrew: (actor: User, booking: Booking) => actor.organizationId === booking.organizationId && desk(actor) && !['closed', 'cancelled'].includes(booking.status),
  /** The proposed damage charges carry prices: the office's. */
  reviewCharges: (actor: User, booking: Booking) => actor.organizationId === booking.organizationId && desk(actor),
  /** Anyone who may be on a crew keeps a calendar feed of their stops. */
  calendar: (actor: User) => fieldHand(actor),
};
