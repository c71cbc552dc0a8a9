/**
 * Card payments through the processor's hosted page: a checkout per attempt, the webhook events
 * that say what happened (each stored once, handled once, in any order), card refunds confirmed
 * by the processor. Card numbers never reach Guyline.
 */
import type Stripe from 'stripe';
import { Op } from 'sequelize';
import { formatMoney } from '../../shared/money';
import { INVOICE_KIND_LABELS } from '../../shared/schemas/invoices';
import { sequelize, withTransaction, type Transaction } from '../db';
import { conflict, HttpError } from '../errors';
import { logger } from '../logger';
import { cardFeeCharged, postEntry, refundIssued } from '../ledger/post';
import { CardCheckout, Customer, Invoice, Organization, Payment, Refund, StripeEvent, type User } from '../models';
import { queueMail } from '../services/mailer';
import { queueJob } from '../services/jobs';
import { cardFeeOf, cardPaymentsEnabled, stripe } from '../services/stripe';
import { audit } from './audit';
import { recordPayment, reopenInvoices } from './invoices';

/** Who acts when the processor reports a payment: no person, the company itself. Audit rows show no user. */
export function systemActor(organizationId: string): User {
  return { id: null, organizationId, role: 'owner', name: 'Card payments' } as unknown as User;
}

/**
 * A decline in plain words for the customer: what happened and what to do. The codes are the
 * processor's published decline codes; anything else reads as a general decline.
 */
export function plainDecline(error: { code?: string | null; decline_code?: string | null } | null | undefined): string {
  const code = error?.decline_code ?? error?.code ?? '';
  switch (code) {
    case 'insufficient_funds':
      return 'Your card was declined: your bank says there are not enough funds on it. Nothing was charged. Try another card.';
    case 'expired_card':
      return 'Your card has expired. Nothing was charged. Try another card.';
    case 'incorrect_cvc':
    case 'invalid_cvc':
      return 'The security code (CVC) did not match the card. Nothing was charged.';
    case 'incorrect_number':
    case 'invalid_number':
      return 'The card number was not right. Nothing was charged.';
    case 'authentication_required':
    case 'payment_intent_authentication_failure':
      return 'Your bank’s extra check was not completed, so nothing was charged. Try again and complete the check, or use another card.';
    case 'processing_error':
      return 'The card could not be charged just now. Nothing was charged. Please try again in a few minutes.';
    default:
      return 'Your card was declined by your bank. Nothing was charged. Try another card, or call the number on the back of your card.';
  }
}

const payable = (i: Invoice) => i.kind !== 'credit_note' && ['open', 'partly_paid'].includes(i.status);
const balanceOf = (i: Invoice) => i.totalCents - i.paidCents - i.creditedCents;

/**
 * Starts (or resumes) a card payment of an invoice: the whole balance or a part. The same invoice,
 * amount and invoice state give the same checkout and the same hosted page (the idempotency key),
 * so a double click or a retried request never opens two payments.
 */
