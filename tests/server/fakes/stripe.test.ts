import http from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { passesLuhn, startCardFake, type CardFake, type Delivery } from '../../../server/fakes/stripe';

// The card fake driven by the official SDK, the way the product talks to it; the payer's side
// through the page's own HTML form posts; webhooks received by a tiny endpoint that verifies
// them with the SDK's constructEvent.

const SECRET = 'whsec_card_fake_test_secret';
const FUTURE = `12/${String((new Date().getUTCFullYear() + 3) % 100).padStart(2, '0')}`;

type Received = { event: Stripe.Event; signature: string };

/** A webhook endpoint: verifies every delivery, answers 500 while a test asks it to. */
class Receiver {
  received: Received[] = [];
  refused: string[] = [];
  private failures: Array<{ match: (e: Stripe.Event) => boolean; remaining: number }> = [];
  private waiters: Array<{ match: (e: Stripe.Event) => boolean; resolve: (e: Stripe.Event) => void }> = [];
  server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const raw = Buffer.concat(chunks).toString('utf8');
      const signature = String(req.headers['stripe-signature'] ?? '');
      let event: Stripe.Event;
      try {
        event = sdk.webhooks.constructEvent(raw, signature, SECRET);
      } catch (err) {
        this.refused.push(String(err));
        res.writeHead(400).end();
        return;
      }
      const failure = this.failures.find((f) => f.remaining > 0 && f.match(event));
      if (failure) {
        failure.remaining -= 1;
        res.writeHead(500).end('not now');
        return;
      }
      this.received.push({ event, signature });
      res.writeHead(200).end('ok');
      for (const w of this.waiters.filter((w) => w.match(event))) {
        this.waiters.splice(this.waiters.indexOf(w), 1);
        w.resolve(event);
      }
    });
  });
  failNext(match: (e: Stripe.Event) => boolean, times: number) {
    this.failures.push({ match, remaining: times });
  }
  /** Resolves with the next accepted event that matches (or one already received). */
  waitFor(type: string, objectId: string, alreadySeen = 0): Promise<Stripe.Event> {
    const match = (e: Stripe.Event) => e.type === type && (e.data.object as { id: string }).id === objectId;
    const seen = this.received.filter((r) => match(r.event));
    if (seen.length > alreadySeen) return Promise.resolve(seen[alreadySeen].event);
    return new Promise((resolve) => this.waiters.push({ match, resolve }));
  }
  count(type: string, objectId: string) {
    return this.received.filter((r) => r.event.type === type && (r.event.data.object as { id: string }).id === objectId).length;
  }
}

const sdk = new Stripe('sk_test_only_for_the_signature_helper', { telemetry: false });
let fake: CardFake;
let stripe: Stripe;
const receiver = new Receiver();

beforeAll(async () => {
  await new Promise<void>((r) => receiver.server.listen(0, '127.0.0.1', () => r()));
  const port = (receiver.server.address() as AddressInfo).port;
  fake = await startCardFake({
    webhookUrl: `http://127.0.0.1:${port}/api/webhooks/stripe`,
    webhookSecret: SECRET,
    retryDelaysMs: [20, 40, 80],
    refundSettleDelayMs: 0,
  });
  stripe = new Stripe('sk_test_guyline_card_fake', {
    host: '127.0.0.1',
    port: fake.port,
    protocol: 'http',
    maxNetworkRetries: 2,
    telemetry: false,
  });
});

afterAll(async () => {
  await fake?.close();
  await new Promise<void>((r) => receiver.server.close(() => r()));
});

function newSession(extra: Partial<Stripe.Checkout.SessionCreateParams> = {}) {
  return stripe.checkout.sessions.create({
    mode: 'payment',
    line_items: [
      { price_data: { currency: 'usd', unit_amount: 45_000, product_data: { name: 'Deposit for booking 1024' } }, quantity: 1 },
      { price_data: { currency: 'usd', unit_amount: 250, product_data: { name: 'Stakes' } }, quantity: 4 },
    ],
    success_url: 'http://127.0.0.1:3000/pay/done?session_id={CHECKOUT_SESSION_ID}',
    cancel_url: 'http://127.0.0.1:3000/pay/cancelled',
    customer_email: 'marlow@example.com',
    client_reference_id: 'invoice-77',
    metadata: { bookingId: '1024' },
    payment_intent_data: { metadata: { invoiceId: '77' } },
    ...extra,
  });
}

