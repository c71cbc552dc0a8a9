/**
 * Card payments through the official SDK against the local card-payment fake. Test card numbers
 * are the processor's published ones (Stripe testing documentation, docs.stripe.com/testing):
 * 4242 4242 4242 4242 succeeds, 4000 0000 0000 0002 is a generic decline, 4000 0000 0000 9995
 * declines for insufficient funds.
 */
import { Op } from 'sequelize';
import request from 'supertest';
import Stripe from 'stripe';
import { describe, expect, inject, it } from 'vitest';
import { createApp } from '../../../server/app';
import { signatureHeader } from '../../../server/fakes/stripe';
import { CardCheckout, Invoice, Payment, Refund, StripeEvent, type User } from '../../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient, uniqueEmail, waitForMail } from '../../support';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const sdk = () => {
  const fake = new URL(inject('cardFakeUrl'));
  return new Stripe(inject('stripeSecretKey'), { host: fake.hostname, port: Number(fake.port), protocol: 'http', telemetry: false });
};

async function setup() {
  const c = await buildCompany();
  const email = uniqueEmail('cardholder');
  const customer = await buildCustomer(c.organization.id, { name: 'Odile Brandt', email });
  const tent = await buildItem(c.organization.id, { name: '20x20 frame tent', kind: 'tent', tentType: 'frame', widthFt: 20, lengthFt: 20, quantityOwned: 20, rentalPriceCents: 60_000 });
  const office = await as(c.office);
  const booking = (await office.post('/api/bookings', bookingBody(customer.id, '2027-10-02', [{ itemId: tent.id, quantity: 1, unitPriceCents: 60_000, description: '20x20 frame tent' }], { taxRateBp: 0, damageWaiver: false }))).body;
  const draft = (await office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'balance' })).body;
  const invoice = (await office.post(`/api/invoices/${draft.id}/issue`)).body;
  return { ...c, customer, email, office, booking, invoice };
}

/** Pays a checkout on the fake's page without a browser, as the payer would. */
async function payOnFake(checkoutId: string, cardNumber: string) {
  const checkout = (await CardCheckout.findByPk(checkoutId))!;
  const res = await fetch(`${inject('cardFakeUrl')}/_fake/sessions/${checkout.stripeSessionId}/pay`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ cardNumber, expiry: '12/34', cvc: '123' }),
  });
  return (await res.json()) as { outcome: string; redirect_url?: string };
}

const signed = (payload: string, opts: { timestamp?: number } = {}) =>
  sdk().webhooks.generateTestHeaderString({ payload, secret: inject('stripeWebhookSecret'), ...(opts.timestamp ? { timestamp: opts.timestamp } : {}) });

const postEvent = (payload: string, header: string) =>
  request(app).post('/api/webhooks/stripe').set('Content-Type', 'application/json').set('Stripe-Signature', header).send(payload);

/** A hand-made event in the processor's shape, for order and repetition tests. */
function event(id: string, type: string, object: Record<string, unknown>) {
  return JSON.stringify({ id, object: 'event', type, api_version: '2025-01-01', created: Math.floor(Date.now() / 1000), livemode: false, pending_webhooks: 1, request: { id: null, idempotency_key: null }, data: { object } });
}

describe('the webhook endpoint', () => {
  it("the card fake signs deliveries exactly as the SDK's own test signer does", () => {
    const payload = event('evt_cross_check', 'payment_intent.succeeded', { id: 'pi_x', object: 'payment_intent' });
    const secret = inject('stripeWebhookSecret');
    for (const timestamp of [1_700_000_000, Math.floor(Date.now() / 1000)]) {
      expect(signatureHeader(payload, secret, timestamp)).toBe(sdk().webhooks.generateTestHeaderString({ payload, secret, timestamp }));
    }
  });

  it('accepts what the SDK signs, and refuses a tampered body and a stale timestamp with 400', async () => {
    const payload = event(`evt_sig_${Date.now()}`, 'customer.created', { id: 'cus_x', object: 'customer' });
    expect((await postEvent(payload, signed(payload))).status).toBe(200);
    const tampered = payload.replace('cus_x', 'cus_y');
    expect((await postEvent(tampered, signed(payload))).status).toBe(400);
    // The processor's default tolerance is five minutes (Stripe webhooks documentation, "Prevent replay attacks").
    const stale = event(`evt_stale_${Date.now()}`, 'customer.created', { id: 'cus_z', object: 'customer' });
    const res = await postEvent(stale, signed(stale, { timestamp: Math.floor(Date.now() / 1000) - 600 }));
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_signature');
    expect(await StripeEvent.count({ where: { type: 'customer.created' } })).toBeGreaterThanOrEqual(1);
  });
});