export async function startCheckout(input: {
  invoiceId: string;
  organizationId: string;
  amountCents?: number;
  startedBy: 'staff' | 'customer' | 'link';
  /** The return page: `${returnBase}/<checkout id>`, with `?cancelled=1` when the payer cancels. */
  returnBase: string;
}): Promise<CardCheckout> {
  if (!cardPaymentsEnabled()) throw new HttpError(503, 'card_payments_off', 'Card payments are not set up for this company yet. Please pay by check or bank transfer, or call us.');
  const checkout = await withTransaction(async (t) => {
    const invoice = await Invoice.findOne({ where: { id: input.invoiceId, organizationId: input.organizationId }, transaction: t, lock: t.LOCK.UPDATE });
    if (!invoice) throw new HttpError(404, 'not_found', 'That invoice was not found.');
    const { currency } = (await Organization.findByPk(invoice.organizationId, { transaction: t }))!;
    if (!payable(invoice)) throw conflict(`Invoice ${invoice.number ?? ''} has nothing to pay.`.replace('  ', ' '), 'nothing_to_pay');
    const balance = balanceOf(invoice);
    const amount = input.amountCents ?? balance;
    if (amount > balance) throw conflict(`At most ${formatMoney(balance, currency)} is due on this invoice.`, 'more_than_due', { amountCents: `At most ${formatMoney(balance, currency)}.` });
    if (amount < 50) throw conflict('Card payments start at $0.50.', 'too_small', { amountCents: 'At least $0.50.' });
    const key = `guyline-checkout-${invoice.id}-${amount}-${invoice.paidCents}-${invoice.creditedCents}`;
    const same = await CardCheckout.findOne({
      where: { invoiceId: invoice.id, idempotencyKey: key, status: { [Op.in]: ['open', 'failed'] }, createdAt: { [Op.gt]: new Date(Date.now() - 20 * 3600_000) } },
      order: [['createdAt', 'DESC']],
      transaction: t,
    });
    if (same) return same;
    return CardCheckout.create(
      { organizationId: invoice.organizationId, invoiceId: invoice.id, bookingId: invoice.bookingId, customerId: invoice.customerId, amountCents: amount, currency, startedBy: input.startedBy, idempotencyKey: key },
      { transaction: t },
    );
  });
  if (checkout.url && checkout.stripeSessionId) return checkout;

  const invoice = (await Invoice.findByPk(checkout.invoiceId))!;
  const organization = (await Organization.findByPk(checkout.organizationId))!;
  const customer = (await Customer.findByPk(checkout.customerId))!;
  const metadata = { checkoutId: checkout.id, invoiceId: invoice.id, organizationId: organization.id };
  let session: Stripe.Checkout.Session;
  try {
    session = await stripe().checkout.sessions.create(
      {
        mode: 'payment',
        line_items: [
          {
            quantity: 1,
            price_data: {
              currency: checkout.currency.toLowerCase(),
              unit_amount: checkout.amountCents,
              product_data: { name: `${INVOICE_KIND_LABELS[invoice.kind]} ${invoice.number}, ${organization.name}` },
            },
          },
        ],
        success_url: `${input.returnBase}/${checkout.id}`,
        cancel_url: `${input.returnBase}/${checkout.id}?cancelled=1`,
        client_reference_id: checkout.id,
        ...(customer.email ? { customer_email: customer.email } : {}),
        metadata,
        payment_intent_data: { metadata },
        // The hosted page stays open for a day (the processor's longest).
        expires_at: Math.floor(Date.now() / 1000) + 23 * 3600,
      },
      { idempotencyKey: checkout.idempotencyKey },
    );
  } catch (err) {
    logger.warn({ err: (err as Error).message, checkoutId: checkout.id }, 'checkout session not created');
    throw new HttpError(502, 'card_processor_unavailable', 'The card payment page could not be opened just now. Please try again in a minute.');
  }
  await checkout.update({ stripeSessionId: session.id, url: session.url, stripePaymentIntentId: typeof session.payment_intent === 'string' ? session.payment_intent : null });
  return checkout;
}

/** Stores a verified webhook event once by its id and queues its handling in the same transaction. */
export async function receiveEvent(event: Stripe.Event): Promise<{ duplicate: boolean }> {
  return withTransaction(async (t) => {
    const [rows] = (await sequelize.query(
      `INSERT INTO stripe_events (id, type, payload) VALUES (:id, :type, CAST(:payload AS jsonb)) ON CONFLICT (id) DO NOTHING RETURNING id`,
      { replacements: { id: event.id, type: event.type, payload: JSON.stringify(event) }, transaction: t },
    )) as [{ id: string }[], unknown];
    if (rows.length === 0) {
      await sequelize.query(`UPDATE stripe_events SET deliveries = deliveries + 1 WHERE id = :id`, { replacements: { id: event.id }, transaction: t });
      return { duplicate: true };
    }
    await queueJob('card-event', { eventId: event.id }, t);
    return { duplicate: false };
  });
}

/** The payment intent an event says was paid, if it says so. */
function paidIntentOf(event: Stripe.Event): { intentId: string; currency: string | null } | null {
  if (event.type === 'checkout.session.completed') {
    const session = event.data.object;
    return session.payment_status === 'paid' && typeof session.payment_intent === 'string' ? { intentId: session.payment_intent, currency: session.currency ?? null } : null;
  }
  if (event.type === 'payment_intent.succeeded') return { intentId: event.data.object.id, currency: event.data.object.currency ?? null };
  return null;
}

