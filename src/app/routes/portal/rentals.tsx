import type { QueryClient } from '@tanstack/react-query';
import { EmptyState } from '@/components/ui/empty-state';
import { PageSpinner } from '@/components/ui/spinner';
import { portalBookingsQueryOptions, usePortalBookings } from '@/features/portal/api/get-bookings';
import { usePortalMe } from '@/features/portal/api/get-portal-me';
import { PortalLayout } from '@/features/portal/components/portal-layout';
import { QueryProblem } from '@/features/portal/components/query-problem';
import { RentalsList } from '@/features/portal/components/rentals-list';

export { PortalRouteError as ErrorBoundary } from '@/features/portal/components/portal-route-error';

export const clientLoader = (queryClient: QueryClient) => async () => {
  void queryClient.prefetchQuery(portalBookingsQueryOptions());
  return null;
};

/**
 * "Your rentals": the customer's bookings with the one company this session belongs to. A
 * customer of two companies signs in to each with its own link.
 */
export default function PortalRentalsRoute() {
  const bookings = usePortalBookings();
  const me = usePortalMe();
  const list = bookings.data?.data ?? [];
  const company = me.data?.company ?? null;
  const needing = list.filter((b) => b.needsAction).length;

  return (
    <PortalLayout title="Your rentals" company={company} signedIn>
      {me.data?.name ? <p className="-mt-2 mb-4 text-canvas-700">Hello, {me.data.name}.</p> : null}
      {company ? (
        <p className="-mt-2 mb-4 text-sm text-canvas-700">
          These are your rentals with {company.name}. Rent from another company too? Its rentals open with its own sign-in link.
        </p>
      ) : null}
      {bookings.isPending ? (
        <PageSpinner label="Loading your rentals…" />
      ) : bookings.isError ? (
        <QueryProblem error={bookings.error} what="your rentals" onRetry={() => void bookings.refetch()} />
      ) : list.length === 0 ? (
        <EmptyState title="No rentals yet">
          <p>
            Nothing is booked with {company?.name ?? 'this company'} under {me.data?.email ? <strong className="break-all">{me.data.email}</strong> : 'this address'}. If you have booked with them,
            ask which e-mail address they have for you.
          </p>
        </EmptyState>
      ) : (
        <>
          {needing > 0 ? (
            <p className="mb-4 rounded-md border border-ochre-200 bg-ochre-50 px-4 py-3 text-sm text-ochre-800" role="status">
              {needing === 1 ? 'One booking needs' : `${needing} bookings need`} your attention: an agreement to sign or an amount to pay.
            </p>
          ) : null}
          <RentalsList bookings={list} />
        </>
      )}
    </PortalLayout>
  );
}
