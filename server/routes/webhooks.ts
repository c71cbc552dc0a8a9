import express, { Router } from 'express';
import type Stripe from 'stripe';
import { receiveEvent } from '../commands/cardPayments';
import { env } from '../env';
import { HttpError } from '../errors';
import { logger } from '../logger';
import { stripe } from '../services/stripe';

/**
 * POST /api/webhooks/stripe: the processor's events. The raw bytes are verified against the
 * signature before anything is parsed (a tampered body or a stale timestamp is a 400), each event
 * is stored once by its id and its handling queued in the same transaction; the answer is 200 for
 * a new event and for a repeat alike, so the processor stops retrying.
 */
export const webhooksRouter = Router();

webhooksRouter.post('/stripe', express.raw({ type: () => true, limit: '1mb' }), async (req, res) => {
  if (!env.STRIPE_WEBHOOK_SECRET || !env.STRIPE_SECRET_KEY) throw new HttpError(503, 'card_payments_off', 'Card payments are not set up.');
  const signature = req.get('stripe-signature') ?? '';
  let event: Stripe.Event;
  try {
    // Five minutes of tolerance, the processor's own default against replays.
    event = stripe().webhooks.constructEvent(req.body as Buffer, signature, env.STRIPE_WEBHOOK_SECRET, 300);
  } catch (err) {
    logger.warn({ err: (err as Error).message }, 'webhook refused');
    throw new HttpError(400, 'bad_signature', 'The webhook signature does not match.');
  }
  const { duplicate } = await receiveEvent(event);
  res.json({ received: true, duplicate });
});