/** The payer types a card on the page and presses Pay. */
async function payOnPage(url: string, card: { cardNumber: string; expiry?: string; cvc?: string }) {
  const res = await fetch(url, {
    method: 'POST',
    body: new URLSearchParams({ expiry: FUTURE, cvc: '123', ...card }),
    redirect: 'manual',
  });
  return { status: res.status, location: res.headers.get('location'), html: await res.text() };
}

async function fakeJson<T = any>(path: string, init?: RequestInit): Promise<T> {
  const res = await fetch(`${fake.url}${path}`, init);
  return (await res.json()) as T;
}

/** Polls the fake until a delivery has finished (the fake records it after the endpoint answers). */
async function settledDeliveries(eventType: string, objectId: string): Promise<Delivery[]> {
  for (;;) {
    const { data } = await fakeJson<{ data: Array<{ type: string; object_id: string; deliveries: Delivery[] }> }>(
      `/_fake/events?type=${eventType}`,
    );
    const deliveries = data.find((e) => e.object_id === objectId)?.deliveries ?? [];
    if (deliveries.length > 0 && deliveries.every((d) => d.state !== 'pending')) return deliveries;
    await new Promise((r) => setTimeout(r, 10));
  }
}

describe('Luhn check', () => {
  it('takes the worked example and refuses a changed check digit', () => {
    // From memory: widely published worked example of the Luhn formula, 79927398713 is valid.
    expect(passesLuhn('79927398713')).toBe(true);
    // ISO/IEC 7812-1, Annex B (Luhn formula): any other last digit fails.
    expect(passesLuhn('79927398710')).toBe(false);
    // Stripe testing documentation, docs.stripe.com/testing, "Cards by brand": 4242 4242 4242 4242 is a valid number.
    expect(passesLuhn('4242424242424242')).toBe(true);
    // Stripe testing documentation, docs.stripe.com/testing, "Declined payments": 4242 4242 4242 4241 fails the Luhn check.
    expect(passesLuhn('4242424242424241')).toBe(false);
  });
});

