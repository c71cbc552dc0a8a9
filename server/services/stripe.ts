import Stripe from 'stripe';
import { env } from '../env';
import { logger } from '../logger';

let client: Stripe | null = null;

/** Whether card payments are set up (a key and a webhook secret). */
export const cardPaymentsEnabled = () => !!env.STRIPE_SECRET_KEY && !!env.STRIPE_WEBHOOK_SECRET;

/**
 * The card processor's official SDK. With STRIPE_API_URL it talks to that host (the local fake on
 * loopback in development and tests); without it, to the real service.
 */
export function stripe(): Stripe {
  if (!env.STRIPE_SECRET_KEY) throw new Error('Card payments are not set up: STRIPE_SECRET_KEY is missing.');
  if (!client) {
    const api = env.STRIPE_API_URL ? new URL(env.STRIPE_API_URL) : null;
    client = new Stripe(env.STRIPE_SECRET_KEY, {
      maxNetworkRetries: 2,
      telemetry: false,
      timeout: 20_000,
      ...(api ? { host: api.hostname, port: Number(api.port || (api.protocol === 'https:' ? 443 : 80)), protocol: api.protocol.replace(':', '') as 'http' | 'https' } : {}),
    });
  }
  return client;
}

/**
 * What the processor kept of a card payment: the fee on its charge's balance transaction, in the
 * payment's currency. Null, with a warning, when it cannot be learnt now (the processor did not
 * answer, the charge has no balance transaction yet, or it settled in another currency): the
 * payment is recorded all the same and the fee stays unknown.
 */
export async function cardFeeOf(intentId: string, currency: string | null): Promise<number | null> {
  try {
    const intent = await stripe().paymentIntents.retrieve(intentId, { expand: ['latest_charge.balance_transaction'] });
    const charge = intent.latest_charge;
    const txn = charge && typeof charge === 'object' ? charge.balance_transaction : null;
    if (!txn || typeof txn !== 'object') {
      logger.warn({ intentId }, 'card fee unknown: the charge has no balance transaction yet');
      return null;
    }
    if (currency && txn.currency.toLowerCase() !== currency.toLowerCase()) {
      logger.warn({ intentId, currency, settled: txn.currency }, 'card fee unknown: the payment settled in another currency');
      return null;
    }
    return txn.fee;
  } catch (err) {
    logger.warn({ intentId, err: (err as Error).message }, 'card fee unknown: the processor could not be asked');
    return null;
  }
}
