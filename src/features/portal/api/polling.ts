import type { CheckoutState } from '@shared/schemas/portal';

/** How often the return page asks whether the card payment is confirmed. */
export const CONFIRM_POLL_MS = 1_000;
/** How long it keeps asking before it says the confirmation is slow (the payment may still land). */
export const CONFIRM_WAIT_MS = 60_000;

/** Still waiting: for the confirmation, or (once paid) for the receipt to be made. */
export const awaitingMore = (state: CheckoutState | undefined) => !state || state.status === 'open' || (state.status === 'paid' && !state.receiptDocumentId);

export const keepPolling = (state: CheckoutState | undefined, until: number) => awaitingMore(state) && Date.now() < until;
