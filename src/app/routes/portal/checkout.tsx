import { useEffect, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { useParams, useSearchParams } from 'react-router';
import type { CheckoutState } from '@shared/schemas/portal';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { portalDocumentUrl } from '@/features/portal/api/documents';
import { usePortalBooking } from '@/features/portal/api/get-booking';
import { usePortalCheckout } from '@/features/portal/api/get-checkout';
import { portalBaseKey } from '@/features/portal/api/keys';
import { useStartInvoiceCheckout } from '@/features/portal/api/start-checkout';
import { CheckoutOutcome, outcomeTitle } from '@/features/portal/components/checkout-outcome';
import { goToPaymentPage } from '@/features/portal/components/pay-form';
import { PortalLayout } from '@/features/portal/components/portal-layout';
import { CANCELLED_WAIT_MS, useConfirmWindow } from '@/features/portal/components/use-confirm-window';

export { PortalRouteError as ErrorBoundary } from '@/features/portal/components/portal-route-error';

/** Where the secure payment page sends the signed-in customer back (`?cancelled=1` from its Cancel). */
export default function PortalCheckoutRoute() {
  const { checkoutId = '' } = useParams();
  const [search] = useSearchParams();
  const cancelled = search.get('cancelled') === '1';
  const queryClient = useQueryClient();
  const window_ = useConfirmWindow();
  // After Cancel nothing is coming, except perhaps the word on a card refused just before: a short look.
  const [cancelledUntil] = useState(() => Date.now() + CANCELLED_WAIT_MS);
  const checkout = usePortalCheckout(checkoutId, cancelled ? cancelledUntil : window_.until);
  const state = checkout.data;
  const booking = usePortalBooking(state?.bookingId ?? '');
  const again = useStartInvoiceCheckout();
  const [leaving, setLeaving] = useState(false);

  // Once the money is in, the booking and the list show it without a reload.
  const paid = state?.status === 'paid';
  const receipt = state?.receiptDocumentId;
  useEffect(() => {
    if (paid) void queryClient.invalidateQueries({ queryKey: [...portalBaseKey, 'bookings'] });
  }, [paid, receipt, queryClient]);

  const tryAgain = (s: CheckoutState) =>
    again.mutate({ invoiceId: s.invoiceId, body: { amountCents: s.amountCents } }, { onSuccess: ({ url }) => setLeaving(goToPaymentPage(url)) });

  const back = state ? (
    <TextLink to={paths.portal.booking.getHref(state.bookingId)}>← Back to your booking</TextLink>
  ) : (
    <TextLink to={paths.portal.root.getHref()}>← Back to your rentals</TextLink>
  );

  return (
    <PortalLayout title={outcomeTitle(state, cancelled, window_.timedOut, checkout.error)} company={booking.data?.company ?? null} signedIn>
      <CheckoutOutcome
        state={state}
        loading={checkout.isPending}
        loadError={checkout.error}
        cancelled={cancelled}
        timedOut={window_.timedOut}
        onCheckAgain={() => {
          window_.restart();
          void checkout.refetch();
        }}
        receiptHref={portalDocumentUrl}
        back={back}
        onTryAgain={tryAgain}
        tryingAgain={again.isPending || leaving}
        tryAgainError={again.error}
      />
    </PortalLayout>
  );
}
