import { createHmac } from 'node:crypto';
import { newId, type FakeEvent } from './store';

/**
 * Posting events to the app's webhook endpoint the way the real service does: the body is the
 * Event as pretty-printed JSON (so an app that re-serializes before verifying fails here too),
 * signed in `Stripe-Signature: t=<unix seconds>,v1=<hex HMAC-SHA256 of "<t>.<body>">` with the
 * endpoint secret, and retried with backoff until the endpoint answers 2xx. Each attempt is
 * signed afresh with its own timestamp. Deliveries run in the background; nothing waits for them.
 */

export function signatureHeader(payload: string, secret: string, timestamp = Math.floor(Date.now() / 1000)): string {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${v1}`;
}

export interface WebhookEndpoint {
  url: string;
  secret: string;
  /** Event types sent to this endpoint; `['*']` for every type. */
  enabledEvents: string[];
}

export interface DeliveryAttempt {
  attempt: number;
  /** When the attempt started, ISO 8601. */
  at: string;
  /** The endpoint's HTTP status, or null when no answer came (refused, timed out). */
  status: number | null;
  error: string | null;
  /** The first 500 characters of the endpoint's answer, to see why it refused. */
  responseBody: string | null;
  durationMs: number;
}

export interface Delivery {
  id: string;
  eventId: string;
  eventType: string;
  url: string;
  /** Why this delivery exists: the event itself, a test's redelivery, or the duplicate option. */
  reason: 'event' | 'redeliver' | 'duplicate';
  state: 'pending' | 'delivered' | 'failed' | 'cancelled';
  attempts: DeliveryAttempt[];
  /** When the next attempt is due, ISO 8601, while pending. */
  nextAttemptAt: string | null;
}

export interface DispatcherOptions {
  /** Waits between attempts; one more attempt than delays. Default: 1 s, 5 s, 30 s, 2 min, 10 min, 30 min, 1 h. */
  retryDelaysMs?: number[];
  /** How long the endpoint has to answer one attempt. Default 10 s. */
  timeoutMs?: number;
  /** Starts each delivery after a random pause of up to 250 ms, so events arrive out of order. */
  shuffle?: boolean;
  /** Sends every event twice, as the real service occasionally does. */
  duplicate?: boolean;
}

export const DEFAULT_RETRY_DELAYS_MS = [1_000, 5_000, 30_000, 120_000, 600_000, 1_800_000, 3_600_000];
const SHUFFLE_WINDOW_MS = 250;

export class WebhookDispatcher {
  private endpoint: WebhookEndpoint | null = null;
  private readonly deliveries: Delivery[] = [];
  private readonly timers = new Set<NodeJS.Timeout>();
  private readonly inFlight = new Set<Promise<void>>();
  private readonly abort = new AbortController();
  private closed = false;
  options: Required<DispatcherOptions>;

  constructor(
    options: DispatcherOptions,
    /** Asks for the current state of the event (its pending_webhooks count is kept there). */
    private readonly lookup: (eventId: string) => FakeEvent | undefined,
  ) {
    this.options = {
      retryDelaysMs: options.retryDelaysMs ?? DEFAULT_RETRY_DELAYS_MS,
      timeoutMs: options.timeoutMs ?? 10_000,
      shuffle: options.shuffle ?? false,
      duplicate: options.duplicate ?? false,
    };
  }

  setEndpoint(endpoint: WebhookEndpoint | null) {
    this.endpoint = endpoint;
  }

  getEndpoint(): WebhookEndpoint | null {
    return this.endpoint;
  }

  /** Whether an event of this type goes anywhere (for its pending_webhooks count). */
  wants(type: string): boolean {
    const e = this.endpoint;
    return !!e && (e.enabledEvents.includes('*') || e.enabledEvents.includes(type));
  }

  list(): Delivery[] {
    return this.deliveries;
  }

  forEvent(eventId: string): Delivery[] {
    return this.deliveries.filter((d) => d.eventId === eventId);
  }

  /** Queues an event for the current endpoint (if it wants that type). */
  dispatch(event: FakeEvent): Delivery[] {
    if (!this.wants(event.type)) return [];
    const out = [this.enqueue(event, 'event')];
    if (this.options.duplicate) out.push(this.enqueue(event, 'duplicate'));
    return out;
  }

  /** Sends an event again, whatever happened to it before; a test proves the app ignores repeats. */
  redeliver(event: FakeEvent): Delivery | null {
    if (!this.endpoint) return null;
    return this.enqueue(event, 'redeliver');
  }

  private enqueue(event: FakeEvent, reason: Delivery['reason']): Delivery {
    const endpoint = this.endpoint!;
    const delivery: Delivery = {
      id: newId.delivery(),
      eventId: event.id,
      eventType: event.type,
      url: endpoint.url,
      reason,
      state: 'pending',
      attempts: [],
      nextAttemptAt: null,
    };
    this.deliveries.push(delivery);
    const firstDelay = this.options.shuffle ? Math.floor(Math.random() * SHUFFLE_WINDOW_MS) : 0;
    this.schedule(delivery, endpoint, firstDelay);
    return delivery;
  }

  private schedule(delivery: Delivery, endpoint: WebhookEndpoint, delayMs: number) {
    if (this.closed) return;
    delivery.nextAttemptAt = new Date(Date.now() + delayMs).toISOString();
    const timer = setTimeout(() => {
      this.timers.delete(timer);
      const run = this.attempt(delivery, endpoint).finally(() => this.inFlight.delete(run));
      this.inFlight.add(run);
    }, delayMs);
    this.timers.add(timer);
  }

  private async attempt(delivery: Delivery, endpoint: WebhookEndpoint) {
    const event = this.lookup(delivery.eventId);
    if (!event || this.closed) return;
    const payload = JSON.stringify(event, null, 2);
    const started = Date.now();
    const record: DeliveryAttempt = {
      attempt: delivery.attempts.length + 1,
      at: new Date(started).toISOString(),
      status: null,
      error: null,
      responseBody: null,
      durationMs: 0,
    };
    delivery.attempts.push(record);
    delivery.nextAttemptAt = null;
    try {
      const res = await fetch(endpoint.url, {
        method: 'POST',
        headers: {
          'Content-Type': 'application/json; charset=utf-8',
          'User-Agent': 'GuylineCardFake/1.0 (webhooks)',
          'Stripe-Signature': signatureHeader(payload, endpoint.secret),
        },
        body: payload,
        redirect: 'manual',
        signal: AbortSignal.any([this.abort.signal, AbortSignal.timeout(this.options.timeoutMs)]),
      });
      record.status = res.status;
      record.responseBody = (await res.text().catch(() => '')).slice(0, 500);
      if (res.status < 200 || res.status >= 300) record.error = `The endpoint answered ${res.status}.`;
    } catch (err) {
      record.error = err instanceof Error ? `${err.name}: ${err.message}` : String(err);
    }
    record.durationMs = Date.now() - started;
    if (this.closed) {
      delivery.state = 'cancelled';
      return;
    }
    if (record.error === null) {
      delivery.state = 'delivered';
      if (event.pending_webhooks > 0 && delivery.reason === 'event') event.pending_webhooks -= 1;
      return;
    }
    const delay = this.options.retryDelaysMs[delivery.attempts.length - 1];
    if (delay === undefined) {
      delivery.state = 'failed';
      return;
    }
    this.schedule(delivery, endpoint, delay);
  }

  /** Stops every pending retry and in-flight attempt. */
  async close() {
    this.closed = true;
    for (const t of this.timers) clearTimeout(t);
    this.timers.clear();
    for (const d of this.deliveries) {
      if (d.state === 'pending') {
        d.state = 'cancelled';
        d.nextAttemptAt = null;
      }
    }
    this.abort.abort();
    await Promise.allSettled([...this.inFlight]);
  }

  reset() {
    for (const t of this.timers) clearTimeout(t);
    this.timers.clear();
    this.deliveries.length = 0;
  }
}