describe('API basics', () => {
  it('refuses a missing or wrong key as the SDK expects (401)', async () => {
    const wrong = new Stripe('sk_live_not_here_at_all', { host: '127.0.0.1', port: fake.port, protocol: 'http', telemetry: false });
    await expect(wrong.paymentIntents.list()).rejects.toMatchObject({ type: 'StripeAuthenticationError', statusCode: 401 });
    const res = await fetch(`${fake.url}/v1/payment_intents`);
    expect(res.status).toBe(401);
    expect((await res.json()).error.type).toBe('invalid_request_error');
  });

  it('creates a checkout session with the real shape and refuses bad parameters with the real errors', async () => {
    const session = await newSession();
    expect(session).toMatchObject({
      object: 'checkout.session',
      mode: 'payment',
      status: 'open',
      payment_status: 'unpaid',
      amount_total: 46_000,
      currency: 'usd',
      payment_intent: null,
      livemode: false,
      customer_email: 'marlow@example.com',
      client_reference_id: 'invoice-77',
      metadata: { bookingId: '1024' },
      url: `${fake.url}/pay/${session.id}`,
    });
    expect(session.id).toMatch(/^cs_test_[A-Za-z0-9]{58}$/);
    expect(Number.isInteger(session.created)).toBe(true);
    expect(session.expires_at - session.created).toBe(24 * 60 * 60);

    const items = await stripe.checkout.sessions.listLineItems(session.id);
    expect(items.data.map((li) => [li.description, li.quantity, li.amount_total])).toEqual([
      ['Deposit for booking 1024', 1, 45_000],
      ['Stakes', 4, 1_000],
    ]);

    await expect(newSession({ colour: 'red' } as Partial<Stripe.Checkout.SessionCreateParams>)).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
      code: 'parameter_unknown',
      param: 'colour',
    });
    await expect(newSession({ line_items: [] })).rejects.toMatchObject({ type: 'StripeInvalidRequestError', param: 'line_items' });
    await expect(newSession({ expires_at: Math.floor(Date.now() / 1000) + 60 })).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
      param: 'expires_at',
    });
    await expect(stripe.checkout.sessions.retrieve('cs_test_nope')).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
      code: 'resource_missing',
      statusCode: 404,
    });
  });

  it('replays an idempotent request and refuses the same key with other parameters', async () => {
    const key = `guyline-test-${Date.now()}`;
    const sidewall = (unitAmount: number): Stripe.Checkout.SessionCreateParams => ({
      mode: 'payment',
      line_items: [{ price_data: { currency: 'usd', unit_amount: unitAmount, product_data: { name: 'Sidewall' } }, quantity: 1 }],
    });
    const first = await stripe.checkout.sessions.create(sidewall(5_000), { idempotencyKey: key });
    const again = await stripe.checkout.sessions.create(sidewall(5_000), { idempotencyKey: key });
    expect(again.id).toBe(first.id);
    expect(again.lastResponse.headers['idempotent-replayed']).toBe('true');
    await expect(stripe.checkout.sessions.create(sidewall(6_000), { idempotencyKey: key })).rejects.toMatchObject({
      type: 'StripeIdempotencyError',
      statusCode: 400,
    });
  });

  it('lists sessions newest first with cursors and the payment_intent filter', async () => {
    const a = await newSession();
    const b = await newSession();
    const page = await stripe.checkout.sessions.list({ limit: 1 });
    expect(page.data[0].id).toBe(b.id);
    expect(page.has_more).toBe(true);
    const next = await stripe.checkout.sessions.list({ limit: 1, starting_after: b.id });
    expect(next.data[0].id).toBe(a.id);
    await fakeJson(`/_fake/sessions/${a.id}/pay`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ cardNumber: '4242424242424242', expiry: FUTURE, cvc: '123' }),
    });
    const paid = await stripe.checkout.sessions.retrieve(a.id);
    const byIntent = await stripe.checkout.sessions.list({ payment_intent: paid.payment_intent as string });
    expect(byIntent.data.map((s) => s.id)).toEqual([a.id]);
  });
});

