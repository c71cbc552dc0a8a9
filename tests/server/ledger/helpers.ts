import { zonedTimeToInstant } from '../../../shared/dates';
import { Booking } from '../../../server/models';

let n = 0;
/**
 * A booking made directly with the model (the ledger needs only its company, customer and event
 * date): the event runs 18:00-23:00 on `eventDate` in `timeZone`, delivered the day before.
 */
export async function buildLedgerBooking(organizationId: string, customerId: string, eventDate: string, timeZone = 'America/Chicago') {
  n += 1;
  const at = (date: string, time: string) => zonedTimeToInstant(date, time, timeZone);
  const dayBefore = new Date(Date.parse(`${eventDate}T12:00:00Z`) - 86_400_000).toISOString().slice(0, 10);
  const dayAfter = new Date(Date.parse(`${eventDate}T12:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
  return Booking.create({
    organizationId,
    customerId,
    reference: `L-${process.pid % 1000}-${n}`,
    status: 'reserved',
    eventStart: at(eventDate, '18:00'),
    eventEnd: at(eventDate, '23:00'),
    deliveryStart: at(dayBefore, '09:00'),
    deliveryEnd: at(dayBefore, '12:00'),
    pickupStart: at(dayAfter, '09:00'),
    pickupEnd: at(dayAfter, '12:00'),
  });
}
