import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router';
import { SectionCard } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { fieldBookingQueryOptions } from '@/features/field/api/get-field-booking';
import { MapLink } from '@/features/field/components/map-link';
import { SafetyPanel } from '@/features/field/components/safety-panel';
import { SiteCheckForm } from '@/features/field/components/site-check-form';
import { requireArea } from '../../../guards';
import { WithFieldBooking } from './field-booking-data';

export const clientLoader = (queryClient: QueryClient) => async ({ request, params }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'field');
  void queryClient.prefetchQuery(fieldBookingQueryOptions(params.id ?? ''));
  return null;
};

/** Before anything is staked: the site checklist and the safety figures it is checked against. */
export default function SiteCheckRoute() {
  return (
    <WithFieldBooking>
      {(b) => (
        <>
          <p className="mb-2 text-sm">
            <TextLink to={paths.app.fieldBooking.getHref(b.delivery.bookingId)}>Back to the stop</TextLink>
          </p>
          <PageHeader title={`Site checklist, ${b.delivery.reference}`} description={<MapLink site={b.delivery.site} />} />
          <div className="space-y-6">
            <SectionCard title="Checklist">
              <SiteCheckForm booking={b} />
            </SectionCard>
            <SectionCard title="Safety figures and cautions" description="Defaults come from the company settings and the fire code’s tables; local codes, the fire code official, the tent maker and licensed practice decide.">
              <SafetyPanel safety={b.safety} />
            </SectionCard>
          </div>
        </>
      )}
    </WithFieldBooking>
  );
}
