/**
 * The money side of a charge or refund: its balance transaction (`txn_...`), with the
 * processor's fee. The fee rule is the fake's own choice, not the processor's contract: the
 * standard card rate, 2.9% + 30¢ per successful charge, rounded to the cent (Stripe pricing page,
 * standard card rate, from memory). Every currency gets the same rule here.
 */
import { newId, unixNow, type FakeBalanceTransaction, type FakeCharge, type FakeRefund } from './store';

/** 2.9% of the amount, rounded half up to the cent, plus 30 cents (see the comment above). */
export function cardFee(amount: number): number {
  return Math.round((amount * 29) / 1000) + 30;
}

// Money from a card charge becomes available to pay out two days later on the standard US
// schedule (Stripe payouts documentation, from memory); the fake uses that for `available_on`.
const AVAILABLE_AFTER_S = 2 * 24 * 3600;

function balanceTransaction(
  id: string,
  o: { amount: number; fee: number; currency: string; description: string | null; source: string; type: 'charge' | 'refund' },
): FakeBalanceTransaction {
  const created = unixNow();
  return {
    id,
    object: 'balance_transaction',
    amount: o.amount,
    available_on: created + AVAILABLE_AFTER_S,
    balance_type: 'payments',
    created,
    currency: o.currency,
    description: o.description,
    exchange_rate: null,
    fee: o.fee,
    fee_details: o.fee ? [{ amount: o.fee, application: null, currency: o.currency, description: 'Stripe processing fees', type: 'stripe_fee' }] : [],
    net: o.amount - o.fee,
    reporting_category: o.type,
    source: o.source,
    status: 'pending',
    type: o.type,
  };
}

/** The balance transaction of a succeeded charge: the amount, less the fee. Its id is the charge's `balance_transaction`. */
export function chargeBalanceTransaction(charge: FakeCharge): FakeBalanceTransaction {
  const id = typeof charge.balance_transaction === 'string' ? charge.balance_transaction : newId.balanceTransaction();
  return balanceTransaction(id, {
    amount: charge.amount_captured,
    fee: cardFee(charge.amount_captured),
    currency: charge.currency,
    description: charge.description,
    source: charge.id,
    type: 'charge',
  });
}

/**
 * The balance transaction of a refund: the amount goes out again. In the US the processor keeps
 * the original charge's fee when a payment is refunded (Stripe pricing and refunds documentation,
 * from memory), so the refund carries no fee of its own and gives none back: fee 0.
 */
export function refundBalanceTransaction(refund: FakeRefund): FakeBalanceTransaction {
  return balanceTransaction(typeof refund.balance_transaction === 'string' ? refund.balance_transaction : newId.balanceTransaction(), {
    amount: -refund.amount,
    fee: 0,
    currency: refund.currency,
    description: 'REFUND FOR CHARGE',
    source: refund.id,
    type: 'refund',
  });
}
