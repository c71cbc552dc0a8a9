import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router';
import { Badge } from '@/components/ui/badge';
import { SectionCard } from '@/components/ui/card';
import { PageSpinner } from '@/components/ui/spinner';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api';
import { portalBookingQueryOptions, usePortalBooking } from '@/features/portal/api/get-booking';
import { AgreementSection, ReceiptsSection, ToDo, WhatYouRent, WhenAndWhere } from '@/features/portal/components/booking-sections';
import { CompanyContact } from '@/features/portal/components/company-contact';
import { InvoicesSection } from '@/features/portal/components/invoices-section';
import { bookingStatusWords } from '@/features/portal/components/labels';
import { PortalLayout } from '@/features/portal/components/portal-layout';
import { QueryProblem } from '@/features/portal/components/query-problem';

export { PortalRouteError as ErrorBoundary } from '@/features/portal/components/portal-route-error';

export const clientLoader = (queryClient: QueryClient) => async ({ params }: LoaderFunctionArgs) => {
  if (params.id) void queryClient.prefetchQuery(portalBookingQueryOptions(params.id));
  return null;
};

const back = <TextLink to={paths.portal.root.getHref()}>← All your rentals</TextLink>;

/** One booking as its customer sees it: what, when, where, the agreement, invoices to pay, receipts. */
export default function PortalBookingRoute() {
  const { id = '' } = useParams();
  const query = usePortalBooking(id);

  if (query.isPending) {
    return (
      <PortalLayout title="Your booking" signedIn back={back}>
        <PageSpinner label="Loading your booking…" />
      </PortalLayout>
    );
  }
  if (query.isError) {
    // Another customer's booking, or one that does not exist: the same answer, on purpose.
    if (isApiError(query.error) && query.error.status === 404) {
      return (
        <PortalLayout title="We can’t find this booking" signedIn back={back}>
          <p className="text-canvas-800">
            It isn’t among the bookings for the address you signed in with. If the link came from a different e-mail address, sign out and sign in with that one.
          </p>
        </PortalLayout>
      );
    }
    return (
      <PortalLayout title="Your booking" signedIn back={back}>
        <QueryProblem error={query.error} what="this booking" onRetry={() => void query.refetch()} />
      </PortalLayout>
    );
  }

  const booking = query.data;
  const status = bookingStatusWords(booking.status);
  return (
    <PortalLayout title={`Booking ${booking.reference}`} company={booking.company} signedIn back={back} aside={<Badge tone={status.tone}>{status.label}</Badge>}>
      <div className="space-y-5">
        <ToDo booking={booking} />
        <WhenAndWhere booking={booking} />
        <WhatYouRent booking={booking} />
        <AgreementSection booking={booking} />
        <InvoicesSection booking={booking} />
        <ReceiptsSection booking={booking} />
        <SectionCard title={`Contact ${booking.company.name}`}>
          <p className="text-canvas-700">Questions about your booking, a change of plans, or a site detail the crew should know? Get in touch.</p>
          <CompanyContact company={booking.company} className="mt-3" />
        </SectionCard>
      </div>
    </PortalLayout>
  );
}
