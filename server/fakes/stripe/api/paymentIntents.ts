import { Router, type Response } from 'express';
import { checkChargeAmount } from '../amounts';
import { invalidRequest, noSuch, Params } from '../params';
import type { Payments } from '../payments';
import type { FakePaymentIntent, PaymentMethodRecord } from '../store';
import { expand, expandPaths, paginate } from './lists';
import { requestInfo } from './middleware';

const CREATE_PARAMS = [
  'amount', 'currency', 'metadata', 'description', 'receipt_email', 'confirm', 'payment_method', 'return_url',
  'payment_method_types', 'automatic_payment_methods', 'capture_method', 'expand',
];

const CONFIRMABLE = ['requires_payment_method', 'requires_confirmation', 'requires_action'];

/**
 * Payment intents made through the API (the checkout page makes its own). Confirming takes a
 * test payment method id (`pm_card_visa`, `pm_card_visa_chargeDeclined` ...); a decline is the
 * real 402 card error, a card that asks for authentication leaves the intent in requires_action
 * with a `redirect_to_url` to the fake's authentication page.
 */
export function paymentIntentsRouter(payments: Payments): Router {
  const router = Router();
  const store = payments.store;
  const load = (id: string) => {
    const pi = store.paymentIntents.get(id);
    if (!pi) throw noSuch('payment_intent', id);
    return pi;
  };
  const paymentMethod = (p: Params): PaymentMethodRecord | undefined => {
    const id = p.string('payment_method');
    if (id === undefined) return undefined;
    const pm = payments.testPaymentMethod(id);
    if (!pm) throw noSuch('PaymentMethod', id, 'payment_method');
    return pm;
  };
  const confirm = (pi: FakePaymentIntent, pm: PaymentMethodRecord | undefined, returnUrl: string | undefined, res: Response) => {
    if (payments.sessionIdOf(pi)) {
      throw invalidRequest('This PaymentIntent belongs to a Checkout Session; the payer confirms it on the payment page.', {
        code: 'payment_intent_unexpected_state',
      });
    }
    if (!CONFIRMABLE.includes(pi.status)) {
      throw invalidRequest(
        `This PaymentIntent's status is ${pi.status}, but it must be one of requires_payment_method, requires_confirmation, or requires_action to be confirmed.`,
        { code: 'payment_intent_unexpected_state' },
      );
    }
    const method = pm ?? (typeof pi.payment_method === 'string' ? store.paymentMethods.get(pi.payment_method) : undefined);
    if (!method) {
      throw invalidRequest(
        "You cannot confirm this PaymentIntent because it's missing a payment method. Update the PaymentIntent with a payment method and then confirm it again.",
        { code: 'payment_intent_unexpected_state' },
      );
    }
    payments.confirmIntent(pi, method, returnUrl ?? null, requestInfo(res));
  };

  router.post('/payment_intents', (req, res) => {
    const p = Params.of(req.body).only(CREATE_PARAMS);
    const amount = p.integer('amount', { required: true, min: 1 });
    const currency = p.string('currency', { required: true }).toLowerCase();
    if (!/^[a-z]{3}$/.test(currency)) throw invalidRequest(`Invalid currency: ${currency}`, { param: 'currency' });
    checkChargeAmount(amount, currency, { param: 'amount', session: false });
    if (p.stringList('payment_method_types').some((m) => m !== 'card')) {
      throw invalidRequest('The local card fake takes cards only: payment_method_types may hold "card" only.', {
        param: 'payment_method_types',
      });
    }
    p.object('automatic_payment_methods')?.only(['enabled', 'allow_redirects']).boolean('enabled');
    const capture = p.enum('capture_method', ['automatic', 'automatic_async', 'manual'] as const);
    if (capture === 'manual') throw invalidRequest('The local card fake captures automatically only.', { param: 'capture_method' });
    const pm = paymentMethod(p);
    const returnUrl = p.url('return_url');
    const pi = payments.newPaymentIntent({
      amount,
      currency,
      metadata: p.metadata() ?? {},
      description: p.string('description', { max: 1000 }) ?? null,
      receipt_email: p.email('receipt_email') ?? null,
    });
    if (capture) pi.capture_method = capture;
    if (pm) {
      pi.payment_method = pm.id;
      pi.status = 'requires_confirmation';
    }
    if (p.boolean('confirm')) confirm(pi, pm, returnUrl, res);
    res.json(expand(pi, expandPaths(p), store));
  });

  router.get('/payment_intents', (req, res) => {
    const p = Params.of(req.query).only(['limit', 'starting_after', 'ending_before', 'expand']);
    res.json(expand(paginate([...store.paymentIntents.values()], p, '/v1/payment_intents', 'payment_intent'), expandPaths(p), store));
  });

  router.get('/payment_intents/:id', (req, res) => {
    const p = Params.of(req.query).only(['expand', 'client_secret']);
    res.json(expand(load(req.params.id), expandPaths(p), store));
  });

  router.post('/payment_intents/:id/confirm', (req, res) => {
    const p = Params.of(req.body).only(['payment_method', 'return_url', 'expand']);
    const pi = load(req.params.id);
    confirm(pi, paymentMethod(p), p.url('return_url'), res);
    res.json(expand(pi, expandPaths(p), store));
  });

  router.post('/payment_intents/:id/cancel', (req, res) => {
    const p = Params.of(req.body).only(['cancellation_reason', 'expand']);
    const reason = p.enum('cancellation_reason', ['duplicate', 'fraudulent', 'requested_by_customer', 'abandoned'] as const);
    const pi = load(req.params.id);
    if (payments.sessionIdOf(pi)) {
      throw invalidRequest('This PaymentIntent belongs to a Checkout Session; expire the session instead.', {
        code: 'payment_intent_unexpected_state',
      });
    }
    if (pi.status === 'succeeded' || pi.status === 'canceled') {
      throw invalidRequest(
        `You cannot cancel this PaymentIntent because it has a status of ${pi.status}. Only a PaymentIntent with one of the following statuses may be canceled: requires_payment_method, requires_capture, requires_confirmation, requires_action, processing.`,
        { code: 'payment_intent_unexpected_state' },
      );
    }
    payments.cancelIntent(pi, reason ?? null, requestInfo(res));
    res.json(expand(pi, expandPaths(p), store));
  });

  return router;
}
