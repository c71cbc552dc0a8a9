/**
 * The card processor's fee on each card payment: learnt from the payment's balance transaction
 * through the official SDK, stored on the payment, booked to Card processing fees, shown in the
 * payments export and on the office's payment list. Test card 4242 4242 4242 4242 succeeds
 * (Stripe testing documentation, docs.stripe.com/testing).
 */
import { parse } from 'csv-parse/sync';
import { Op, QueryTypes } from 'sequelize';
import request from 'supertest';
import Stripe from 'stripe';
import { describe, expect, inject, it } from 'vitest';
import { dateInZone } from '../../../shared/dates';
import { createApp } from '../../../server/app';
import { sequelize } from '../../../server/db';
import { Account, CardCheckout, Invoice, Payment, Refund, StripeEvent, type User } from '../../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient, uniqueEmail } from '../../support';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const fakeUrl = () => inject('cardFakeUrl');
const sdk = () => {
  const fake = new URL(fakeUrl());
  return new Stripe(inject('stripeSecretKey'), { host: fake.hostname, port: Number(fake.port), protocol: 'http', telemetry: false });
};

// $100.50 by card. The fee the fake charges is Stripe's standard US card rate, 2.9% + 30¢ rounded
// to the cent (Stripe pricing page, standard US card rate, from memory): 2.9% of 10,050 cents is
// 291.45 cents, so 291 + 30 = 321 cents.
const PAID_CENTS = 10_050;
const FEE_CENTS = 321;

async function setup() {
  const c = await buildCompany();
  const customer = await buildCustomer(c.organization.id, { name: 'Maren Oduya', email: uniqueEmail('card-fee') });
  const tent = await buildItem(c.organization.id, { name: '20x30 frame tent', kind: 'tent', tentType: 'frame', widthFt: 20, lengthFt: 30, quantityOwned: 10, rentalPriceCents: 80_000 });
  const office = await as(c.office);
  const booking = (await office.post('/api/bookings', bookingBody(customer.id, '2027-09-18', [{ itemId: tent.id, quantity: 1, unitPriceCents: 80_000, description: '20x30 frame tent' }], { taxRateBp: 0, damageWaiver: false }))).body;
  const draft = (await office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'balance' })).body;
  const invoice = (await office.post(`/api/invoices/${draft.id}/issue`)).body;
  const started = await office.post(`/api/invoices/${invoice.id}/checkout`, { amountCents: PAID_CENTS });
  expect(started.status).toBe(201);
  const checkout = (await CardCheckout.findByPk(started.body.checkoutId))!;
  return { ...c, office, booking, invoice, checkout, today: dateInZone(new Date(), c.organization.timeZone) };
}

/** Posts to the fake's test controls. */
async function control(path: string, body: Record<string, unknown>) {
  const res = await fetch(`${fakeUrl()}/_fake${path}`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify(body) });
  expect(res.status).toBe(200);
  return (await res.json()) as Record<string, unknown>;
}

/** Pays the checkout on the fake's page with 4242 and waits until both events that say so are handled. */
async function payAndWait(checkout: CardCheckout, invoiceId: string): Promise<Payment> {
  const paid = await control(`/sessions/${checkout.stripeSessionId}/pay`, { cardNumber: '4242424242424242', expiry: '12/34', cvc: '123' });
  expect(paid.outcome).toBe('succeeded');
  const intentId = (paid.payment_intent as { id: string }).id;
  await expect.poll(async () => (await Invoice.findByPk(invoiceId))!.paidCents, { timeout: 15_000 }).toBe(PAID_CENTS);
  // checkout.session.completed and payment_intent.succeeded: whichever came second found the payment recorded.
  await expect
    .poll(
      async () =>
        (
          await sequelize.query<{ n: number }>(
            `SELECT count(*)::int AS n FROM stripe_events WHERE processed_at IS NOT NULL AND type IN ('checkout.session.completed', 'payment_intent.succeeded')
                AND (payload->'data'->'object'->>'id' = :pi OR payload->'data'->'object'->>'payment_intent' = :pi)`,
            { replacements: { pi: intentId }, type: QueryTypes.SELECT },
          )
        )[0].n,
      { timeout: 15_000 },
    )
    .toBe(2);
  return (await Payment.findOne({ where: { stripePaymentIntentId: intentId } }))!;
}

type LedgerLine = { accountCode: string; accountName: string; debitCents: number; creditCents: number };
type TrialRow = { code: string; name: string; debitCents: number; creditCents: number };

async function paymentsCsv(client: ApiClient, day: string) {
  const res = await client.agent.get(`/api/exports/payments.csv?from=${day}&to=${day}`).set('X-Forwarded-For', client.ip).buffer(true).parse((r, done) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => done(null, Buffer.concat(chunks)));
  });
  expect(res.status).toBe(200);
  const [header, ...rows] = parse(res.body as Buffer, { bom: true }) as string[][];
  return rows.map((r) => Object.fromEntries(header.map((h, i) => [h, r[i]])));
}

