import type { QuoteResult } from '../../shared/schemas/quote';
import { QuoteRequest } from '../../shared/schemas/quote';
import { dateInZone } from '../../shared/dates';
import { quote } from '../../shared/quote';
import type { Booking, BookingLine, Customer, Organization } from '../models';
import { rulesOf } from './rules';

/** The authoritative quote of a booking: the same shared function the editor previews with. */
export function quoteBooking(
  booking: Pick<Booking, 'taxRateBp' | 'discountBp' | 'discountCents' | 'deliveryMiles' | 'setupLaborCents' | 'damageWaiver' | 'ownInsurance' | 'securityDepositCents' | 'eventStart'>,
  lines: Pick<BookingLine, 'description' | 'quantity' | 'unitPriceCents' | 'extraDays' | 'extraDayPriceCents' | 'discountBp' | 'discountCents' | 'taxable' | 'kind'>[],
  customer: Pick<Customer, 'taxExempt'>,
  organization: Organization,
  today: Date = new Date(),
): QuoteResult {
  const rules = rulesOf(organization);
  const input = QuoteRequest.parse({
    lines: lines.map((l) => ({
      description: l.description,
      quantity: l.quantity,
      unitPriceCents: l.unitPriceCents,
      extraDays: l.extraDays,
      extraDayPriceCents: l.extraDayPriceCents,
      discountBp: l.discountBp,
      discountCents: l.discountCents,
      taxable: l.taxable,
      kind: l.kind,
    })),
    taxRateBp: booking.taxRateBp,
    taxExempt: customer.taxExempt,
    discountBp: booking.discountBp,
    discountCents: booking.discountCents,
    deliveryMiles: booking.deliveryMiles,
    deliveryBands: rules.deliveryBands,
    deliveryTaxable: rules.deliveryTaxable,
    setupLaborCents: booking.setupLaborCents,
    setupLaborTaxable: false,
    damageWaiverBp: booking.damageWaiver ? rules.damageWaiverBp : 0,
    damageWaiverTaxable: rules.damageWaiverTaxable,
    ownInsurance: booking.ownInsurance,
    depositBp: rules.depositBp,
    depositMinCents: rules.depositMinCents,
    securityDepositCents: booking.securityDepositCents,
    balanceDueDays: rules.balanceDueDays,
    signingDate: dateInZone(today, organization.timeZone),
    eventDate: dateInZone(booking.eventStart, organization.timeZone),
  });
  return quote(input);
}
