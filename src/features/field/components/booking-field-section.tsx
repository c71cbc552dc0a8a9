import type { BookingRow } from '@shared/schemas/bookings';
import { SectionCard } from '@/components/ui/card';
import { ChargesPanel } from './charges-panel';
import { CrewPanel } from './crew-panel';

const ON_FIELD: BookingRow['status'][] = ['reserved', 'out', 'returned', 'closed'];

/** The booking page's field part: its crew, and for the office the damage found at pickup. */
export function BookingFieldSection({ booking }: { booking: Pick<BookingRow, 'id' | 'status' | 'can'> }) {
  return (
    <div className="mt-6 space-y-6">
      <SectionCard title="Crew" description="Who delivers, sets up and picks up. Each sees the stops on their day sheet and in their calendar feed.">
        <CrewPanel bookingId={booking.id} onField={ON_FIELD.includes(booking.status)} />
      </SectionCard>
      {booking.can.issueDocuments && ['returned', 'closed'].includes(booking.status) ? (
        <SectionCard title="Damage and missing items" description="From the crew’s pickup check-in, for you to review and bill.">
          <ChargesPanel bookingId={booking.id} />
        </SectionCard>
      ) : null}
    </div>
  );
}