/**
 * For an event that says a card payment went through: the processor's fee on it, asked for before
 * the handling's transaction so no row stays locked while the processor answers. Undefined when
 * there is nothing to ask (another event, already handled, the fee already known); null when the
 * processor could not tell.
 */
async function feeForEvent(eventId: string): Promise<number | null | undefined> {
  const row = await StripeEvent.findByPk(eventId, { attributes: ['id', 'payload', 'processedAt'] });
  if (!row || row.processedAt) return undefined;
  const paid = paidIntentOf(row.payload as unknown as Stripe.Event);
  if (!paid) return undefined;
  const known = await Payment.findOne({ where: { stripePaymentIntentId: paid.intentId, feeCents: { [Op.ne]: null } }, attributes: ['id'] });
  if (known) return undefined;
  const checkout = await CardCheckout.findOne({ where: { stripePaymentIntentId: paid.intentId }, attributes: ['currency'] });
  return cardFeeOf(paid.intentId, checkout?.currency ?? paid.currency);
}

/** Handles a stored event once: the row is locked and marked processed in the handling's own transaction. */
export async function processEvent(eventId: string): Promise<void> {
  const fee = await feeForEvent(eventId);
  await withTransaction(async (t) => {
    const row = await StripeEvent.findByPk(eventId, { transaction: t, lock: t.LOCK.UPDATE });
    if (!row || row.processedAt) return;
    const event = row.payload as unknown as Stripe.Event;
    switch (event.type) {
      case 'checkout.session.completed': {
        const session = event.data.object;
        if (session.payment_status === 'paid' && typeof session.payment_intent === 'string') {
          await cardPaid(session.metadata?.checkoutId ?? session.client_reference_id ?? null, session.id, session.payment_intent, session.amount_total ?? 0, null, fee, t);
        }
        break;
      }
      case 'payment_intent.succeeded': {
        const intent = event.data.object;
        const charge = typeof intent.latest_charge === 'string' ? intent.latest_charge : (intent.latest_charge?.id ?? null);
        await cardPaid(intent.metadata?.checkoutId ?? null, null, intent.id, intent.amount_received, charge, fee, t);
        break;
      }
      case 'payment_intent.payment_failed': {
        const intent = event.data.object;
        await cardFailed(intent.metadata?.checkoutId ?? null, intent.id, plainDecline(intent.last_payment_error), t);
        break;
      }
      case 'checkout.session.expired': {
        const session = event.data.object;
        const checkout = await findCheckout(session.metadata?.checkoutId ?? null, session.id, null, t);
        if (checkout && checkout.status !== 'paid') await checkout.update({ status: 'expired' }, { transaction: t });
        break;
      }
      case 'charge.refunded':
      case 'refund.created':
      case 'refund.updated':
      case 'refund.failed': {
        const object = event.data.object as Stripe.Charge | Stripe.Refund;
        const intent = typeof object.payment_intent === 'string' ? object.payment_intent : (object.payment_intent?.id ?? null);
        if (intent) await settleRefunds(intent, t);
        break;
      }
      default:
        break;
    }
    row.processedAt = new Date();
    await row.save({ transaction: t });
  });
}

async function findCheckout(checkoutId: string | null, sessionId: string | null, intentId: string | null, t: Transaction) {
  const or = [
    ...(checkoutId && /^[0-9a-f-]{36}$/i.test(checkoutId) ? [{ id: checkoutId }] : []),
    ...(sessionId ? [{ stripeSessionId: sessionId }] : []),
    ...(intentId ? [{ stripePaymentIntentId: intentId }] : []),
  ];
  if (!or.length) return null;
  return CardCheckout.findOne({ where: { [Op.or]: or }, transaction: t, lock: t.LOCK.UPDATE });
}

/**
 * The money is in: record the payment once (the payment intent's id is unique on payments), on
 * the checkout's invoice. The money was taken whatever happened meanwhile, so nothing is refused:
 * what the invoice no longer owes becomes the customer's account credit. The processor's fee goes
 * in with it when known; a payment recorded with its fee unknown gets it from a later event.
 */
