import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { StoredAnswer } from './api/middleware';
import { createCardFakeApp } from './app';
import { Payments } from './payments';
import { CardFakeStore } from './store';
import { WebhookDispatcher } from './webhooks';

export { passesLuhn, TEST_CARDS } from './cards';
export { signatureHeader } from './webhooks';
export type { Delivery, DeliveryAttempt } from './webhooks';

export interface CardFakeOptions {
  /** 0 picks a free port. */
  port?: number;
  host?: string;
  /** Where events are posted; none until set (here or with setWebhook / PUT /_fake/webhook). */
  webhookUrl?: string;
  /** The endpoint's signing secret (`whsec_...`), the one the app verifies with. */
  webhookSecret: string;
  /** Only this secret key is taken when set; otherwise any `sk_test_...` key. */
  apiKey?: string;
  /** Waits between webhook attempts (one more attempt than delays). Short in tests. */
  retryDelaysMs?: number[];
  /** How long the endpoint has to answer one attempt. Default 10 s. */
  webhookTimeoutMs?: number;
  /** Deliver events after random short pauses, so they arrive out of order. */
  shuffle?: boolean;
  /** Deliver every event twice. */
  duplicate?: boolean;
  /** How long a refund on an asynchronous-refund test card takes to settle or fail. Default 2 s. */
  refundSettleDelayMs?: number;
  /** How often sessions past their expires_at are expired. Default 10 s (also checked on each request). */
  expirySweepMs?: number;
}

export interface CardFake {
  /** `http://127.0.0.1:<port>`: the SDK's host and port, and the base of the payment pages. */
  url: string;
  port: number;
  close(): Promise<void>;
  /** Points the webhooks at another endpoint (null stops sending). Pending retries keep their endpoint. */
  setWebhook(url: string | null, secret?: string): void;
}

/**
 * Starts the local card-payment fake: the API the official SDK talks to, the hosted test card
 * page, webhooks signed as the real service signs them, and test controls under `/_fake`.
 */
export async function startCardFake(options: CardFakeOptions): Promise<CardFake> {
  const host = options.host ?? '127.0.0.1';
  let baseUrl = '';
  const store = new CardFakeStore();
  const webhooks = new WebhookDispatcher(
    {
      retryDelaysMs: options.retryDelaysMs,
      timeoutMs: options.webhookTimeoutMs,
      shuffle: options.shuffle,
      duplicate: options.duplicate,
    },
    (id) => store.events.get(id),
  );
  const setWebhook = (url: string | null, secret = options.webhookSecret) => {
    const enabledEvents = webhooks.getEndpoint()?.enabledEvents ?? ['*'];
    webhooks.setEndpoint(url ? { url, secret, enabledEvents } : null);
  };
  setWebhook(options.webhookUrl ?? null);

  const payments = new Payments(store, webhooks, () => baseUrl, {
    refundSettleDelayMs: options.refundSettleDelayMs ?? 2_000,
  });
  const answers = new Map<string, StoredAnswer>();
  const app = createCardFakeApp({
    payments,
    webhooks,
    answers,
    apiKey: options.apiKey,
    baseUrl: () => baseUrl,
    reset: () => {
      payments.reset();
      webhooks.reset();
      store.reset();
      answers.clear();
    },
  });

  const server = http.createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, host, () => resolve());
  });
  const port = (server.address() as AddressInfo).port;
  baseUrl = `http://${host.includes(':') ? `[${host}]` : host}:${port}`;

  const sweep = setInterval(() => payments.sweepExpired(), options.expirySweepMs ?? 10_000);
  sweep.unref();

  return {
    url: baseUrl,
    port,
    setWebhook,
    async close() {
      clearInterval(sweep);
      payments.close();
      await webhooks.close();
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
    },
  };
}
