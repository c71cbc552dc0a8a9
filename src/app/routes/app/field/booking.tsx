import type { QueryClient } from '@tanstack/react-query';
import { Link, type LoaderFunctionArgs } from 'react-router';
import { SectionCard } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { buttonClasses } from '@/components/ui/button';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { formatZoned, zonedDate } from '@/lib/zoned-time';
import { fieldBookingQueryOptions } from '@/features/field/api/get-field-booking';
import { timeWindow } from '@/features/field/components/labels';
import { MarksPanel } from '@/features/field/components/marks-panel';
import { PhotoList } from '@/features/field/components/photo-list';
import { PhotoUpload } from '@/features/field/components/photo-upload';
import { StopCard } from '@/features/field/components/stop-card';
import { requireArea } from '../../../guards';
import { WithFieldBooking } from './field-booking-data';

export const clientLoader = (queryClient: QueryClient) => async ({ request, params }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'field');
  void queryClient.prefetchQuery(fieldBookingQueryOptions(params.id ?? ''));
  return null;
};

/** One booking in the field: the site, delivery and set-up with photos, and the way to the checklist and the check-in. */
export default function FieldBookingRoute() {
  return (
    <WithFieldBooking>
      {(b) => {
        const id = b.delivery.bookingId;
        const deliveryDay = zonedDate(b.delivery.windowStart, b.timeZone);
        const photos = b.photos.filter((p) => p.stage !== 'damage' && p.stage !== 'return');
        return (
          <>
            <p className="mb-2 text-sm">
              <TextLink to={paths.app.fieldDay.getHref(deliveryDay)}>Back to the day sheet</TextLink>
            </p>
            <PageHeader
              title={`${b.delivery.reference}: ${b.delivery.customer.name}`}
              documentTitle={`Stop ${b.delivery.reference}`}
              description={`Delivery ${formatZoned(b.delivery.windowStart, b.timeZone)}; pickup ${formatZoned(b.pickup.windowStart, b.timeZone)}.`}
            />
            <div className="space-y-6">
              <StopCard stop={b.delivery} timeZone={b.timeZone} showOpen={false} headingLevel={2} />
              <nav aria-label="This stop" className="flex flex-wrap gap-2">
                <Link className={buttonClasses('secondary')} to={paths.app.fieldSiteCheck.getHref(id)}>
                  Site checklist
                </Link>
                <Link className={buttonClasses('secondary')} to={paths.app.fieldCheckIn.getHref(id)}>
                  Pickup check-in
                </Link>
              </nav>
              <SectionCard title="Delivery and set-up" description={`Delivery ${timeWindow(b.delivery.windowStart, b.delivery.windowEnd, b.timeZone)}.`}>
                <MarksPanel booking={b} />
              </SectionCard>
              <SectionCard title="Photos" description="The site before, the stock as delivered and the tent as set up.">
                <div className="space-y-4">
                  <PhotoList photos={photos} bookingId={id} />
                  {b.can.work ? (
                    <PhotoUpload bookingId={id} stage={b.delivery.progress.setUpAt ? 'set_up' : b.delivery.progress.deliveredAt ? 'delivered' : 'site'} label="Take a photo" />
                  ) : null}
                </div>
              </SectionCard>
            </div>
          </>
        );
      }}
    </WithFieldBooking>
  );
}
