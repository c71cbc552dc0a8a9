import { useEffect, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { useParams, useSearchParams } from 'react-router';
import type { CheckoutState } from '@shared/schemas/portal';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { payLinkDocumentUrl, payLinkQueryOptions, usePayLink } from '@/features/portal/api/get-pay-link';
import { usePayLinkCheckout } from '@/features/portal/api/get-pay-link-checkout';
import { useStartPayLinkCheckout } from '@/features/portal/api/start-pay-link-checkout';
import { CheckoutOutcome, outcomeTitle } from '@/features/portal/components/checkout-outcome';
import { goToPaymentPage } from '@/features/portal/components/pay-form';
import { isDeadLink, PayLinkProblem } from '@/features/portal/components/pay-link-problem';
import { PortalLayout } from '@/features/portal/components/portal-layout';
import { CANCELLED_WAIT_MS, useConfirmWindow } from '@/features/portal/components/use-confirm-window';

export { PortalRouteError as ErrorBoundary } from '@/features/portal/components/portal-route-error';

/** Where the secure payment page sends a pay link's payer back (`?cancelled=1` from its Cancel). */
export default function PayLinkCheckoutRoute() {
  const { token = '', checkoutId = '' } = useParams();
  const [search] = useSearchParams();
  const cancelled = search.get('cancelled') === '1';
  const queryClient = useQueryClient();
  const window_ = useConfirmWindow();
  // After Cancel nothing is coming, except perhaps the word on a card refused just before: a short look.
  const [cancelledUntil] = useState(() => Date.now() + CANCELLED_WAIT_MS);
  const checkout = usePayLinkCheckout(token, checkoutId, cancelled ? cancelledUntil : window_.until);
  const link = usePayLink(token);
  const again = useStartPayLinkCheckout();
  const [leaving, setLeaving] = useState(false);
  const state = checkout.data;

  const paid = state?.status === 'paid';
  useEffect(() => {
    if (paid) void queryClient.invalidateQueries({ queryKey: payLinkQueryOptions(token).queryKey });
  }, [paid, token, queryClient]);

  // The link itself has ended (and nothing is known of the payment): say so, with the way on.
  if (!state && checkout.isError && isDeadLink(checkout.error)) return <PayLinkProblem error={checkout.error} />;

  const tryAgain = (s: CheckoutState) => again.mutate({ token, body: { amountCents: s.amountCents } }, { onSuccess: ({ url }) => setLeaving(goToPaymentPage(url)) });

  return (
    <PortalLayout title={outcomeTitle(state, cancelled, window_.timedOut, checkout.error)} company={link.data?.company ?? null}>
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
        receiptHref={(documentId) => payLinkDocumentUrl(token, documentId)}
        back={<TextLink to={paths.pay.link.getHref(token)}>← Back to the invoice</TextLink>}
        onTryAgain={tryAgain}
        tryingAgain={again.isPending || leaving}
        tryAgainError={again.error}
      />
    </PortalLayout>
  );
}
