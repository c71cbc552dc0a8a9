import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router';
import { SectionCard } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { fieldBookingQueryOptions } from '@/features/field/api/get-field-booking';
import { timeWindow } from '@/features/field/components/labels';
import { ReturnCheckForm } from '@/features/field/components/return-check-form';
import { requireArea } from '../../../guards';
import { WithFieldBooking } from './field-booking-data';

export const clientLoader = (queryClient: QueryClient) => async ({ request, params }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'field');
  void queryClient.prefetchQuery(fieldBookingQueryOptions(params.id ?? ''));
  return null;
};

/** At pickup: count what came back, and record damage with notes and photos. */
export default function CheckInRoute() {
  return (
    <WithFieldBooking>
      {(b) => (
        <>
          <p className="mb-2 text-sm">
            <TextLink to={paths.app.fieldBooking.getHref(b.pickup.bookingId)}>Back to the stop</TextLink>
          </p>
          <PageHeader
            title={`Pickup check-in, ${b.pickup.reference}`}
            description={`${b.pickup.customer.name} · pickup ${timeWindow(b.pickup.windowStart, b.pickup.windowEnd, b.timeZone)}`}
          />
          <SectionCard title="What came back">
            <ReturnCheckForm booking={b} />
          </SectionCard>
        </>
      )}
    </WithFieldBooking>
  );
}
