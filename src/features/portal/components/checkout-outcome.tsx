import { useEffect, useRef, type ReactNode } from 'react';
import type { CheckoutState } from '@shared/schemas/portal';
import { Alert, FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Spinner } from '@/components/ui/spinner';
import { errorMessage } from '@/lib/api';
import { DocumentLink } from './document-link';
import { money } from './labels';

interface CheckoutOutcomeProps {
  state: CheckoutState | undefined;
  /** The first answer has not come yet. */
  loading: boolean;
  loadError: unknown;
  /** Came back through the payment page's Cancel. */
  cancelled: boolean;
  /** Still `open` after the wait: the confirmation is slow. */
  timedOut: boolean;
  onCheckAgain: () => void;
  receiptHref: (documentId: string) => string;
  /** The way back: the booking, or the pay link's page. */
  back: ReactNode;
  /** Starts a new card payment of the same amount. */
  onTryAgain: (state: CheckoutState) => void;
  tryingAgain: boolean;
  tryAgainError: unknown;
}

/** The heading of the outcome, for the page's h1 (the route puts it in the layout). */
export function outcomeTitle(state: CheckoutState | undefined, cancelled: boolean, timedOut: boolean, loadError: unknown): string {
  if (state?.status === 'paid') return 'Paid — thank you';
  if (cancelled) return 'Payment cancelled';
  if (state?.status === 'failed') return 'The payment didn’t go through';
  if (state?.status === 'expired') return 'The payment page timed out';
  if (loadError && !state) return 'We couldn’t check your payment';
  if (timedOut) return 'Still confirming your payment';
  return 'Confirming your payment…';
}

/**
 * What became of a card payment, after the secure payment page sends the customer back: a
 * progress state while the confirmation is on its way, then paid (with the receipt), failed
 * (why, in plain words, and Try again), timed out, or cancelled.
 */
export function CheckoutOutcome(props: CheckoutOutcomeProps) {
  const { state, loading, loadError, cancelled, timedOut, back } = props;
  const status = state?.status;
  const announce = useRef<HTMLDivElement>(null);

  // The outcome is news: once it is known, focus goes to it so a screen reader reads it out.
  const settled = status === 'paid' || status === 'failed' || status === 'expired';
  useEffect(() => {
    if (settled) announce.current?.focus();
  }, [settled]);

  const tryAgain = state ? (
    <div className="space-y-2">
      <FormMessage message={props.tryAgainError ? errorMessage(props.tryAgainError) : null} />
      <Button isLoading={props.tryingAgain} onClick={() => props.onTryAgain(state)} className="w-full sm:w-auto">
        Try again
      </Button>
    </div>
  ) : null;

  let body: ReactNode;
  if (status === 'paid' && state) {
    body = (
      <>
        <p className="text-canvas-800">
          We received <strong className="tabular-nums">{money(state.amountCents, state.currency)}</strong> for invoice {state.invoiceNumber}. A receipt is on its
          way to you by e-mail.
        </p>
        {state.receiptDocumentId ? (
          <DocumentLink className="mt-4" href={props.receiptHref(state.receiptDocumentId)} label="Download your receipt (PDF)" />
        ) : (
          <p className="mt-3 text-sm text-canvas-600" role="status">
            {timedOut ? 'Your receipt will be ready to download on your booking shortly.' : (
              <Spinner label="Preparing your receipt…" />
            )}
          </p>
        )}
      </>
    );
  } else if (cancelled && status !== 'failed') {
    body = <p className="text-canvas-800">Nothing was charged. You can pay whenever suits you.</p>;
  } else if (status === 'failed' && state) {
    body = (
      <>
        {cancelled ? <p className="text-canvas-800">Nothing was charged.</p> : null}
        <Alert tone={cancelled ? 'warning' : 'danger'} className={cancelled ? 'mt-3' : undefined} title={cancelled ? 'Why the card was refused' : undefined}>
          {state.message ?? 'The card was refused and nothing was charged. Try again with another card, or contact your bank.'}
        </Alert>
        <p className="mt-3 text-canvas-800">
          The invoice {state.invoiceNumber} is still open: {money(state.amountCents, state.currency)} to pay. You can try again, with this card or another one.
        </p>
        <div className="mt-4">{tryAgain}</div>
      </>
    );
  } else if (status === 'expired' && state) {
    body = (
      <>
        <p className="text-canvas-800">The secure payment page closed before a payment was made, so nothing was charged. Start again whenever you are ready.</p>
        <div className="mt-4">{tryAgain}</div>
      </>
    );
  } else if (loadError && !state) {
    body = (
      <Alert tone="danger">
        <p>{errorMessage(loadError)}</p>
        <p className="mt-1">If you finished paying, your receipt will come by e-mail; you can also check your booking.</p>
        <Button variant="secondary" size="sm" className="mt-3" onClick={props.onCheckAgain}>
          Check again
        </Button>
      </Alert>
    );
  } else if (timedOut) {
    body = (
      <>
        <p className="text-canvas-800">
          The confirmation is taking longer than usual. If you completed the payment, it will show on your booking shortly and your receipt will come by e-mail.
          Please don’t pay a second time in the meantime.
        </p>
        <Button variant="secondary" className="mt-4 w-full sm:w-auto" onClick={props.onCheckAgain}>
          Check again
        </Button>
      </>
    );
  } else {
    body = (
      <div role="status" className="flex flex-col items-start gap-3">
        <Spinner label="Waiting for the confirmation from the card payment service. This usually takes a few seconds." className="text-canvas-800" />
        <progress className="h-2 w-full accent-pine-700" aria-label="Confirming your payment" />
        <p className="text-sm text-canvas-600">Please keep this page open.</p>
      </div>
    );
  }

  return (
    <Card>
      <div ref={announce} tabIndex={-1} className="focus:outline-none" aria-busy={loading || undefined}>
        {body}
      </div>
      <div className="mt-6 border-t border-canvas-200 pt-4 text-sm">{back}</div>
    </Card>
  );
}