describe('paying an invoice by card', () => {
  it('4242: the webhook records the payment once, the invoice is paid, the ledger has it in card clearing and the receipt is e-mailed', async () => {
    const s = await setup();
    expect((await s.office.post(`/api/invoices/${s.invoice.id}/checkout`, { amountCents: 60_001 })).body.error.code).toBe('more_than_due');
    const started = await s.office.post(`/api/invoices/${s.invoice.id}/checkout`, {});
    expect(started.status).toBe(201);
    expect(started.body.url).toMatch(new RegExp(`^${inject('cardFakeUrl')}/pay/cs_test_`));
    // The same request again: the same checkout and the same hosted page (idempotency key).
    const again = await s.office.post(`/api/invoices/${s.invoice.id}/checkout`, {});
    expect(again.body).toEqual(started.body);

    const paid = await payOnFake(started.body.checkoutId, '4242424242424242');
    expect(paid.outcome).toBe('succeeded');
    await expect.poll(async () => (await Invoice.findByPk(s.invoice.id))!.status, { timeout: 15_000 }).toBe('paid');
    const payments = await Payment.findAll({ where: { bookingId: s.booking.id } });
    expect(payments).toHaveLength(1);
    expect(payments[0]).toMatchObject({ method: 'card', amountCents: 60_000 });
    expect(payments[0].stripePaymentIntentId).toMatch(/^pi_/);
    expect((await CardCheckout.findByPk(started.body.checkoutId))!.status).toBe('paid');
    await waitForMail(s.email, { subject: /receipt/i });
    const today = new Date().toISOString().slice(0, 10);
    const tb = (await s.office.get(`/api/ledger/trial-balance?at=${today}`)).body;
    expect(tb.totalDebitCents).toBe(tb.totalCreditCents);
    // Card clearing holds what the processor pays out: the payment less its fee, 2.9% + 30¢ of
    // $600.00 = $17.70 (Stripe pricing page, standard US card rate, from memory; the fake's rule).
    expect(payments[0].feeCents).toBe(1_770);
    expect(tb.accounts.find((a: { name: string }) => a.name === 'Card clearing').debitCents).toBe(60_000 - 1_770);
    expect(tb.accounts.find((a: { name: string }) => a.name === 'Card processing fees').debitCents).toBe(1_770);

    // Every event the fake sent for it, delivered again ten times at once: still one payment.
    const list = (await sdk().events.list({ type: 'payment_intent.succeeded', limit: 100 })).data;
    const mine = list.filter((e) => (e.data.object as Stripe.PaymentIntent).metadata?.checkoutId === started.body.checkoutId);
    expect(mine).toHaveLength(1);
    const payload = JSON.stringify(mine[0]);
    const replies = await Promise.all(Array.from({ length: 10 }, () => postEvent(payload, signed(payload))));
    expect(replies.map((r) => r.status)).toEqual(Array(10).fill(200));
    expect((await StripeEvent.findByPk(mine[0].id))!.deliveries).toBeGreaterThanOrEqual(11);
    await new Promise((r) => setTimeout(r, 1500));
    expect(await Payment.count({ where: { bookingId: s.booking.id } })).toBe(1);
  });

  it('a declined card records no money, leaves the invoice open and says why in plain words', async () => {
    const s = await setup();
    const started = (await s.office.post(`/api/invoices/${s.invoice.id}/checkout`, {})).body;
    const declined = await payOnFake(started.checkoutId, '4000000000009995');
    expect(declined.outcome).not.toBe('succeeded');
    await expect.poll(async () => (await CardCheckout.findByPk(started.checkoutId))!.status, { timeout: 15_000 }).toBe('failed');
    expect((await CardCheckout.findByPk(started.checkoutId))!.message).toMatch(/not enough funds/);
    expect(await Payment.count({ where: { bookingId: s.booking.id } })).toBe(0);
    expect((await Invoice.findByPk(s.invoice.id))!.status).toBe('open');
    // Another card on the same page then succeeds.
    expect((await payOnFake(started.checkoutId, '4242424242424242')).outcome).toBe('succeeded');
    await expect.poll(async () => (await CardCheckout.findByPk(started.checkoutId))!.status, { timeout: 15_000 }).toBe('paid');
    expect(await Payment.count({ where: { bookingId: s.booking.id } })).toBe(1);
  });

  it('events in any order end in the same ledger: success before or after completion, a late failure changes nothing', async () => {
    const s = await setup();
    const orders = [
      ['payment_intent.succeeded', 'checkout.session.completed', 'payment_intent.payment_failed'],
      ['payment_intent.payment_failed', 'checkout.session.completed', 'payment_intent.succeeded'],
    ];
    const outcomes: { status: string; payments: number; paid: number }[] = [];
    for (const [n, order] of orders.entries()) {
      // A checkout of our own with made-up processor ids: only the events below ever speak of it.
      const checkout = await CardCheckout.create({
        organizationId: s.organization.id, invoiceId: s.invoice.id, bookingId: s.booking.id, customerId: s.customer.id, amountCents: 10_000 + n, currency: 'USD',
        startedBy: 'staff', idempotencyKey: `manual-${Date.now()}-${n}`, stripeSessionId: `cs_test_manual_${Date.now()}_${n}`,
      });
      const pi = `pi_manual_${Date.now()}_${n}`;
      const objects: Record<string, Record<string, unknown>> = {
        'payment_intent.succeeded': { id: pi, object: 'payment_intent', amount: 10_000 + n, amount_received: 10_000 + n, status: 'succeeded', latest_charge: `ch_manual_${n}`, metadata: { checkoutId: checkout.id } },
        'checkout.session.completed': { id: checkout.stripeSessionId, object: 'checkout.session', payment_status: 'paid', status: 'complete', payment_intent: pi, amount_total: 10_000 + n, metadata: { checkoutId: checkout.id }, client_reference_id: checkout.id },
        'payment_intent.payment_failed': { id: pi, object: 'payment_intent', amount: 10_000 + n, amount_received: 0, status: 'requires_payment_method', metadata: { checkoutId: checkout.id }, last_payment_error: { type: 'card_error', code: 'card_declined', decline_code: 'generic_decline' } },
      };
      for (const [k, type] of order.entries()) {
        const payload = event(`evt_manual_${Date.now()}_${n}_${k}`, type, objects[type]);
        expect((await postEvent(payload, signed(payload))).status).toBe(200);
      }
      await expect.poll(async () => StripeEvent.count({ where: { type: order, processedAt: { [Op.ne]: null } } }), { timeout: 15_000 }).toBeGreaterThanOrEqual(3 * (n + 1));
      await expect.poll(async () => (await CardCheckout.findByPk(checkout.id))!.status, { timeout: 15_000 }).toBe('paid');
      const payments = await Payment.findAll({ where: { stripePaymentIntentId: pi } });
      outcomes.push({ status: (await CardCheckout.findByPk(checkout.id))!.status, payments: payments.length, paid: payments[0]?.amountCents - n });
    }
    expect(outcomes).toEqual([
      { status: 'paid', payments: 1, paid: 10_000 },
      { status: 'paid', payments: 1, paid: 10_000 },
    ]);
    expect((await Invoice.findByPk(s.invoice.id))!.paidCents).toBe(20_001);
  });
});