async function cardPaid(
  checkoutId: string | null, sessionId: string | null, intentId: string, amountCents: number, chargeId: string | null, fee: number | null | undefined, t: Transaction,
) {
  const checkout = await findCheckout(checkoutId, sessionId, intentId, t);
  if (!checkout) {
    logger.warn({ intentId }, 'card payment for an unknown checkout');
    return;
  }
  const existing = await Payment.findOne({ where: { stripePaymentIntentId: intentId }, transaction: t, lock: t.LOCK.UPDATE });
  if (existing) {
    if (chargeId && !existing.stripeChargeId) await existing.update({ stripeChargeId: chargeId }, { transaction: t });
    if (existing.feeCents === null && fee != null) await bookCardFee(existing, fee, t);
    if (checkout.status !== 'paid') await checkout.update({ status: 'paid', paymentId: existing.id, message: null }, { transaction: t });
    return;
  }
  const actor = systemActor(checkout.organizationId);
  const payment = await recordPayment(
    actor,
    {
      method: 'card', reference: intentId, receivedAt: new Date(), allocations: [{ invoiceId: checkout.invoiceId, amountCents: amountCents || checkout.amountCents }],
      fieldFor: () => 'amountCents', moneyAlreadyTaken: true,
    },
    null,
    t,
  );
  await payment.update({ stripePaymentIntentId: intentId, stripeChargeId: chargeId }, { transaction: t });
  if (fee != null) await bookCardFee(payment, fee, t);
  await checkout.update({ status: 'paid', paymentId: payment.id, stripePaymentIntentId: intentId, message: null }, { transaction: t });
}

/**
 * The processor's fee on a card payment: stored on the payment and posted as its own entry
 * (Dr card processing fees, Cr card clearing). In a savepoint: should the entry be refused (the
 * company took the fee role off its accounts, say), the payment still stands, with the fee unknown.
 */
async function bookCardFee(payment: Payment, feeCents: number, t: Transaction) {
  try {
    await sequelize.transaction({ transaction: t }, async (savepoint) => {
      if (feeCents > 0) {
        await postEntry(
          {
            organizationId: payment.organizationId, bookingId: payment.bookingId, customerId: payment.customerId,
            memo: `Card processing fee on card payment ${payment.reference}`, occurredAt: payment.receivedAt,
            // A fee reported after the payment's period was closed is booked today (periods.ts).
            whenClosed: 'post_today',
            source: { type: 'payment', id: payment.id }, createdById: null, ...cardFeeCharged(feeCents),
          },
          savepoint,
        );
      }
      await Payment.update({ feeCents }, { where: { id: payment.id }, transaction: savepoint });
    });
    payment.setDataValue('feeCents', feeCents);
  } catch (err) {
    logger.warn({ paymentId: payment.id, feeCents, err: (err as Error).message }, 'card fee not booked; the payment stands with its fee unknown');
  }
}

/** A declined attempt: the invoice stays open and the checkout says why, unless it was paid meanwhile. */
async function cardFailed(checkoutId: string | null, intentId: string, message: string, t: Transaction) {
  const checkout = await findCheckout(checkoutId, null, intentId, t);
  if (!checkout || checkout.status === 'paid') return;
  await checkout.update({ status: 'failed', message, stripePaymentIntentId: intentId }, { transaction: t });
}

/**
 * Settles the card refunds of a payment from the processor's own list (so the event's order and
 * shape do not matter): a succeeded refund posts its entry and lowers the invoices' paid amounts
 * once; a failed one is marked failed and the owner is told.
 */