describe('the test card page', () => {
  it('shows an accessible form naming the amount and what is paid for', async () => {
    const session = await newSession();
    const html = await (await fetch(session.url!)).text();
    expect(html).toContain('<title>Pay $460.00 – Test card page</title>');
    expect(html).toMatch(/<h1>Pay \$460\.00 for Deposit for booking 1024 and 1 more<\/h1>/);
    for (const name of ['cardNumber', 'expiry', 'cvc']) {
      expect(html).toContain(`<label for="${name}">`);
      expect(html).toMatch(new RegExp(`<input id="${name}" name="${name}"`));
    }
    expect(html).toContain(`action="/pay/${session.id}"`);
    expect(html).toContain('<a href="http://127.0.0.1:3000/pay/cancelled">Cancel</a>');
  });

  it('4242 4242 4242 4242 pays: 303 to the success URL, the session completes, both events arrive signed', async () => {
    const session = await newSession();
    // Stripe testing documentation, docs.stripe.com/testing, "Cards by brand": 4242 4242 4242 4242 succeeds.
    const paid = await payOnPage(session.url!, { cardNumber: '4242 4242 4242 4242' });
    expect(paid.status).toBe(303);
    expect(paid.location).toBe(`http://127.0.0.1:3000/pay/done?session_id=${session.id}`);

    const done = await stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent'] });
    expect(done).toMatchObject({ status: 'complete', payment_status: 'paid', url: null });
    expect(done.customer_details?.email).toBe('marlow@example.com');
    const pi = done.payment_intent as Stripe.PaymentIntent;
    expect(pi).toMatchObject({ object: 'payment_intent', status: 'succeeded', amount: 46_000, amount_received: 46_000, metadata: { invoiceId: '77' } });
    expect(pi.id).toMatch(/^pi_/);
    expect(pi.latest_charge).toMatch(/^ch_/);

    const completed = await receiver.waitFor('checkout.session.completed', session.id);
    expect(completed).toMatchObject({ object: 'event', livemode: false, api_version: Stripe.API_VERSION });
    expect((completed.data.object as Stripe.Checkout.Session).payment_intent).toBe(pi.id);
    expect(completed.id).toMatch(/^evt_/);
    await receiver.waitFor('payment_intent.succeeded', pi.id);
    const signature = receiver.received.find((r) => r.event.id === completed.id)!.signature;
    expect(signature).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
    expect(receiver.refused).toEqual([]);

    const again = await fetch(session.url!);
    expect(await again.text()).toContain('Payment complete');
    expect((await payOnPage(session.url!, { cardNumber: '4242424242424242' })).status).toBe(409);
  });

  it('4000 0000 0000 0002 is declined: the session stays open, the payer tries another card', async () => {
    const session = await newSession();
    // Stripe testing documentation, docs.stripe.com/testing, "Declined payments": generic decline.
    const declined = await payOnPage(session.url!, { cardNumber: '4000 0000 0000 0002' });
    expect(declined.status).toBe(402);
    expect(declined.html).toContain('Your card was declined.');
    expect(declined.html).toContain('value="4000 0000 0000 0002"');

    const open = await stripe.checkout.sessions.retrieve(session.id);
    expect(open.status).toBe('open');
    const pi = await stripe.paymentIntents.retrieve(open.payment_intent as string);
    expect(pi.status).toBe('requires_payment_method');
    expect(pi.last_payment_error).toMatchObject({ type: 'card_error', code: 'card_declined', decline_code: 'generic_decline' });
    expect(pi.latest_charge).toMatch(/^ch_/);
    const failed = await receiver.waitFor('payment_intent.payment_failed', pi.id);
    expect((failed.data.object as Stripe.PaymentIntent).last_payment_error?.decline_code).toBe('generic_decline');

    const paid = await payOnPage(session.url!, { cardNumber: '4242424242424242' });
    expect(paid.status).toBe(303);
    const after = await stripe.paymentIntents.retrieve(pi.id);
    expect(after).toMatchObject({ status: 'succeeded', last_payment_error: null });
  });

  it('4000 0000 0000 9995 is declined with insufficient_funds', async () => {
    const session = await newSession();
    // Stripe testing documentation, docs.stripe.com/testing, "Declined payments": insufficient funds decline.
    const res = await payOnPage(session.url!, { cardNumber: '4000000000009995' });
    expect(res.status).toBe(402);
    expect(res.html).toContain('Your card has insufficient funds.');
    const pi = await stripe.paymentIntents.retrieve((await stripe.checkout.sessions.retrieve(session.id)).payment_intent as string);
    expect(pi.last_payment_error).toMatchObject({ code: 'card_declined', decline_code: 'insufficient_funds' });
  });

  it('4000 0000 0000 3220 asks for authentication: Fail keeps the session open, Complete pays', async () => {
    const session = await newSession();
    // Stripe testing documentation, docs.stripe.com/testing, "3D Secure authentication": must be completed.
    const first = await payOnPage(session.url!, { cardNumber: '4000 0000 0000 3220' });
    expect(first.status).toBe(303);
    expect(first.location).toMatch(new RegExp(`^${fake.url}/authenticate/pi_`));
    const authPage = await (await fetch(first.location!)).text();
    expect(authPage).toContain('value="complete">Complete</button>');
    expect(authPage).toContain('value="fail" class="secondary">Fail</button>');

    const failed = await fetch(first.location!, { method: 'POST', body: new URLSearchParams({ result: 'fail' }), redirect: 'manual' });
    expect(failed.status).toBe(303);
    expect(failed.headers.get('location')).toBe(`/pay/${session.id}?declined=1`);
    expect(await (await fetch(`${fake.url}${failed.headers.get('location')}`)).text()).toContain("Your card's issuer could not confirm this payment.");
    const pi = await stripe.paymentIntents.retrieve((await stripe.checkout.sessions.retrieve(session.id)).payment_intent as string);
    expect(pi.last_payment_error?.code).toBe('payment_intent_authentication_failure');

    const second = await payOnPage(session.url!, { cardNumber: '4000000000003220' });
    const completed = await fetch(second.location!, { method: 'POST', body: new URLSearchParams({ result: 'complete' }), redirect: 'manual' });
    expect(completed.status).toBe(303);
    expect(completed.headers.get('location')).toBe(`http://127.0.0.1:3000/pay/done?session_id=${session.id}`);
    expect((await stripe.checkout.sessions.retrieve(session.id)).payment_status).toBe('paid');
  });

  it('checks the number, expiry and security code before any charge, keeping what was typed', async () => {
    const session = await newSession();
    // ISO/IEC 7812-1, Annex B (Luhn formula): 4242 4242 4242 4241 fails the check digit.
    const luhn = await payOnPage(session.url!, { cardNumber: '4242 4242 4242 4241' });
    expect(luhn.status).toBe(422);
    expect(luhn.html).toContain('Your card number is incorrect.');
    expect(luhn.html).toContain('value="4242 4242 4242 4241"');
    expect(luhn.html).toMatch(/id="cardNumber"[^>]*aria-invalid="true"/);

    const expired = await payOnPage(session.url!, { cardNumber: '4242424242424242', expiry: '01/20' });
    expect(expired.html).toContain("Your card's expiration date is in the past.");
    const cvc = await payOnPage(session.url!, { cardNumber: '4242424242424242', cvc: '12' });
    expect(cvc.html).toContain("Your card's security code is invalid.");

    const untouched = await stripe.checkout.sessions.retrieve(session.id);
    expect(untouched).toMatchObject({ status: 'open', payment_intent: null });
  });

  it('an expired session says so and takes no payment', async () => {
    const session = await newSession();
    const expired = await stripe.checkout.sessions.expire(session.id);
    expect(expired).toMatchObject({ status: 'expired', url: null });
    expect(await (await fetch(session.url!)).text()).toContain('This payment page has expired');
    expect((await payOnPage(session.url!, { cardNumber: '4242424242424242' })).status).toBe(409);
    await expect(stripe.checkout.sessions.expire(session.id)).rejects.toMatchObject({ type: 'StripeInvalidRequestError' });
    await receiver.waitFor('checkout.session.expired', session.id);
  });
});