describe('the card processor’s fee', () => {
  it('4242: the fee (2.9% + 30¢) is stored, booked to Card processing fees against card clearing, in the export and on the office’s list', async () => {
    const s = await setup();
    const payment = await payAndWait(s.checkout, s.invoice.id);
    expect(payment).toMatchObject({ method: 'card', amountCents: PAID_CENTS, feeCents: FEE_CENTS });

    // The processor's side, as the SDK reads it: the charge's balance transaction.
    const intent = await sdk().paymentIntents.retrieve(payment.stripePaymentIntentId!, { expand: ['latest_charge.balance_transaction'] });
    const txn = (intent.latest_charge as Stripe.Charge).balance_transaction as Stripe.BalanceTransaction;
    expect(txn).toMatchObject({ object: 'balance_transaction', type: 'charge', amount: PAID_CENTS, fee: FEE_CENTS, net: PAID_CENTS - FEE_CENTS, currency: 'usd' });
    expect(txn.id).toMatch(/^txn_/);
    expect(txn.fee_details).toEqual([expect.objectContaining({ type: 'stripe_fee', amount: FEE_CENTS })]);
    expect(txn.available_on).toBeGreaterThan(txn.created);
    expect(await sdk().balanceTransactions.retrieve(txn.id)).toMatchObject({ id: txn.id, fee: FEE_CENTS, source: payment.stripeChargeId });

    // The ledger: its own entry, Dr Card processing fees / Cr Card clearing.
    const ledger = (await s.office.get(`/api/bookings/${s.booking.id}/ledger`)).body as { entries: { kind: string; lines: LedgerLine[] }[] };
    const fees = ledger.entries.filter((e) => e.kind === 'card_fee');
    expect(fees).toHaveLength(1);
    expect(fees[0].lines).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ accountCode: '6100', accountName: 'Card processing fees', debitCents: FEE_CENTS, creditCents: 0 }),
        expect.objectContaining({ accountName: 'Card clearing', debitCents: 0, creditCents: FEE_CENTS }),
      ]),
    );
    expect(fees[0].lines).toHaveLength(2);

    // The trial balance still sums to zero; card clearing holds what the processor will pay out.
    const tb = (await s.office.get(`/api/ledger/trial-balance?at=${s.today}`)).body as { totalDebitCents: number; totalCreditCents: number; accounts: TrialRow[] };
    expect(tb.totalDebitCents).toBe(tb.totalCreditCents);
    expect(tb.accounts.find((a) => a.name === 'Card clearing')!.debitCents).toBe(PAID_CENTS - FEE_CENTS);
    expect(tb.accounts.find((a) => a.name === 'Card processing fees')).toMatchObject({ code: '6100', debitCents: FEE_CENTS, creditCents: 0 });
    expect((await Account.findOne({ where: { organizationId: s.organization.id, systemKey: 'card_processing_fees' } }))!.type).toBe('expense');

    // The revenue report does not count the fee, and still agrees with the ledger.
    const revenue = (await (await as(s.owner)).get(`/api/reports/revenue?year=${s.today.slice(0, 4)}`)).body;
    expect(revenue.accounts.map((r: { account: { code: string } }) => r.account.code)).not.toContain('6100');
    expect(revenue.reconciliation.thisYear.differenceCents).toBe(0);

    // The payments export: the fee as a two-decimal amount.
    const rows = await paymentsCsv(await as(s.bookkeeper), s.today);
    const row = rows.find((r) => r['Card payment id'] === payment.stripePaymentIntentId)!;
    expect(row).toMatchObject({ Type: 'Payment', Amount: '100.50', Fee: '3.21' });

    // The office's list of payments says it; the crew never sees payments at all.
    const listed = (await s.office.get(`/api/bookings/${s.booking.id}/payments`)).body.data;
    expect(listed[0]).toMatchObject({ id: payment.id, feeCents: FEE_CENTS });
    expect((await (await as(s.crew)).get(`/api/bookings/${s.booking.id}/payments`)).status).toBe(403);
  });

  it('a refund gives no fee back: the fake’s refund balance transaction has fee 0, and the fee entry stays', async () => {
    const s = await setup();
    const payment = await payAndWait(s.checkout, s.invoice.id);
    const refund = await (await as(s.owner)).post(`/api/payments/${payment.id}/refunds`, { amountCents: 2_000, reason: 'One sidewall not used' });
    expect(refund.status).toBe(201);
    await expect.poll(async () => (await Refund.findByPk(refund.body.id))!.status, { timeout: 20_000 }).toBe('succeeded');
    const remote = await sdk().refunds.retrieve((await Refund.findByPk(refund.body.id))!.stripeRefundId!, { expand: ['balance_transaction'] });
    // In the US the processor keeps the payment's fee on a refund (from memory); the fake does the same.
    expect(remote.balance_transaction).toMatchObject({ object: 'balance_transaction', type: 'refund', amount: -2_000, fee: 0, net: -2_000, fee_details: [] });
    expect((await Payment.findByPk(payment.id))!.feeCents).toBe(FEE_CENTS);
    const tb = (await s.office.get(`/api/ledger/trial-balance?at=${s.today}`)).body as { totalDebitCents: number; totalCreditCents: number; accounts: TrialRow[] };
    expect(tb.totalDebitCents).toBe(tb.totalCreditCents);
    expect(tb.accounts.find((a) => a.name === 'Card clearing')!.debitCents).toBe(PAID_CENTS - FEE_CENTS - 2_000);
    expect(tb.accounts.find((a) => a.name === 'Card processing fees')!.debitCents).toBe(FEE_CENTS);
  });

  it('when the fee cannot be looked up, the payment is recorded all the same with the fee unknown', async () => {
    const s = await setup();
    expect(await control('/fees/refuse', { session_id: s.checkout.stripeSessionId })).toMatchObject({ refused: true });
    const payment = await payAndWait(s.checkout, s.invoice.id);
    expect(payment).toMatchObject({ method: 'card', amountCents: PAID_CENTS, feeCents: null });
    // The fake really refused it: the SDK gets the processor's 500 api_error.
    await expect(sdk().paymentIntents.retrieve(payment.stripePaymentIntentId!, { expand: ['latest_charge.balance_transaction'] }, { maxNetworkRetries: 0 })).rejects.toMatchObject({ type: 'StripeAPIError', statusCode: 500 });

    const ledger = (await s.office.get(`/api/bookings/${s.booking.id}/ledger`)).body as { entries: { kind: string }[] };
    expect(ledger.entries.filter((e) => e.kind === 'card_fee')).toHaveLength(0);
    expect(ledger.entries.filter((e) => e.kind === 'payment_received')).toHaveLength(1);
    const tb = (await s.office.get(`/api/ledger/trial-balance?at=${s.today}`)).body as { totalDebitCents: number; totalCreditCents: number; accounts: TrialRow[] };
    expect(tb.totalDebitCents).toBe(tb.totalCreditCents);
    expect(tb.accounts.find((a) => a.name === 'Card clearing')!.debitCents).toBe(PAID_CENTS);

    const rows = await paymentsCsv(await as(s.bookkeeper), s.today);
    expect(rows.find((r) => r['Card payment id'] === payment.stripePaymentIntentId)).toMatchObject({ Amount: '100.50', Fee: '' });
    expect((await s.office.get(`/api/bookings/${s.booking.id}/payments`)).body.data[0]).toMatchObject({ id: payment.id, feeCents: null });

    // The processor answers again: a later event about the same payment fills the fee in, once.
    await control('/fees/refuse', { session_id: s.checkout.stripeSessionId, refuse: false });
    const sent = (await sdk().events.list({ type: 'payment_intent.succeeded', limit: 100 })).data.find((e) => (e.data.object as Stripe.PaymentIntent).id === payment.stripePaymentIntentId)!;
    for (const n of [1, 2]) {
      const payload = JSON.stringify({ ...sent, id: `${sent.id}_later_${n}` });
      const header = sdk().webhooks.generateTestHeaderString({ payload, secret: inject('stripeWebhookSecret') });
      expect((await request(app).post('/api/webhooks/stripe').set('Content-Type', 'application/json').set('Stripe-Signature', header).send(payload)).status).toBe(200);
      await expect.poll(async () => (await Payment.findByPk(payment.id))!.feeCents, { timeout: 15_000 }).toBe(FEE_CENTS);
    }
    await expect.poll(async () => (await StripeEvent.count({ where: { id: [`${sent.id}_later_1`, `${sent.id}_later_2`], processedAt: { [Op.ne]: null } } })), { timeout: 15_000 }).toBe(2);
    const after = (await s.office.get(`/api/bookings/${s.booking.id}/ledger`)).body as { entries: { kind: string; lines: LedgerLine[] }[] };
    expect(after.entries.filter((e) => e.kind === 'card_fee')).toHaveLength(1);
    expect(await Payment.count({ where: { stripePaymentIntentId: payment.stripePaymentIntentId! } })).toBe(1);
  });

  it('when the fee entry cannot be posted (no account has the fee role), the payment stands with the fee unknown', async () => {
    const s = await setup();
    // The company took the role off its 6100 account; the default chart cannot add another 6100.
    expect((await Account.update({ systemKey: null }, { where: { organizationId: s.organization.id, systemKey: 'card_processing_fees' } }))[0]).toBe(1);
    const payment = await payAndWait(s.checkout, s.invoice.id);
    expect(payment).toMatchObject({ method: 'card', amountCents: PAID_CENTS, feeCents: null });
    const ledger = (await s.office.get(`/api/bookings/${s.booking.id}/ledger`)).body as { entries: { kind: string }[] };
    expect(ledger.entries.filter((e) => e.kind === 'card_fee')).toHaveLength(0);
    expect(ledger.entries.filter((e) => e.kind === 'payment_received')).toHaveLength(1);
    const tb = (await s.office.get(`/api/ledger/trial-balance?at=${s.today}`)).body as { totalDebitCents: number; totalCreditCents: number; accounts: TrialRow[] };
    expect(tb.totalDebitCents).toBe(tb.totalCreditCents);
    expect(tb.accounts.find((a) => a.name === 'Card clearing')!.debitCents).toBe(PAID_CENTS);
  });
});