describe('card refunds', () => {
  it('the owner refunds by card; the processor confirms it and only then the ledger and the invoice follow', async () => {
    const s = await setup();
    const started = (await s.office.post(`/api/invoices/${s.invoice.id}/checkout`, {})).body;
    await payOnFake(started.checkoutId, '4242424242424242');
    await expect.poll(async () => (await Invoice.findByPk(s.invoice.id))!.status, { timeout: 15_000 }).toBe('paid');
    const payment = (await Payment.findOne({ where: { bookingId: s.booking.id } }))!;
    const owner = await as(s.owner);
    expect((await owner.post(`/api/payments/${payment.id}/refunds`, { amountCents: 60_001, reason: 'Too much' })).status).toBe(409);
    const refund = await owner.post(`/api/payments/${payment.id}/refunds`, { amountCents: 15_000, reason: 'Sidewalls not used' });
    expect(refund.status).toBe(201);
    await expect.poll(async () => (await Refund.findByPk(refund.body.id))!.status, { timeout: 20_000 }).toBe('succeeded');
    const row = (await Refund.findByPk(refund.body.id))!;
    expect(row.stripeRefundId).toMatch(/^re_/);
    expect(row.ledgerEntryId).toBeTruthy();
    expect((await Invoice.findByPk(s.invoice.id))!).toMatchObject({ status: 'partly_paid', paidCents: 45_000 });
    await waitForMail(s.email, { subject: /Refund of \$150\.00/ });
    // A second refund cannot take more than what is left, pending or not.
    expect((await owner.post(`/api/payments/${payment.id}/refunds`, { amountCents: 45_001, reason: 'All' })).body.error.code).toBe('refund_too_large');
    const remote = await sdk().refunds.list({ payment_intent: payment.stripePaymentIntentId! });
    expect(remote.data.map((r) => r.amount)).toEqual([15_000]);
  });
});