describe('test controls', () => {
  it('pays a session without a browser and reports each outcome', async () => {
    const session = await newSession();
    const pay = (cardNumber: string, more: Record<string, string> = {}) =>
      fakeJson(`/_fake/sessions/${session.id}/pay`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ cardNumber, expiry: FUTURE, cvc: '123', ...more }),
      });
    expect((await pay('4242424242424241')).errors[0]).toMatchObject({ field: 'cardNumber', code: 'incorrect_number' });
    // Stripe testing documentation, docs.stripe.com/testing, "Declined payments": lost card.
    expect((await pay('4000000000009987')).error).toMatchObject({ type: 'card_error', decline_code: 'lost_card' });
    // Stripe testing documentation, docs.stripe.com/testing, "3D Secure authentication": authentication then insufficient_funds.
    expect((await pay('4000008260003178', { authentication: 'complete' })).error).toMatchObject({ decline_code: 'insufficient_funds' });
    const ok = await pay('4000002760003184', { authentication: 'complete' });
    expect(ok).toMatchObject({ outcome: 'succeeded', session: { status: 'complete' }, payment_intent: { status: 'succeeded' } });
    expect(ok.redirect_url).toBe(`http://127.0.0.1:3000/pay/done?session_id=${session.id}`);
  });
});

describe('payment intents made through the API', () => {
  it('confirms with test payment methods; a decline is the SDK card error', async () => {
    const pi = await stripe.paymentIntents.create({ amount: 12_000, currency: 'usd', confirm: true, payment_method: 'pm_card_visa', metadata: { invoiceId: '9' } });
    expect(pi).toMatchObject({ status: 'succeeded', amount_received: 12_000, metadata: { invoiceId: '9' } });
    const err = await stripe.paymentIntents
      .create({ amount: 12_000, currency: 'usd', confirm: true, payment_method: 'pm_card_visa_chargeDeclinedInsufficientFunds' })
      .catch((e: unknown) => e);
    expect(err).toBeInstanceOf(Stripe.errors.StripeCardError);
    expect(err).toMatchObject({ code: 'card_declined', decline_code: 'insufficient_funds', statusCode: 402 });
    const charge = await stripe.charges.retrieve(pi.latest_charge as string);
    expect(charge).toMatchObject({ object: 'charge', status: 'succeeded', paid: true, amount: 12_000, payment_intent: pi.id });
    expect(charge.payment_method_details?.card).toMatchObject({ brand: 'visa', last4: '4242' });
    await expect(stripe.paymentIntents.create({ amount: 20, currency: 'usd' })).rejects.toMatchObject({ code: 'amount_too_small' });
    const listed = await stripe.paymentIntents.list({ limit: 100 });
    expect(listed.data.some((p) => p.id === pi.id)).toBe(true);
  });

  it('sends the payer to the authentication page and back to the return_url', async () => {
    const pi = await stripe.paymentIntents.create({
      amount: 8_000,
      currency: 'usd',
      confirm: true,
      // Stripe testing documentation, docs.stripe.com/testing, "3D Secure authentication": always asks.
      payment_method: 'pm_card_authenticationRequired',
      return_url: 'http://127.0.0.1:3000/pay/back',
    });
    expect(pi.status).toBe('requires_action');
    const url = pi.next_action?.redirect_to_url?.url;
    expect(url).toBe(`${fake.url}/authenticate/${pi.id}`);
    const back = await fetch(url!, { method: 'POST', body: new URLSearchParams({ result: 'complete' }), redirect: 'manual' });
    const location = new URL(back.headers.get('location')!);
    expect(`${location.origin}${location.pathname}`).toBe('http://127.0.0.1:3000/pay/back');
    expect(Object.fromEntries(location.searchParams)).toMatchObject({ payment_intent: pi.id, redirect_status: 'succeeded' });
    expect((await stripe.paymentIntents.retrieve(pi.id)).status).toBe('succeeded');
  });
});

