/**
 * A crew member's stops as an iCalendar feed (RFC 5545): one event per delivery and per pickup
 * of the bookings they are on, over the delivery or pickup window. The secret URL is the only
 * key, so the feed holds what the crew needs on site and nothing more: no prices, no e-mail.
 */
import ical, { ICalCalendarMethod } from 'ical-generator';
import { Op } from 'sequelize';
import { Booking, BookingCrew, BookingLine, Customer, Item, type Organization, type User } from '../models';
import { FIELD_STATUSES } from '../policies/field';
import { presentSite, stopItems, type FieldBookingRow } from '../presenters/field';
import { env } from '../env';

/** Stops from this long ago onwards stay in the feed; calendars keep older ones themselves. */
const PAST_DAYS = 60;

export async function calendarFor(user: User, organization: Organization, now = new Date()): Promise<string> {
  const links = await BookingCrew.findAll({ where: { userId: user.id, organizationId: user.organizationId }, attributes: ['bookingId'] });
  const since = new Date(now.getTime() - PAST_DAYS * 86_400_000);
  const bookings = links.length
    ? ((await Booking.findAll({
        where: { id: { [Op.in]: links.map((l) => l.bookingId) }, organizationId: user.organizationId, status: { [Op.in]: FIELD_STATUSES }, pickupEnd: { [Op.gte]: since } },
        include: [
          { model: Customer, as: 'customer', attributes: ['id', 'name', 'phone'] },
          { model: BookingLine, as: 'lines', include: [{ model: Item, as: 'item', attributes: ['id', 'name', 'kind'] }] },
        ],
        order: [['deliveryStart', 'ASC']],
      })) as FieldBookingRow[])
    : [];

  const calendar = ical({
    name: `${organization.name}: ${user.name}'s stops`,
    prodId: { company: 'Guyline', product: 'crew-stops', language: 'EN' },
    method: ICalCalendarMethod.PUBLISH,
    ttl: 60 * 60,
  });
  const host = new URL(env.APP_URL).hostname;
  for (const b of bookings) {
    const site = presentSite(b);
    const items = stopItems(b).map((i) => `${i.quantity} x ${i.name}`);
    for (const stop of ['delivery', 'pickup'] as const) {
      const description = [
        `${stop === 'delivery' ? 'Delivery and set-up' : 'Pickup and check-in'} for booking ${b.reference}`,
        `Customer: ${b.customer.name}${b.customer.phone ? `, ${b.customer.phone}` : ''}`,
        `Ground: ${b.surface}, anchored with ${b.anchoring}`,
        b.guestCount ? `Guests: ${b.guestCount}` : '',
        site.notes ? `Site notes: ${site.notes}` : '',
        items.length ? `Items:\n${items.join('\n')}` : '',
        stop === 'delivery' ? 'No stake goes in before the utility locate (811 or the local one-call center) is recorded on the site checklist.' : '',
        `${env.APP_URL}/app/field/bookings/${b.id}`,
      ].filter(Boolean).join('\n');
      calendar.createEvent({
        // Stable, so an edited booking updates the event instead of adding another.
        id: `${b.id}-${stop}@${host}`,
        start: stop === 'delivery' ? b.deliveryStart : b.pickupStart,
        end: stop === 'delivery' ? b.deliveryEnd : b.pickupEnd,
        stamp: b.updatedAt,
        summary: `${stop === 'delivery' ? 'Delivery' : 'Pickup'} ${b.reference}: ${b.customer.name}`,
        location: site.address || null,
        description,
        url: `${env.APP_URL}/app/field/bookings/${b.id}`,
      });
    }
  }
  return calendar.toString();
}
