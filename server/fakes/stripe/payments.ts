import Stripe from 'stripe';
import {
  checkCardInput,
  findTestCard,
  findTestPaymentMethod,
  LIVE_CARD_IN_TEST_MODE,
  type CardDecline,
  type CardFieldError,
  type CardInput,
} from './cards';
import { chargeBalanceTransaction } from './fees';
import { buildCharge, buildPaymentIntent, type PaymentIntentInit } from './objects';
import { ApiError, type ApiErrorBody } from './params';
import {
  newId,
  snapshot,
  unixNow,
  type CardFakeStore,
  type FakeCardDetails,
  type FakeCharge,
  type FakeEvent,
  type FakeObject,
  type FakePaymentIntent,
  type PaymentMethodRecord,
  type SessionRecord,
} from './store';
import type { WebhookDispatcher } from './webhooks';

/** The API request behind an event (null id for what the payer did on the page). */
export interface RequestInfo {
  id: string | null;
  idempotency_key: string | null;
}

const FROM_PAGE: RequestInfo = { id: null, idempotency_key: null };

/** The outcome of a payer's try, shared by the page and the `/_fake` controls. */
export type PayOutcome =
  | { outcome: 'succeeded'; redirectUrl: string }
  | { outcome: 'requires_action'; authenticateUrl: string }
  | { outcome: 'declined'; error: ApiErrorBody }
  | { outcome: 'invalid'; errors: CardFieldError[] }
  | { outcome: 'unavailable'; status: 'complete' | 'expired'; message: string }
  | { outcome: 'nothing_to_authenticate'; message: string };

type ChargeResult = 'succeeded' | 'declined' | 'requires_action';

const AUTHENTICATION_FAILURE =
  'The provided PaymentMethod has failed authentication. You can provide payment_method_data or a new ' +
  'PaymentMethod to attempt to fulfill this PaymentIntent again.';

/**
 * What happens to sessions, payment intents, charges and refunds, and the events each change
 * sends. The HTTP layers (API, page, controls) validate input and call in here.
 */
export class Payments {
  /** Which checkout session a payment intent belongs to. */
  private readonly sessionOfIntent = new Map<string, string>();
  private readonly timers = new Set<NodeJS.Timeout>();
  /** Where an API-confirmed intent sends the payer after the authentication page. */
  readonly returnUrls = new Map<string, string | null>();

  constructor(
    readonly store: CardFakeStore,
    private readonly webhooks: WebhookDispatcher,
    private readonly baseUrl: () => string,
    private readonly opts: { refundSettleDelayMs: number },
  ) {}

  emit(type: string, object: FakeObject, request: RequestInfo = FROM_PAGE, previous?: Record<string, unknown>): FakeEvent {
    const event: FakeEvent = {
      id: newId.event(),
      object: 'event',
      api_version: Stripe.API_VERSION,
      created: unixNow(),
      data: previous ? { object: snapshot(object), previous_attributes: previous } : { object: snapshot(object) },
      livemode: false,
      pending_webhooks: this.webhooks.wants(type) ? 1 : 0,
      request: { ...request },
      type: type as FakeEvent['type'],
    };
    this.store.events.set(event.id, event);
    this.webhooks.dispatch(event);
    return event;
  }

  sessionIdOf(pi: FakePaymentIntent): string | undefined {
    return this.sessionOfIntent.get(pi.id);
  }

  // ----- sessions ---------------------------------------------------------------------------

  /** Expires open sessions whose expires_at has passed, as the real service does shortly after. */
  sweepExpired(now = unixNow()) {
    for (const record of this.store.sessions.values()) {
      if (record.session.status === 'open' && record.session.expires_at <= now) this.expireSession(record, FROM_PAGE);
    }
  }

  expireSession(record: SessionRecord, request: RequestInfo) {
    const session = record.session;
    session.status = 'expired';
    session.url = null;
    const pi = typeof session.payment_intent === 'string' ? this.store.paymentIntents.get(session.payment_intent) : undefined;
    if (pi && pi.status !== 'succeeded' && pi.status !== 'canceled') {
      pi.status = 'canceled';
      pi.canceled_at = unixNow();
      pi.cancellation_reason = 'abandoned';
      pi.next_action = null;
      this.emit('payment_intent.canceled', pi, request);
    }
    this.emit('checkout.session.expired', session, request);
  }

  private unavailable(record: SessionRecord): PayOutcome | null {
    this.sweepExpired();
    const status = record.session.status;
    if (status === 'complete') return { outcome: 'unavailable', status: 'complete', message: 'This payment is already complete.' };
    if (status === 'expired') return { outcome: 'unavailable', status: 'expired', message: 'This payment page has expired.' };
    return null;
  }