describe('refunds', () => {
  async function paidIntent(cardNumber = '4242424242424242') {
    const session = await newSession();
    await fakeJson(`/_fake/sessions/${session.id}/pay`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ cardNumber, expiry: FUTURE, cvc: '123' }),
    });
    return (await stripe.checkout.sessions.retrieve(session.id)).payment_intent as string;
  }

  it('never gives back more than the charge has left', async () => {
    const pi = await paidIntent();
    const part = await stripe.refunds.create({ payment_intent: pi, amount: 10_000, reason: 'requested_by_customer', metadata: { refundId: '1' } });
    expect(part).toMatchObject({ object: 'refund', amount: 10_000, status: 'succeeded', payment_intent: pi, metadata: { refundId: '1' } });
    expect(part.id).toMatch(/^re_/);
    await expect(stripe.refunds.create({ payment_intent: pi, amount: 40_000 })).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
      param: 'amount',
      message: 'Refund amount ($400.00) is greater than unrefunded amount on charge ($360.00)',
    });
    const rest = await stripe.refunds.create({ payment_intent: pi });
    expect(rest.amount).toBe(36_000);
    await expect(stripe.refunds.create({ payment_intent: pi, amount: 1 })).rejects.toMatchObject({ code: 'charge_already_refunded' });
    expect((await stripe.refunds.list({ payment_intent: pi })).data.map((r) => r.id)).toEqual([rest.id, part.id]);
    expect(await stripe.refunds.retrieve(part.id)).toMatchObject({ id: part.id, amount: 10_000 });
    const charge = (await stripe.paymentIntents.retrieve(pi)).latest_charge as string;
    // Two charge.refunded events, in whichever order they arrive: the later one has it all back.
    await receiver.waitFor('charge.refunded', charge, 1);
    const amounts = receiver.received
      .filter((r) => r.event.type === 'charge.refunded' && (r.event.data.object as Stripe.Charge).id === charge)
      .map((r) => [(r.event.data.object as Stripe.Charge).amount_refunded, (r.event.data.object as Stripe.Charge).refunded]);
    expect(amounts).toEqual(expect.arrayContaining([[10_000, false], [46_000, true]]));
    await receiver.waitFor('refund.created', rest.id);
  });

  it('a refund on 4000 0000 0000 5126 fails later and the money is refundable again', async () => {
    // Stripe testing documentation, docs.stripe.com/testing, "Refunds": asynchronous failure.
    const pi = await paidIntent('4000000000005126');
    const refund = await stripe.refunds.create({ payment_intent: pi });
    const failed = await receiver.waitFor('refund.failed', refund.id);
    expect(failed.data.object).toMatchObject({ status: 'failed', failure_reason: 'expired_or_canceled_card' });
    expect((await stripe.refunds.create({ payment_intent: pi, amount: 100 })).amount).toBe(100);
  });
});

