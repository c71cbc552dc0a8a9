import { randomBytes } from 'node:crypto';
import type Stripe from 'stripe';

/*
 * The fake's objects. Each type picks its fields from the SDK's own type, so a misspelt or
 * mistyped field fails the type check instead of surprising the app at run time. Only the fields
 * the fake fills are picked; the rest of the real objects are simply absent.
 */

export type FakeSession = Pick<
  Stripe.Checkout.Session,
  | 'id' | 'object' | 'after_expiration' | 'allow_promotion_codes' | 'amount_subtotal' | 'amount_total'
  | 'automatic_tax' | 'billing_address_collection' | 'cancel_url' | 'client_reference_id' | 'client_secret'
  | 'created' | 'currency' | 'customer' | 'customer_creation' | 'customer_details' | 'customer_email'
  | 'expires_at' | 'invoice' | 'livemode' | 'locale' | 'metadata' | 'mode' | 'payment_intent' | 'payment_link'
  | 'payment_method_collection' | 'payment_method_types' | 'payment_status' | 'recovered_from' | 'setup_intent'
  | 'status' | 'submit_type' | 'subscription' | 'success_url' | 'total_details' | 'ui_mode' | 'url'
>;

export type FakePrice = Pick<
  Stripe.Price,
  | 'id' | 'object' | 'active' | 'billing_scheme' | 'created' | 'currency' | 'custom_unit_amount' | 'livemode'
  | 'lookup_key' | 'metadata' | 'nickname' | 'product' | 'recurring' | 'tax_behavior' | 'tiers_mode'
  | 'transform_quantity' | 'type' | 'unit_amount'
>;

export type FakeLineItem = Pick<
  Stripe.LineItem,
  | 'id' | 'object' | 'amount_discount' | 'amount_subtotal' | 'amount_tax' | 'amount_total' | 'currency'
  | 'description' | 'metadata' | 'quantity'
> & { price: FakePrice };

export type FakePaymentIntent = Pick<
  Stripe.PaymentIntent,
  | 'id' | 'object' | 'amount' | 'amount_capturable' | 'amount_received' | 'application' | 'application_fee_amount'
  | 'automatic_payment_methods' | 'canceled_at' | 'cancellation_reason' | 'capture_method' | 'client_secret'
  | 'confirmation_method' | 'created' | 'currency' | 'customer' | 'description' | 'last_payment_error'
  | 'latest_charge' | 'livemode' | 'metadata' | 'next_action' | 'on_behalf_of' | 'payment_method'
  | 'payment_method_types' | 'processing' | 'receipt_email' | 'review' | 'setup_future_usage' | 'shipping'
  | 'source' | 'statement_descriptor' | 'statement_descriptor_suffix' | 'status' | 'transfer_group'
>;

export type FakeCardDetails = Pick<
  Stripe.Charge.PaymentMethodDetails.Card,
  'brand' | 'country' | 'exp_month' | 'exp_year' | 'funding' | 'last4' | 'network'
>;

export type FakeCharge = Pick<
  Stripe.Charge,
  | 'id' | 'object' | 'amount' | 'amount_captured' | 'amount_refunded' | 'application' | 'application_fee'
  | 'application_fee_amount' | 'balance_transaction' | 'billing_details' | 'calculated_statement_descriptor'
  | 'captured' | 'created' | 'currency' | 'customer' | 'description' | 'disputed' | 'failure_balance_transaction'
  | 'failure_code' | 'failure_message' | 'livemode' | 'metadata' | 'on_behalf_of' | 'outcome' | 'paid'
  | 'payment_intent' | 'payment_method' | 'receipt_email' | 'receipt_number' | 'receipt_url' | 'refunded'
  | 'review' | 'shipping' | 'source_transfer' | 'statement_descriptor' | 'statement_descriptor_suffix'
  | 'status' | 'transfer_data' | 'transfer_group'
> & { payment_method_details: { type: 'card'; card: FakeCardDetails } };

export type FakeRefund = Pick<
  Stripe.Refund,
  | 'id' | 'object' | 'amount' | 'balance_transaction' | 'charge' | 'created' | 'currency' | 'customer'
  | 'metadata' | 'payment_intent' | 'payment_method' | 'reason' | 'receipt_number' | 'source_transfer_reversal'
  | 'status' | 'transfer_reversal' | 'failure_reason'
>;

export type FakeBalanceTransaction = Pick<
  Stripe.BalanceTransaction,
  | 'id' | 'object' | 'amount' | 'available_on' | 'balance_type' | 'created' | 'currency' | 'description'
  | 'exchange_rate' | 'fee' | 'fee_details' | 'net' | 'reporting_category' | 'source' | 'status' | 'type'
>;