async function settleRefunds(intentId: string, t: Transaction) {
  const payment = await Payment.findOne({ where: { stripePaymentIntentId: intentId }, transaction: t, lock: t.LOCK.UPDATE });
  if (!payment) return;
  const pending = await Refund.findAll({ where: { paymentId: payment.id, status: 'pending' }, transaction: t, lock: t.LOCK.UPDATE });
  if (!pending.length) return;
  const remote = await stripe().refunds.list({ payment_intent: intentId, limit: 100 });
  for (const refund of pending) {
    const match = remote.data.find((r) => r.id === refund.stripeRefundId || r.metadata?.refundId === refund.id);
    if (!match) continue;
    if (match.status === 'succeeded') await confirmRefund(refund, payment, match.id, t);
    else if (match.status === 'failed' || match.status === 'canceled') {
      await refund.update({ status: 'failed', stripeRefundId: match.id, failure: match.failure_reason ?? match.status }, { transaction: t });
      await audit({ organizationId: refund.organizationId, actorUserId: null, action: 'payment.refund_failed', subjectType: 'booking', subjectId: refund.bookingId, data: { refundId: refund.id, reason: match.failure_reason ?? match.status } }, null, t);
    }
  }
}

/** A card refund the processor confirmed: the ledger entry, the invoices owe again, and the customer is told. */
export async function confirmRefund(refund: Refund, payment: Payment, stripeRefundId: string | null, t: Transaction) {
  const entry = await postEntry(
    {
      organizationId: refund.organizationId, bookingId: refund.bookingId, customerId: payment.customerId, memo: `Card refund: ${refund.reason}`.slice(0, 400),
      occurredAt: new Date(), source: { type: 'payment', id: payment.id }, createdById: refund.createdById, ...refundIssued(refund.amountCents, 'card'),
    },
    t,
  );
  await refund.update({ status: 'succeeded', ledgerEntryId: entry.id, stripeRefundId: stripeRefundId ?? refund.stripeRefundId }, { transaction: t });
  await reopenInvoices(payment, refund.amountCents, t);
  const organization = (await Organization.findByPk(refund.organizationId, { transaction: t }))!;
  const customer = (await Customer.findByPk(payment.customerId, { transaction: t }))!;
  if (customer.email) {
    await queueMail(
      refund.organizationId,
      customer.email,
      'card-refund',
      {
        customerName: customer.name,
        companyName: organization.name,
        amount: formatMoney(refund.amountCents, organization.currency),
        reason: refund.reason,
        companyContact: [organization.phone, organization.email].filter(Boolean).join(' · '),
      },
      t,
    );
  }
  await audit({ organizationId: refund.organizationId, actorUserId: null, action: 'payment.refund_confirmed', subjectType: 'booking', subjectId: refund.bookingId, data: { refundId: refund.id, amountCents: refund.amountCents } }, null, t);
}

/** Asks the processor for a card refund (a job, after the refund row is committed); the webhook confirms it. */
export async function requestCardRefund(refundId: string): Promise<void> {
  const refund = await Refund.findByPk(refundId);
  if (!refund || refund.status !== 'pending' || refund.stripeRefundId) return;
  const payment = (await Payment.findByPk(refund.paymentId))!;
  try {
    const remote = await stripe().refunds.create(
      { payment_intent: payment.stripePaymentIntentId!, amount: refund.amountCents, reason: 'requested_by_customer', metadata: { refundId: refund.id } },
      { idempotencyKey: `guyline-refund-${refund.id}` },
    );
    await withTransaction(async (t) => {
      const locked = (await Refund.findByPk(refund.id, { transaction: t, lock: t.LOCK.UPDATE }))!;
      if (!locked.stripeRefundId) await locked.update({ stripeRefundId: remote.id }, { transaction: t });
      // Already settled by the processor: confirm now rather than wait for the event.
      if (locked.status === 'pending' && remote.status === 'succeeded') await confirmRefund(locked, payment, remote.id, t);
    });
  } catch (err) {
    const e = err as { type?: string; message?: string };
    // The processor refused it outright (not a network problem): mark it failed, tell the owner in the audit.
    if (e.type === 'StripeInvalidRequestError' || e.type === 'StripeCardError') {
      await withTransaction(async (t) => {
        await Refund.update({ status: 'failed', failure: (e.message ?? 'refused').slice(0, 500) }, { where: { id: refund.id }, transaction: t });
        await audit({ organizationId: refund.organizationId, actorUserId: null, action: 'payment.refund_failed', subjectType: 'booking', subjectId: refund.bookingId, data: { refundId: refund.id, reason: e.message ?? '' } }, null, t);
      });
      return;
    }
    throw err;
  }
}