describe('webhook delivery', () => {
  it('retries until the endpoint answers 2xx, signing each attempt', async () => {
    const session = await newSession();
    receiver.failNext((e) => e.type === 'checkout.session.completed' && (e.data.object as { id: string }).id === session.id, 2);
    await payOnPage(session.url!, { cardNumber: '4242424242424242' });
    const event = await receiver.waitFor('checkout.session.completed', session.id);
    const deliveries = await settledDeliveries('checkout.session.completed', session.id);
    expect(deliveries).toHaveLength(1);
    expect(deliveries[0].state).toBe('delivered');
    expect(deliveries[0].attempts.map((a) => a.status)).toEqual([500, 500, 200]);
    expect((await stripe.events.retrieve(event.id)).pending_webhooks).toBe(0);
  });

  it('gives up after the last retry and can resend an event on request', async () => {
    const session = await newSession();
    receiver.failNext((e) => e.type === 'checkout.session.expired' && (e.data.object as { id: string }).id === session.id, 4);
    await stripe.checkout.sessions.expire(session.id);
    const deliveries = await settledDeliveries('checkout.session.expired', session.id);
    expect(deliveries[0]).toMatchObject({ state: 'failed' });
    expect(deliveries[0].attempts).toHaveLength(4);

    const resent = await fakeJson(`/_fake/deliveries/redeliver`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ event_id: deliveries[0].eventId }),
    });
    expect(resent.delivery).toMatchObject({ reason: 'redeliver', eventId: deliveries[0].eventId });
    const event = await receiver.waitFor('checkout.session.expired', session.id);
    expect(event.id).toBe(deliveries[0].eventId);

    // A second resend of the same event: the app must treat it as the same event.
    await fakeJson(`/_fake/deliveries/redeliver`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ event_id: event.id }),
    });
    const repeat = await receiver.waitFor('checkout.session.expired', session.id, 1);
    expect(repeat.id).toBe(event.id);
    expect(receiver.count('checkout.session.expired', session.id)).toBe(2);
  });

  it('can send every event twice, as the real service sometimes does', async () => {
    const port = (receiver.server.address() as AddressInfo).port;
    const twice = await startCardFake({ webhookUrl: `http://127.0.0.1:${port}/hooks`, webhookSecret: SECRET, duplicate: true });
    try {
      const client = new Stripe('sk_test_twice', { host: '127.0.0.1', port: twice.port, protocol: 'http', telemetry: false });
      const pi = await client.paymentIntents.create({ amount: 5_000, currency: 'usd', confirm: true, payment_method: 'pm_card_visa' });
      const first = await receiver.waitFor('payment_intent.succeeded', pi.id);
      const second = await receiver.waitFor('payment_intent.succeeded', pi.id, 1);
      expect(second.id).toBe(first.id);
    } finally {
      await twice.close();
    }
  });
});
