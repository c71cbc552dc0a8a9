import express, { Router, type ErrorRequestHandler, type Response } from 'express';
import type { Payments, PayOutcome } from './payments';
import { failRefund } from './refunds';
import { snapshot, type SessionRecord } from './store';
import type { WebhookDispatcher } from './webhooks';

/** Control errors use the project's own shape: `{ error: { code, message } }`. */
class ControlError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
  ) {
    super(message);
  }
}

function body(req: express.Request): Record<string, unknown> {
  return (req.body && typeof req.body === 'object' ? req.body : {}) as Record<string, unknown>;
}

function delays(value: unknown): number[] | undefined {
  if (value === undefined) return undefined;
  if (!Array.isArray(value) || !value.every((n) => Number.isInteger(n) && n >= 0)) {
    throw new ControlError(400, 'invalid_retry_delays', 'retryDelaysMs must be a list of whole milliseconds, e.g. [200, 1000].');
  }
  return value as number[];
}

/**
 * Test controls under `/_fake` (never under /v1, no API key): read the events sent and their
 * delivery attempts, point the webhooks somewhere else, resend an event, pay or expire a session
 * without a browser, fail a refund, refuse a payment's fee lookup, and start over.
 */
export function controlRouter(payments: Payments, webhooks: WebhookDispatcher, o: { baseUrl: () => string; reset: () => void }): Router {
  const router = Router();
  const store = payments.store;
  router.use(express.json({ limit: '64kb' }));
  router.use(express.urlencoded({ extended: true, limit: '64kb' }));

  const loadSession = (id: string): SessionRecord => {
    const record = store.sessions.get(id);
    if (!record) throw new ControlError(404, 'not_found', `No checkout session ${id}.`);
    return record;
  };
  const deliveriesOf = (eventId: string) => webhooks.forEvent(eventId);
  const webhookState = () => {
    const e = webhooks.getEndpoint();
    return {
      url: e?.url ?? null,
      secretSet: !!e?.secret,
      enabledEvents: e?.enabledEvents ?? [],
      retryDelaysMs: webhooks.options.retryDelaysMs,
      shuffle: webhooks.options.shuffle,
      duplicate: webhooks.options.duplicate,
    };
  };
  const answer = (res: Response, record: SessionRecord, result: PayOutcome) => {
    const s = record.session;
    const pi = typeof s.payment_intent === 'string' ? store.paymentIntents.get(s.payment_intent) : undefined;
    res.json({
      outcome: result.outcome,
      redirect_url: result.outcome === 'succeeded' ? result.redirectUrl : null,
      authenticate_url: result.outcome === 'requires_action' ? result.authenticateUrl : null,
      error: result.outcome === 'declined' ? result.error : null,
      errors: result.outcome === 'invalid' ? result.errors : [],
      message: result.outcome === 'unavailable' || result.outcome === 'nothing_to_authenticate' ? result.message : null,
      session: snapshot(s),
      payment_intent: pi ? snapshot(pi) : null,
    });
  };
  const authenticate = (res: Response, piId: string, choice: unknown) => {
    if (choice !== 'complete' && choice !== 'fail') {
      throw new ControlError(400, 'invalid_result', 'Say how the authentication ends: result "complete" or "fail".');
    }
    const pi = store.paymentIntents.get(piId);
    if (!pi) throw new ControlError(404, 'not_found', `No payment intent ${piId}.`);
    const result = payments.authenticate(pi, choice);
    const sessionId = payments.sessionIdOf(pi);
    if (result.outcome === 'nothing_to_authenticate') throw new ControlError(409, 'nothing_to_authenticate', result.message);
    if (result.outcome === 'intent') return res.json({ outcome: result.result, payment_intent: snapshot(pi) });
    return answer(res, loadSession(sessionId!), result);
  };

  router.get('/', (_req, res) => {
    res.json({
      url: o.baseUrl(),
      webhook: webhookState(),
      counts: {
        sessions: store.sessions.size,
        paymentIntents: store.paymentIntents.size,
        refunds: store.refunds.size,
        events: store.events.size,
      },
    });
  });

  router.get('/events', (req, res) => {
    const type = typeof req.query.type === 'string' ? req.query.type : undefined;
    const events = [...store.events.values()].reverse().filter((e) => type === undefined || e.type === type);
    res.json({
      data: events.map((e) => ({
        id: e.id,
        type: e.type,
        created: e.created,
        object_id: (e.data.object as { id: string }).id,
        pending_webhooks: e.pending_webhooks,
        deliveries: deliveriesOf(e.id),
      })),
    });
  });

  router.get('/events/:id', (req, res) => {
    const event = store.events.get(req.params.id);
    if (!event) throw new ControlError(404, 'not_found', `No event ${req.params.id}.`);
    res.json({ event, deliveries: deliveriesOf(event.id) });
  });

  router.get('/deliveries', (_req, res) => {
    res.json({ data: [...webhooks.list()].reverse() });
  });

  router.post('/deliveries/redeliver', (req, res) => {
    const b = body(req);
    const eventId = String(b.event_id ?? b.eventId ?? '');
    const event = store.events.get(eventId);
    if (!event) throw new ControlError(404, 'not_found', `No event ${eventId}. Send { "event_id": "evt_..." }.`);
    const delivery = webhooks.redeliver(event);
    if (!delivery) throw new ControlError(409, 'no_webhook', 'No webhook endpoint is set; PUT /_fake/webhook first.');
    res.json({ delivery });
  });

  const setWebhook: express.RequestHandler = (req, res) => {
    const b = body(req);
    const url = typeof b.url === 'string' && b.url !== '' ? b.url : null;
    const secret = typeof b.secret === 'string' ? b.secret : (webhooks.getEndpoint()?.secret ?? '');
    if (url !== null) {
      try {
        new URL(url);
      } catch {
        throw new ControlError(400, 'invalid_url', `Not a URL: ${url}.`);
      }
      if (!secret) throw new ControlError(400, 'missing_secret', 'A webhook needs its signing secret: send { "url", "secret" }.');
    }
    const enabled = Array.isArray(b.enabledEvents) ? b.enabledEvents.map(String) : (webhooks.getEndpoint()?.enabledEvents ?? ['*']);
    webhooks.setEndpoint(url ? { url, secret, enabledEvents: enabled } : null);
    const retry = delays(b.retryDelaysMs);
    if (retry) webhooks.options.retryDelaysMs = retry;
    if (typeof b.shuffle === 'boolean') webhooks.options.shuffle = b.shuffle;
    if (typeof b.duplicate === 'boolean') webhooks.options.duplicate = b.duplicate;
    res.json(webhookState());
  };
  router.get('/webhook', (_req, res) => res.json(webhookState()));
  router.put('/webhook', setWebhook);
  router.post('/webhook', setWebhook);

  router.post('/sessions/:id/pay', (req, res) => {
    const record = loadSession(req.params.id);
    const b = body(req);
    const result = payments.paySession(record, b);
    const auth = b.authentication ?? b.authenticate;
    if (result.outcome === 'requires_action' && auth !== undefined) {
      return authenticate(res, record.session.payment_intent as string, auth);
    }
    answer(res, record, result);
  });

  router.post('/sessions/:id/authenticate', (req, res) => {
    const record = loadSession(req.params.id);
    if (typeof record.session.payment_intent !== 'string') {
      throw new ControlError(409, 'nothing_to_authenticate', 'Nobody has tried to pay this session yet.');
    }
    authenticate(res, record.session.payment_intent, body(req).result);
  });

  router.post('/payment_intents/:id/authenticate', (req, res) => {
    authenticate(res, req.params.id, body(req).result);
  });

  router.post('/sessions/:id/expire', (req, res) => {
    const record = loadSession(req.params.id);
    payments.sweepExpired();
    if (record.session.status !== 'open') {
      throw new ControlError(409, 'not_open', `The session is ${record.session.status}; only open sessions expire.`);
    }
    payments.expireSession(record, { id: null, idempotency_key: null });
    res.json({ session: snapshot(record.session) });
  });

  router.post('/refunds/:id/fail', (req, res) => {
    const refund = store.refunds.get(req.params.id);
    if (!refund) throw new ControlError(404, 'not_found', `No refund ${req.params.id}.`);
    if (refund.status === 'failed') throw new ControlError(409, 'already_failed', 'This refund has already failed.');
    const reason = typeof body(req).failure_reason === 'string' ? (body(req).failure_reason as string) : 'declined';
    failRefund(payments, refund, reason);
    res.json({ refund: snapshot(refund) });
  });

  // The fee of a session's or payment intent's charges cannot be looked up (a 500 from the API)
  // until `{ "refuse": false }`: the app must record the money anyway, with the fee unknown.
  router.post('/fees/refuse', (req, res) => {
    const b = body(req);
    const id = String(b.session_id ?? b.payment_intent ?? '');
    if (!/^(cs_|pi_)/.test(id)) throw new ControlError(400, 'missing_id', 'Send { "session_id": "cs_..." } or { "payment_intent": "pi_..." }.');
    if (b.refuse === false) store.refusedFeeLookups.delete(id);
    else store.refusedFeeLookups.add(id);
    res.json({ id, refused: store.refusedFeeLookups.has(id) });
  });

  router.post('/reset', (_req, res) => {
    o.reset();
    res.status(204).end();
  });

  router.use((req) => {
    throw new ControlError(404, 'not_found', `No control at ${req.method} ${req.originalUrl}.`);
  });
  const errors: ErrorRequestHandler = (err, _req, res, _next) => {
    if (err instanceof ControlError) return void res.status(err.status).json({ error: { code: err.code, message: err.message } });
    res.status(typeof err?.status === 'number' ? err.status : 500).json({
      error: { code: 'control_failed', message: err instanceof Error ? err.message : String(err) },
    });
  };
  router.use(errors);
  return router;
}
