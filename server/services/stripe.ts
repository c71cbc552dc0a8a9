import Stripe from 'stripe';
import { env } from '../env';

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