  /** A payer's card on the page (or through `/_fake/sessions/:id/pay`). */
  paySession(record: SessionRecord, input: CardInput & { email?: unknown }): PayOutcome {
    const closed = this.unavailable(record);
    if (closed) return closed;
    const checked = checkCardInput(input);
    if ('errors' in checked) return { outcome: 'invalid', errors: checked.errors };

    const session = record.session;
    const email = session.customer_email ?? (typeof input.email === 'string' && input.email.trim() ? input.email.trim() : null);
    const pm = this.newPaymentMethod(checked.card.number, {
      brand: checked.card.brand,
      country: 'US',
      exp_month: checked.card.expMonth,
      exp_year: checked.card.expYear,
      funding: checked.card.card?.funding ?? 'credit',
      last4: checked.card.last4,
      network: checked.card.brand,
    });
    const pi = this.intentForSession(record);
    pi.receipt_email = pi.receipt_email ?? email;
    const result = this.charge(pi, pm, { skipAuthentication: false, request: FROM_PAGE, email });
    return this.sessionOutcome(record, pi, result, email);
  }

  private intentForSession(record: SessionRecord): FakePaymentIntent {
    const session = record.session;
    const existing = typeof session.payment_intent === 'string' ? this.store.paymentIntents.get(session.payment_intent) : undefined;
    if (existing) return existing;
    const pi = this.newPaymentIntent({
      amount: session.amount_total ?? 0,
      currency: session.currency ?? 'usd',
      metadata: { ...record.paymentIntentData.metadata },
      description: record.paymentIntentData.description,
      receipt_email: record.paymentIntentData.receipt_email,
    });
    session.payment_intent = pi.id;
    this.sessionOfIntent.set(pi.id, session.id);
    return pi;
  }

  private sessionOutcome(record: SessionRecord, pi: FakePaymentIntent, result: ChargeResult, email: string | null): PayOutcome {
    if (result === 'requires_action') {
      return { outcome: 'requires_action', authenticateUrl: pi.next_action!.redirect_to_url!.url! };
    }
    if (result === 'declined') return { outcome: 'declined', error: this.errorOf(pi) };
    const session = record.session;
    const charge = this.store.charges.get(pi.latest_charge as string)!;
    session.status = 'complete';
    session.payment_status = 'paid';
    session.url = null;
    session.customer_details = {
      address: null,
      business_name: null,
      email: email ?? charge.billing_details.email,
      individual_name: null,
      name: null,
      phone: null,
      tax_exempt: 'none',
      tax_ids: [],
    };
    this.emit('checkout.session.completed', session);
    const redirectUrl = session.success_url
      ? session.success_url.replaceAll('{CHECKOUT_SESSION_ID}', session.id)
      : `${this.baseUrl()}/pay/${session.id}`;
    return { outcome: 'succeeded', redirectUrl };
  }

  private errorOf(pi: FakePaymentIntent): ApiErrorBody {
    const e = pi.last_payment_error!;
    return {
      type: e.type as ApiErrorBody['type'],
      code: e.code,
      ...(e.decline_code ? { decline_code: e.decline_code } : {}),
      message: e.message ?? '',
      ...(e.charge ? { charge: e.charge } : {}),
    };
  }

  /** The payer's answer on the authentication page of a payment intent. */
  authenticate(pi: FakePaymentIntent, result: 'complete' | 'fail'): PayOutcome | { outcome: 'intent'; result: ChargeResult } {
    const sessionId = this.sessionOfIntent.get(pi.id);
    const record = sessionId ? this.store.sessions.get(sessionId) : undefined;
    if (record) {
      const closed = this.unavailable(record);
      if (closed) return closed;
    }
    if (pi.status !== 'requires_action' || typeof pi.payment_method !== 'string') {
      return { outcome: 'nothing_to_authenticate', message: `This payment is ${pi.status}; it is not waiting for authentication.` };
    }
    const pm = this.store.paymentMethods.get(pi.payment_method)!;
    let charged: ChargeResult;
    if (result === 'complete') {
      charged = this.charge(pi, pm, { skipAuthentication: true, request: FROM_PAGE, email: pi.receipt_email });
    } else {
      pi.status = 'requires_payment_method';
      pi.next_action = null;
      pi.payment_method = null;
      pi.last_payment_error = {
        type: 'invalid_request_error',
        code: 'payment_intent_authentication_failure',
        message: AUTHENTICATION_FAILURE,
      };
      this.emit('payment_intent.payment_failed', pi);
      charged = 'declined';
    }
    if (record) return this.sessionOutcome(record, pi, charged, record.session.customer_email ?? pi.receipt_email);
    return { outcome: 'intent', result: charged };
  }

  // ----- payment intents ----------------------------------------------------------------------

