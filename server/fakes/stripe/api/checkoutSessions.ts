import { Router } from 'express';
import { multiply, sum } from '../../../../shared/money';
import { checkChargeAmount } from '../amounts';
import { invalidRequest, noSuch, Params } from '../params';
import type { Payments } from '../payments';
import { newId, unixNow, type FakeLineItem, type FakeSession, type SessionRecord } from '../store';
import { expand, expandPaths, paginate } from './lists';
import { requestInfo } from './middleware';

const CREATE_PARAMS = [
  'mode', 'line_items', 'success_url', 'cancel_url', 'customer_email', 'client_reference_id', 'metadata',
  'payment_intent_data', 'expires_at', 'payment_method_types', 'locale', 'submit_type', 'expand',
];

// Stripe API reference, Checkout Session `expires_at`: 30 minutes to 24 hours after creation.
const MIN_LIFETIME_S = 30 * 60;
const MAX_LIFETIME_S = 24 * 60 * 60;

function readLineItems(p: Params, created: number): FakeLineItem[] {
  const items = p.objectList('line_items');
  if (items.length === 0) {
    throw invalidRequest('You must provide at least one line item in payment mode.', {
      code: 'parameter_missing',
      param: 'line_items',
    });
  }
  return items.map((item) => {
    item.only(['price_data', 'quantity', 'price']);
    if (item.has('price')) {
      throw invalidRequest('The local card fake takes price_data only; saved prices are not implemented.', {
        param: item.name('price'),
      });
    }
    const priceData = item.object('price_data', { required: true }).only(['currency', 'unit_amount', 'product_data', 'tax_behavior']);
    const quantity = item.integer('quantity', { required: true, min: 1, max: 999_999 });
    const currency = priceData.string('currency', { required: true }).toLowerCase();
    if (!/^[a-z]{3}$/.test(currency)) throw invalidRequest(`Invalid currency: ${currency}`, { param: priceData.name('currency') });
    const unitAmount = priceData.integer('unit_amount', { required: true, min: 0 });
    const tax = priceData.enum('tax_behavior', ['exclusive', 'inclusive', 'unspecified'] as const) ?? 'unspecified';
    const product = priceData.object('product_data', { required: true }).only(['name', 'description', 'images', 'metadata', 'tax_code']);
    const name = product.string('name', { required: true, max: 250 });
    product.string('description', { max: 40_000 });
    product.stringList('images');
    product.metadata();
    product.string('tax_code');
    const total = multiply(unitAmount, quantity);
    return {
      id: newId.lineItem(),
      object: 'item',
      amount_discount: 0,
      amount_subtotal: total,
      amount_tax: 0,
      amount_total: total,
      currency,
      description: name,
      metadata: {},
      quantity,
      price: {
        id: newId.price(),
        object: 'price',
        active: false,
        billing_scheme: 'per_unit',
        created,
        currency,
        custom_unit_amount: null,
        livemode: false,
        lookup_key: null,
        metadata: {},
        nickname: null,
        product: newId.product(),
        recurring: null,
        tax_behavior: tax,
        tiers_mode: null,
        transform_quantity: null,
        type: 'one_time',
        unit_amount: unitAmount,
      },
    } satisfies FakeLineItem;
  });
}