export type FakeObject = FakeSession | FakePaymentIntent | FakeCharge | FakeRefund | FakeBalanceTransaction;

export type FakeEvent = Pick<
  Stripe.EventBase,
  'id' | 'object' | 'api_version' | 'created' | 'livemode' | 'pending_webhooks' | 'request' | 'type'
> & { data: { object: FakeObject; previous_attributes?: Record<string, unknown> } };

/** What the fake keeps beside a session that the API never shows. */
export interface SessionRecord {
  session: FakeSession;
  lineItems: FakeLineItem[];
  paymentIntentData: { metadata: Record<string, string>; description: string | null; receipt_email: string | null };
}

/** Which test card a payment method id stands for, so refunds can follow the card's behaviour. */
export interface PaymentMethodRecord {
  id: string;
  cardNumber: string;
  details: FakeCardDetails;
}

const ALPHABET = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz';

/** Random letters and digits, the shape of the real ids' tails. */
export function randomToken(length: number): string {
  const bytes = randomBytes(length);
  let out = '';
  for (let i = 0; i < length; i++) out += ALPHABET[bytes[i] % ALPHABET.length];
  return out;
}

export const newId = {
  session: () => `cs_test_${randomToken(58)}`,
  paymentIntent: () => `pi_${randomToken(24)}`,
  charge: () => `ch_${randomToken(24)}`,
  refund: () => `re_${randomToken(24)}`,
  event: () => `evt_${randomToken(24)}`,
  paymentMethod: () => `pm_${randomToken(24)}`,
  balanceTransaction: () => `txn_${randomToken(24)}`,
  lineItem: () => `li_${randomToken(24)}`,
  price: () => `price_${randomToken(24)}`,
  product: () => `prod_${randomToken(14)}`,
  request: () => `req_${randomToken(14)}`,
  delivery: () => `wd_${randomToken(20)}`,
};

export function unixNow(): number {
  return Math.floor(Date.now() / 1000);
}

/** Everything the fake holds, in memory. Maps keep insertion order, which is creation order. */
export class CardFakeStore {
  sessions = new Map<string, SessionRecord>();
  paymentIntents = new Map<string, FakePaymentIntent>();
  charges = new Map<string, FakeCharge>();
  refunds = new Map<string, FakeRefund>();
  events = new Map<string, FakeEvent>();
  paymentMethods = new Map<string, PaymentMethodRecord>();
  balanceTransactions = new Map<string, FakeBalanceTransaction>();
  /**
   * Checkout sessions and payment intents whose balance transactions the API refuses to show
   * (a 500, as an outage would), set through `/_fake`: lets a test see the app record a payment
   * whose fee it could not learn.
   */
  refusedFeeLookups = new Set<string>();

  reset() {
    this.sessions.clear();
    this.paymentIntents.clear();
    this.charges.clear();
    this.refunds.clear();
    this.events.clear();
    this.paymentMethods.clear();
    this.balanceTransactions.clear();
    this.refusedFeeLookups.clear();
  }

  /** Finds any API object by id, from its prefix. */
  findById(id: string): FakeObject | undefined {
    if (id.startsWith('cs_')) return this.sessions.get(id)?.session;
    if (id.startsWith('pi_')) return this.paymentIntents.get(id);
    if (id.startsWith('ch_')) return this.charges.get(id);
    if (id.startsWith('re_')) return this.refunds.get(id);
    if (id.startsWith('txn_')) return this.balanceTransactions.get(id);
    return undefined;
  }

  /** Whether the API refuses to show this balance transaction (its payment or session was marked through `/_fake`). */
  refusesFeeLookup(txnId: string): boolean {
    const bt = this.balanceTransactions.get(txnId);
    if (!bt || this.refusedFeeLookups.size === 0 || typeof bt.source !== 'string') return false;
    const owner = bt.source.startsWith('ch_') ? this.charges.get(bt.source) : this.refunds.get(bt.source);
    const pi = owner && typeof owner.payment_intent === 'string' ? owner.payment_intent : null;
    if (!pi) return false;
    if (this.refusedFeeLookups.has(pi)) return true;
    for (const { session } of this.sessions.values()) {
      if (session.payment_intent === pi && this.refusedFeeLookups.has(session.id)) return true;
    }
    return false;
  }

  /** The succeeded charge of a payment intent, if it has one. */
  succeededCharge(pi: FakePaymentIntent): FakeCharge | undefined {
    const charge = typeof pi.latest_charge === 'string' ? this.charges.get(pi.latest_charge) : undefined;
    return charge?.status === 'succeeded' ? charge : undefined;
  }
}

/** A copy safe to hand out: later changes to the stored object do not reach it. */
export function snapshot<T>(value: T): T {
  return structuredClone(value);
}