  newPaymentIntent(init: PaymentIntentInit): FakePaymentIntent {
    const pi = buildPaymentIntent(init);
    this.store.paymentIntents.set(pi.id, pi);
    return pi;
  }

  newPaymentMethod(cardNumber: string, details: FakeCardDetails): PaymentMethodRecord {
    const pm: PaymentMethodRecord = { id: newId.paymentMethod(), cardNumber, details };
    this.store.paymentMethods.set(pm.id, pm);
    return pm;
  }

  /** A test payment method id (`pm_card_visa` ...) as a card, or undefined for an unknown id. */
  testPaymentMethod(id: string): PaymentMethodRecord | undefined {
    const known = this.store.paymentMethods.get(id);
    if (known) return known;
    const card = findTestPaymentMethod(id);
    if (!card) return undefined;
    return this.newPaymentMethod(card.number, {
      brand: card.brand,
      country: 'US',
      exp_month: 12,
      exp_year: new Date().getUTCFullYear() + 3,
      funding: card.funding,
      last4: card.number.slice(-4),
      network: card.brand,
    });
  }

  /** Confirms a payment intent made through the API. Throws the real 402 card error on a decline. */
  confirmIntent(pi: FakePaymentIntent, pm: PaymentMethodRecord, returnUrl: string | null, request: RequestInfo) {
    const result = this.charge(pi, pm, { skipAuthentication: false, request, email: pi.receipt_email, returnUrl });
    if (result === 'declined') {
      const body = this.errorOf(pi);
      throw new ApiError(402, { ...body, payment_intent: snapshot(pi) });
    }
  }

  cancelIntent(pi: FakePaymentIntent, reason: FakePaymentIntent['cancellation_reason'], request: RequestInfo) {
    pi.status = 'canceled';
    pi.canceled_at = unixNow();
    pi.cancellation_reason = reason ?? null;
    pi.next_action = null;
    this.emit('payment_intent.canceled', pi, request);
  }

  /**
   * One try at charging a card: asks for authentication first when the card wants it, then
   * either a succeeded or a failed charge, with the payment intent and its event to match.
   */
  private charge(
    pi: FakePaymentIntent,
    pm: PaymentMethodRecord,
    o: { skipAuthentication: boolean; request: RequestInfo; email: string | null; returnUrl?: string | null },
  ): ChargeResult {
    const card = findTestCard(pm.cardNumber);
    pi.payment_method = pm.id;
    if (card?.authentication && !o.skipAuthentication) {
      pi.status = 'requires_action';
      pi.last_payment_error = null;
      pi.next_action = {
        type: 'redirect_to_url',
        redirect_to_url: { url: `${this.baseUrl()}/authenticate/${pi.id}`, return_url: o.returnUrl ?? null },
      };
      this.returnUrls.set(pi.id, o.returnUrl ?? null);
      return 'requires_action';
    }
    const decline = card ? card.decline : LIVE_CARD_IN_TEST_MODE;
    const charge = this.newCharge(pi, pm, o.email, decline ?? null);
    pi.latest_charge = charge.id;
    pi.next_action = null;
    if (decline) {
      pi.status = 'requires_payment_method';
      pi.payment_method = null;
      pi.last_payment_error = {
        type: 'card_error',
        code: decline.code as NonNullable<FakePaymentIntent['last_payment_error']>['code'],
        ...(decline.decline_code ? { decline_code: decline.decline_code } : {}),
        message: decline.message,
        charge: charge.id,
      };
      this.emit('payment_intent.payment_failed', pi, o.request);
      return 'declined';
    }
    pi.status = 'succeeded';
    pi.amount_received = pi.amount;
    pi.last_payment_error = null;
    this.emit('payment_intent.succeeded', pi, o.request);
    return 'succeeded';
  }

  private newCharge(pi: FakePaymentIntent, pm: PaymentMethodRecord, email: string | null, decline: CardDecline | null): FakeCharge {
    const charge = buildCharge(pi, pm, email, decline, this.baseUrl());
    this.store.charges.set(charge.id, charge);
    if (!decline) {
      const txn = chargeBalanceTransaction(charge);
      this.store.balanceTransactions.set(txn.id, txn);
    }
    return charge;
  }

  // ----- timers -------------------------------------------------------------------------------

  /** Runs fn later (refunds that settle or fail after a while); cancelled by close(). */
  later(fn: () => void) {
    const timer = setTimeout(() => {
      this.timers.delete(timer);
      fn();
    }, this.opts.refundSettleDelayMs);
    this.timers.add(timer);
  }

  close() {
    for (const t of this.timers) clearTimeout(t);
    this.timers.clear();
  }

  reset() {
    this.close();
    this.sessionOfIntent.clear();
    this.returnUrls.clear();
  }
}