function createSession(body: unknown, payments: Payments, baseUrl: string): FakeSession {
  const p = Params.of(body).only(CREATE_PARAMS);
  const mode = p.enum('mode', ['payment', 'setup', 'subscription'] as const, { required: true });
  if (mode !== 'payment') throw invalidRequest('The local card fake implements mode=payment only.', { param: 'mode' });
  const created = unixNow();
  const lineItems = readLineItems(p, created);
  const currency = lineItems[0].currency;
  if (lineItems.some((li) => li.currency !== currency)) {
    throw invalidRequest('All line items must have the same currency.', { param: 'line_items' });
  }
  const amount = sum(lineItems.map((li) => li.amount_total));
  checkChargeAmount(amount, currency, { param: 'line_items', session: true });

  const methods = p.stringList('payment_method_types');
  if (methods.some((m) => m !== 'card')) {
    throw invalidRequest('The local card fake takes cards only: payment_method_types may hold "card" only.', {
      param: 'payment_method_types',
    });
  }
  const expiresAt = p.integer('expires_at') ?? created + MAX_LIFETIME_S;
  if (expiresAt < created + MIN_LIFETIME_S) {
    throw invalidRequest('The `expires_at` timestamp must be at least 30 minutes from Checkout Session creation.', {
      param: 'expires_at',
    });
  }
  if (expiresAt > created + MAX_LIFETIME_S) {
    throw invalidRequest('The `expires_at` timestamp must be less than 24 hours from Checkout Session creation.', {
      param: 'expires_at',
    });
  }
  const pid = p.object('payment_intent_data')?.only(['metadata', 'description', 'receipt_email']);
  const id = newId.session();
  const session: FakeSession = {
    id,
    object: 'checkout.session',
    after_expiration: null,
    allow_promotion_codes: null,
    amount_subtotal: amount,
    amount_total: amount,
    automatic_tax: { enabled: false, liability: null, provider: null, status: null },
    billing_address_collection: null,
    cancel_url: p.url('cancel_url') ?? null,
    client_reference_id: p.string('client_reference_id', { max: 200 }) ?? null,
    client_secret: null,
    created,
    currency,
    customer: null,
    customer_creation: 'if_required',
    customer_details: null,
    customer_email: p.email('customer_email') ?? null,
    expires_at: expiresAt,
    invoice: null,
    livemode: false,
    locale: (p.string('locale') as FakeSession['locale']) ?? null,
    metadata: p.metadata() ?? {},
    mode,
    payment_intent: null,
    payment_link: null,
    payment_method_collection: 'if_required',
    payment_method_types: ['card'],
    payment_status: 'unpaid',
    recovered_from: null,
    setup_intent: null,
    status: 'open',
    submit_type: (p.enum('submit_type', ['auto', 'book', 'donate', 'pay', 'subscribe'] as const) ?? null),
    subscription: null,
    success_url: p.url('success_url') ?? null,
    total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
    ui_mode: 'hosted_page',
    url: `${baseUrl}/pay/${id}`,
  };
  const record: SessionRecord = {
    session,
    lineItems,
    paymentIntentData: {
      metadata: pid?.metadata() ?? {},
      description: pid?.string('description', { max: 1000 }) ?? null,
      receipt_email: pid?.email('receipt_email') ?? null,
    },
  };
  payments.store.sessions.set(id, record);
  return session;
}

export function checkoutSessionsRouter(payments: Payments, baseUrl: () => string): Router {
  const router = Router();
  const store = payments.store;
  const load = (id: string) => {
    const record = store.sessions.get(id);
    if (!record) throw noSuch('checkout.session', id);
    return record;
  };

  router.post('/checkout/sessions', (req, res) => {
    const session = createSession(req.body, payments, baseUrl());
    res.json(expand(session, expandPaths(Params.of(req.body)), store));
  });

  router.get('/checkout/sessions', (req, res) => {
    const p = Params.of(req.query).only(['limit', 'starting_after', 'ending_before', 'payment_intent', 'status', 'customer_details', 'expand']);
    const pi = p.string('payment_intent');
    const status = p.enum('status', ['open', 'complete', 'expired'] as const);
    const email = p.object('customer_details')?.only(['email']).string('email');
    const sessions = [...store.sessions.values()]
      .map((r) => r.session)
      .filter((s) => (pi === undefined || s.payment_intent === pi) && (status === undefined || s.status === status))
      .filter((s) => email === undefined || s.customer_details?.email === email);
    res.json(expand(paginate(sessions, p, '/v1/checkout/sessions', 'checkout.session'), expandPaths(p), store));
  });

  router.get('/checkout/sessions/:id', (req, res) => {
    const p = Params.of(req.query).only(['expand']);
    res.json(expand(load(req.params.id).session, expandPaths(p), store));
  });

  router.get('/checkout/sessions/:id/line_items', (req, res) => {
    const p = Params.of(req.query).only(['limit', 'starting_after', 'ending_before', 'expand']);
    const record = load(req.params.id);
    res.json(paginate([...record.lineItems].reverse(), p, `/v1/checkout/sessions/${record.session.id}/line_items`, 'item'));
  });

  router.post('/checkout/sessions/:id/expire', (req, res) => {
    const p = Params.of(req.body).only(['expand']);
    const record = load(req.params.id);
    payments.sweepExpired();
    if (record.session.status !== 'open') {
      throw invalidRequest(
        `This Checkout Session has a status of ${record.session.status}; only open Checkout Sessions can be expired.`,
        { param: 'session' },
      );
    }
    payments.expireSession(record, requestInfo(res));
    res.json(expand(record.session, expandPaths(p), store));
  });

  return router;
}
