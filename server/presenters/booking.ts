import type { BookingLineRow, BookingRow } from '../../shared/schemas/bookings';
import { BOOKING_STATUSES } from '../../shared/schemas/bookings';
import type { ShortfallDetail } from '../../shared/schemas/bookings';
import type { Booking, BookingLine, Customer, Organization, User } from '../models';
import { can } from '../policies';
import { quoteBooking } from '../services/pricing';

export function presentBooking(
  booking: Booking & { customer: Customer; lines: (BookingLine & { item?: { kind: string } | null })[] },
  actor: User,
  organization: Organization,
  availability: ShortfallDetail[] = [],
): BookingRow {
  const seePrices = can(actor, 'booking', 'seePrices');
  const byItem = new Map(availability.map((a) => [a.itemId, a]));
  const lines = [...booking.lines].sort((a, b) => a.position - b.position);
  const price = (n: number) => (seePrices ? n : 0);
  // A booking's lines of one item share its availability: the shortfall goes on each of them.
  const presentLine = (l: (typeof lines)[number]): BookingLineRow => {
    const a = l.itemId ? byItem.get(l.itemId) : undefined;
    return {
      id: l.id,
      position: l.position,
      itemId: l.itemId,
      itemKind: l.item?.kind ?? null,
      description: l.description,
      quantity: l.quantity,
      unitPriceCents: price(l.unitPriceCents),
      extraDays: l.extraDays,
      extraDayPriceCents: price(l.extraDayPriceCents),
      discountBp: seePrices ? l.discountBp : 0,
      discountCents: price(l.discountCents),
      taxable: l.taxable,
      kind: l.kind,
      available: a ? a.available : null,
      shortfall: a ? a.shortfall : 0,
    };
  };
  return {
    id: booking.id,
    reference: booking.reference,
    status: booking.status,
    customer: {
      id: booking.customer.id,
      name: booking.customer.name,
      email: booking.customer.email,
      phone: booking.customer.phone,
      taxExempt: booking.customer.taxExempt,
    },
    eventStart: booking.eventStart.toISOString(),
    eventEnd: booking.eventEnd.toISOString(),
    deliveryStart: booking.deliveryStart.toISOString(),
    deliveryEnd: booking.deliveryEnd.toISOString(),
    pickupStart: booking.pickupStart.toISOString(),
    pickupEnd: booking.pickupEnd.toISOString(),
    siteLine1: booking.siteLine1,
    siteLine2: booking.siteLine2,
    siteCity: booking.siteCity,
    siteRegion: booking.siteRegion,
    sitePostalCode: booking.sitePostalCode,
    siteNotes: booking.siteNotes,
    surface: booking.surface,
    anchoring: booking.anchoring,
    utilityLocateNumber: booking.utilityLocateNumber,
    utilityLocateDate: booking.utilityLocateDate ?? null,
    guestCount: booking.guestCount,
    seating: booking.seating,
    afterDark: booking.afterDark,
    deliveryMiles: booking.deliveryMiles ?? null,
    setupLaborCents: price(booking.setupLaborCents),
    discountBp: seePrices ? booking.discountBp : 0,
    discountCents: price(booking.discountCents),
    damageWaiver: booking.damageWaiver,
    ownInsurance: booking.ownInsurance,
    taxRateBp: seePrices ? booking.taxRateBp : 0,
    securityDepositCents: price(booking.securityDepositCents),
    notes: booking.notes,
    currency: booking.currency,
    lines: lines.map(presentLine),
    totals: seePrices ? quoteBooking(booking, lines, booking.customer, organization) : null,
    createdAt: booking.createdAt.toISOString(),
    updatedAt: booking.updatedAt.toISOString(),
    can: {
      update: can(actor, 'booking', 'update', booking),
      changeStatus: BOOKING_STATUSES.filter((s) => can(actor, 'booking', 'changeStatus', booking, s)),
      seePrices,
      issueDocuments: can(actor, 'document', 'issue'),
      readDocuments: can(actor, 'document', 'readTemplates'),
    },
  };
}
