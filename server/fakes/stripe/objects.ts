/** New payment intents and charges, with every field the fake fills. */
import type { CardDecline } from './cards';
import { newId, randomToken, unixNow, type FakeCharge, type FakePaymentIntent, type PaymentMethodRecord } from './store';

export interface PaymentIntentInit {
  amount: number;
  currency: string;
  metadata: Record<string, string>;
  description: string | null;
  receipt_email: string | null;
}

export function buildPaymentIntent(init: PaymentIntentInit): FakePaymentIntent {
  const id = newId.paymentIntent();
  const pi: FakePaymentIntent = {
    id,
    object: 'payment_intent',
    amount: init.amount,
    amount_capturable: 0,
    amount_received: 0,
    application: null,
    application_fee_amount: null,
    automatic_payment_methods: null,
    canceled_at: null,
    cancellation_reason: null,
    capture_method: 'automatic_async',
    client_secret: `${id}_secret_${randomToken(25)}`,
    confirmation_method: 'automatic',
    created: unixNow(),
    currency: init.currency,
    customer: null,
    description: init.description,
    last_payment_error: null,
    latest_charge: null,
    livemode: false,
    metadata: init.metadata,
    next_action: null,
    on_behalf_of: null,
    payment_method: null,
    payment_method_types: ['card'],
    processing: null,
    receipt_email: init.receipt_email,
    review: null,
    setup_future_usage: null,
    shipping: null,
    source: null,
    statement_descriptor: null,
    statement_descriptor_suffix: null,
    status: 'requires_payment_method',
    transfer_group: null,
  };
  return pi;
}

/** A charge on a card: succeeded, or failed with the issuer's decline. */
export function buildCharge(
  pi: FakePaymentIntent,
  pm: PaymentMethodRecord,
  email: string | null,
  decline: CardDecline | null,
  baseUrl: string,
): FakeCharge {
  const id = newId.charge();
  const charge: FakeCharge = {
    id,
    object: 'charge',
    amount: pi.amount,
    amount_captured: decline ? 0 : pi.amount,
    amount_refunded: 0,
    application: null,
    application_fee: null,
    application_fee_amount: null,
    balance_transaction: decline ? null : newId.balanceTransaction(),
    billing_details: { address: null, email, name: null, phone: null, tax_id: null },
    calculated_statement_descriptor: 'GUYLINE TEST',
    captured: !decline,
    created: unixNow(),
    currency: pi.currency,
    customer: null,
    description: pi.description,
    disputed: false,
    failure_balance_transaction: null,
    failure_code: decline?.code ?? null,
    failure_message: decline?.message ?? null,
    livemode: false,
    metadata: { ...pi.metadata },
    on_behalf_of: null,
    outcome: decline
      ? {
          advice_code: null,
          network_advice_code: null,
          network_decline_code: null,
          network_status: 'declined_by_network',
          reason: decline.decline_code ?? decline.code,
          risk_level: 'normal',
          seller_message: 'The bank did not return any further details with this decline.',
          type: 'issuer_declined',
        }
      : {
          advice_code: null,
          network_advice_code: null,
          network_decline_code: null,
          network_status: 'approved_by_network',
          reason: null,
          risk_level: 'normal',
          seller_message: 'Payment complete.',
          type: 'authorized',
        },
    paid: !decline,
    payment_intent: pi.id,
    payment_method: pm.id,
    payment_method_details: { type: 'card', card: { ...pm.details } },
    receipt_email: email,
    receipt_number: null,
    receipt_url: `${baseUrl}/receipts/${id}`,
    refunded: false,
    review: null,
    shipping: null,
    source_transfer: null,
    statement_descriptor: null,
    statement_descriptor_suffix: null,
    status: decline ? 'failed' : 'succeeded',
    transfer_data: null,
    transfer_group: null,
  };
  return charge;
}
