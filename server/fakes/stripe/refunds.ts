import { formatAmount } from './amounts';
import { findTestCard } from './cards';
import { refundBalanceTransaction } from './fees';
import { invalidRequest, noSuch } from './params';
import type { Payments, RequestInfo } from './payments';
import { newId, unixNow, type FakeCharge, type FakeRefund } from './store';


export interface RefundRequest {
  paymentIntentId?: string;
  chargeId?: string;
  amount?: number;
  reason?: FakeRefund['reason'];
  metadata: Record<string, string>;
}

/**
 * Refunds never take back more than the charge has left. A refund of a card that the testing
 * documentation marks as refunding asynchronously settles or fails a little later, with the
 * events the real service sends.
 */
export function createRefund(payments: Payments, req: RefundRequest, request: RequestInfo): FakeRefund {
  const { store } = payments;
  if (req.paymentIntentId && req.chargeId) {
    throw invalidRequest('You cannot specify both charge and payment_intent; pass one of them.', { param: 'charge' });
  }
  let charge: FakeCharge | undefined;
  if (req.paymentIntentId) {
    const pi = store.paymentIntents.get(req.paymentIntentId);
    if (!pi) throw noSuch('payment_intent', req.paymentIntentId, 'payment_intent');
    charge = store.succeededCharge(pi);
    if (!charge) {
      throw invalidRequest(`This PaymentIntent (${pi.id}) does not have a successful charge to refund.`, {
        param: 'payment_intent',
      });
    }
  } else if (req.chargeId) {
    charge = store.charges.get(req.chargeId);
    if (!charge) throw noSuch('charge', req.chargeId, 'charge');
    if (charge.status !== 'succeeded') {
      throw invalidRequest(`Charge ${charge.id} did not succeed, so there is nothing to refund.`, { param: 'charge' });
    }
  } else {
    throw invalidRequest('One of the following params should be provided for this request: payment_intent or charge.', {
      code: 'parameter_missing',
      param: 'payment_intent',
    });
  }

  const remaining = charge.amount - charge.amount_refunded;
  if (remaining <= 0) {
    throw invalidRequest(`Charge ${charge.id} has already been refunded.`, { code: 'charge_already_refunded', param: 'charge' });
  }
  const amount = req.amount ?? remaining;
  if (amount > remaining) {
    throw invalidRequest(
      `Refund amount (${formatAmount(amount, charge.currency)}) is greater than unrefunded amount on charge (${formatAmount(remaining, charge.currency)})`,
      { param: 'amount' },
    );
  }

  const pm = typeof charge.payment_method === 'string' ? store.paymentMethods.get(charge.payment_method) : undefined;
  const behaviour = pm ? findTestCard(pm.cardNumber)?.refund : undefined;
  const refund: FakeRefund = {
    id: newId.refund(),
    object: 'refund',
    amount,
    balance_transaction: newId.balanceTransaction(),
    charge: charge.id,
    created: unixNow(),
    currency: charge.currency,
    customer: null,
    metadata: req.metadata,
    payment_intent: typeof charge.payment_intent === 'string' ? charge.payment_intent : null,
    payment_method: pm?.id ?? null,
    reason: req.reason ?? null,
    receipt_number: null,
    source_transfer_reversal: null,
    status: behaviour === 'pending_then_succeeds' ? 'pending' : 'succeeded',
    transfer_reversal: null,
  };
  store.refunds.set(refund.id, refund);
  const txn = refundBalanceTransaction(refund);
  store.balanceTransactions.set(txn.id, txn);

  const previous = { amount_refunded: charge.amount_refunded, refunded: charge.refunded };
  charge.amount_refunded += amount;
  charge.refunded = charge.amount_refunded === charge.amount;
  payments.emit('refund.created', refund, request);
  payments.emit('charge.refunded', charge, request, previous);

  if (behaviour === 'fails_later') payments.later(() => failRefund(payments, refund, 'expired_or_canceled_card'));
  if (behaviour === 'pending_then_succeeds') payments.later(() => settleRefund(payments, refund));
  return refund;
}

/** The refund did not reach the payer: the money is refundable again. */
export function failRefund(payments: Payments, refund: FakeRefund, failureReason: string) {
  if (refund.status !== 'succeeded' && refund.status !== 'pending') return;
  const charge = payments.store.charges.get(refund.charge as string);
  const previous = { status: refund.status };
  refund.status = 'failed';
  refund.failure_reason = failureReason;
  if (charge) {
    charge.amount_refunded -= refund.amount;
    charge.refunded = false;
  }
  payments.emit('refund.updated', refund, { id: null, idempotency_key: null }, previous);
  payments.emit('refund.failed', refund);
}

export function settleRefund(payments: Payments, refund: FakeRefund) {
  if (refund.status !== 'pending') return;
  refund.status = 'succeeded';
  payments.emit('refund.updated', refund, { id: null, idempotency_key: null }, { status: 'pending' });
}
