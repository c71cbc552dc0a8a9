/**
 * A pulled plug: the server is killed with SIGKILL while it sends 100 e-mails and takes card
 * webhooks for 50 payments (100 events), then started again. Afterwards every job has finished,
 * every event is handled once, no payment is counted twice, the ledger balances, and no e-mail
 * is lost or sent twice, except in the one window that SMTP cannot close (the server accepted a
 * message and the worker died before it could write that down): there a copy goes out again,
 * with the same Message-ID, and the delivery row says so (services/mailer.ts deliverOnce).
 *
 * The app runs as production does (`node --import tsx server/index.ts`) on a database of this
 * file's own, with its own mail sink and card-processor fake.
 */
import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AppProcess, caughtMail, countByRecipientAndSubject, freePort, freshDatabase, pollUntil, RemoteClient } from './support';

// A short job time limit and a maintenance pass every second, so a job the kill left started
// is taken over within seconds rather than the production ten minutes (JOB_TIMEOUT_SECONDS).
const JOBS_ENV = { JOB_TIMEOUT_SECONDS: '20', JOB_MAINTENANCE_SECONDS: '1' };
const db = await freshDatabase('kill');
Object.assign(process.env, { DATABASE_URL: db.url, ...JOBS_ENV });

const { migrate } = await import('../../../server/cli');
const { sequelize } = await import('../../../server/db');
const { CardCheckout } = await import('../../../server/models');
const { queueMail } = await import('../../../server/services/mailer');
const { startMailSink } = await import('../../../server/fakes/mailSink');
const { startCardFake } = await import('../../../server/fakes/stripe');
const { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } = await import('../../factories');

const MAILS = 100;
const INVOICES = 10;
const CHECKOUTS_PER_INVOICE = 5;
const PAYMENTS = INVOICES * CHECKOUTS_PER_INVOICE;
/** Issuing an invoice e-mails it; each payment e-mails a receipt. */
const DOCUMENT_MAILS = INVOICES + PAYMENTS;
/** A paid checkout sends payment_intent.succeeded and checkout.session.completed. */
const EVENTS = PAYMENTS * 2;
/** Mail workers that can be cut off mid-send by one kill: WORKERS_PER_QUEUE for send-mail and send-document. */
const MAIL_WORKERS = 2 * 2;

let sink: Awaited<ReturnType<typeof startMailSink>>;
let card: Awaited<ReturnType<typeof startCardFake>>;
let app: AppProcess;

const rows = <T>(sql: string, replacements: Record<string, unknown> = {}) => sequelize.query(sql, { replacements, type: 'SELECT' }) as Promise<T[]>;
const count = async (sql: string, replacements: Record<string, unknown> = {}) => Number((await rows<{ n: string }>(sql, replacements))[0].n);

beforeAll(async () => {
  await migrate(() => {});
  sink = await startMailSink({ smtpPort: 0, httpPort: 0 });
  const port = await freePort();
  const webhookSecret = `whsec_faults_${randomBytes(16).toString('hex')}`;
  const apiKey = 'sk_test_guyline_faults';
  // The processor retries a delivery that failed (the app was dead) for longer than a restart takes.
  card = await startCardFake({
    port: 0, webhookUrl: `http://127.0.0.1:${port}/api/webhooks/stripe`, webhookSecret, apiKey,
    retryDelaysMs: [200, 500, 1000, 2000, 3000, 5000, 8000, 13_000, 21_000, 34_000],
  });
  app = new AppProcess('app', port, {
    DATABASE_URL: db.url, SMTP_URL: sink.smtpUrl, MAIL_SINK_URL: sink.httpUrl,
    STRIPE_SECRET_KEY: apiKey, STRIPE_API_URL: card.url, STRIPE_WEBHOOK_SECRET: webhookSecret, ...JOBS_ENV,
  });
  await app.start();
});

afterAll(async () => {
  await app?.stop();
  await card?.close();
  await sink?.close();
  const { stopBoss } = await import('../../../server/services/jobs');
  await stopBoss();
  // FORCE ends this file's own idle connections too; tests/setup.ts then closes the pool.
  await db.drop();
}, 60_000);

/** Ten issued balance invoices of $600, each with five part-payment checkouts open on the card fake. */
async function openCheckouts() {
  const c = await buildCompany();
  const tent = await buildItem(c.organization.id, { name: '20x20 frame tent', kind: 'tent', tentType: 'frame', widthFt: 20, lengthFt: 20, quantityOwned: 100, rentalPriceCents: 60_000 });
  const office = await new RemoteClient().signIn(app.url, c.office.email, TEST_PASSWORD);
  const sessions: string[] = [];
  const customers: { email: string }[] = [];
  for (let i = 0; i < INVOICES; i++) {
    const email = `payer-${i}.${process.pid}@example.test`;
    const customer = await buildCustomer(c.organization.id, { name: `Payer ${i}`, email });
    customers.push({ email });
    const booking = await office.post(`${app.url}/api/bookings`, bookingBody(customer.id, '2027-09-18', [{ itemId: tent.id, quantity: 1, unitPriceCents: 60_000, description: '20x20 frame tent' }], { taxRateBp: 0, damageWaiver: false }));
    expect(booking.status).toBe(201);
    const draft = await office.post(`${app.url}/api/bookings/${booking.body.id}/invoices`, { kind: 'balance' });
    const issued = await office.post(`${app.url}/api/invoices/${draft.body.id}/issue`);
    expect(issued.status).toBe(200);
    for (let k = 0; k < CHECKOUTS_PER_INVOICE; k++) {
      const started = await office.post(`${app.url}/api/invoices/${issued.body.id}/checkout`, { amountCents: 5_000 + 100 * i + k });
      expect(started.status).toBe(201);
      sessions.push((await CardCheckout.findByPk(started.body.checkoutId))!.stripeSessionId!);
    }
  }
  return { ...c, office, sessions, customers };
}

/** The payer's card goes through on the fake's page; the fake then sends its two events. */
async function pay(sessionId: string) {
  const res = await fetch(`${card.url}/_fake/sessions/${sessionId}/pay`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ cardNumber: '4242424242424242', expiry: '12/34', cvc: '123' }),
  });
  expect(((await res.json()) as { outcome: string }).outcome).toBe('succeeded');
}

describe('SIGKILL while mail goes out and webhooks come in', () => {
  it('after a restart every job finishes once, no payment counts twice, the ledger balances and no e-mail is lost or doubled outside the SMTP window', { timeout: 240_000 }, async () => {
    const s = await openCheckouts();
    const amounts = await rows<{ sum: string }>(`SELECT sum(amount_cents) AS sum FROM card_checkouts WHERE organization_id = :org`, { org: s.organization.id });
    const paidTotal = Number(amounts[0].sum);

    // Work for the workers: the mail, and the first half of the payments.
    for (let i = 0; i < MAILS; i++) {
      await queueMail(s.organization.id, `kill-${i}.${process.pid}@example.test`, 'portal-sign-in', { companyName: 'Kill test company', link: `${app.url}/portal/welcome?token=t${i}` });
    }
    for (const session of s.sessions.slice(0, PAYMENTS / 2)) await pay(session);

    // Kill once mail is going out and payments are being handled, long before either is done.
    await pollUntil('the first mail to reach the sink', async () => (await caughtMail(sink.httpUrl)).length >= 15, { tries: 600, everyMs: 50 });
    await app.kill();
    const sentBeforeKill = (await caughtMail(sink.httpUrl)).length;
    const handledBeforeKill = await count(`SELECT count(*) AS n FROM stripe_events WHERE processed_at IS NOT NULL`);
    expect(sentBeforeKill).toBeLessThan(MAILS);
    expect(handledBeforeKill).toBeLessThan(EVENTS);

    // The other half is paid while the app is down: the processor's deliveries fail and are retried.
    for (const session of s.sessions.slice(PAYMENTS / 2)) await pay(session);
    await app.start();

    // Everything finishes by itself: looked at every half second, for at most four minutes.
    const progress = async () => ({
      jobs: await rows<{ name: string; state: string; n: string }>(`SELECT name, state, count(*) AS n FROM pgboss.job WHERE name IN ('send-mail', 'send-document', 'card-event') GROUP BY 1, 2 ORDER BY 1, 2`),
      events: await count(`SELECT count(*) AS n FROM stripe_events`),
      handled: await count(`SELECT count(*) AS n FROM stripe_events WHERE processed_at IS NOT NULL`),
      sends: await count(`SELECT count(*) AS n FROM document_sends WHERE organization_id = :org AND status = 'sent'`, { org: s.organization.id }),
      caught: (await caughtMail(sink.httpUrl)).length,
      appLog: app.tail(15),
    });
    await pollUntil('every job to finish after the restart', async () => {
      const p = await progress();
      return p.jobs.every((j) => j.state === 'completed') && p.handled === EVENTS && p.sends === DOCUMENT_MAILS;
    }, { tries: 360, everyMs: 500, state: progress });

    // Card webhooks: every event stored once and handled once; one payment per payment intent.
    expect(await count(`SELECT count(*) AS n FROM stripe_events`)).toBe(EVENTS);
    expect(await count(`SELECT count(*) AS n FROM card_checkouts WHERE organization_id = :org AND status = 'paid'`, { org: s.organization.id })).toBe(PAYMENTS);
    expect(await count(`SELECT count(*) AS n FROM payments WHERE organization_id = :org`, { org: s.organization.id })).toBe(PAYMENTS);
    expect(await count(`SELECT count(DISTINCT stripe_payment_intent_id) AS n FROM payments WHERE organization_id = :org`, { org: s.organization.id })).toBe(PAYMENTS);
    expect(await count(`SELECT coalesce(sum(paid_cents), 0) AS n FROM invoices WHERE organization_id = :org`, { org: s.organization.id })).toBe(paidTotal);
    expect(await count(`SELECT count(*) AS n FROM pgboss.job WHERE name IN ('send-mail', 'send-document', 'card-event') AND state = 'failed'`)).toBe(0);

    // The ledger: every entry balanced, and the card money in card clearing exactly once.
    expect(await count(`SELECT count(*) AS n FROM (SELECT entry_id FROM journal_lines WHERE organization_id = :org GROUP BY entry_id HAVING sum(debit_cents) <> sum(credit_cents)) x`, { org: s.organization.id })).toBe(0);
    const today = new Date().toISOString().slice(0, 10);
    const tb = (await s.office.get(`${app.url}/api/ledger/trial-balance?at=${today}`)).body;
    expect(tb.totalDebitCents).toBe(tb.totalCreditCents);
    // Less the processor's fees, each booked once (Dr Card processing fees, Cr Card clearing).
    const fees = await count(`SELECT coalesce(sum(fee_cents), 0) AS n FROM payments WHERE organization_id = :org`, { org: s.organization.id });
    expect(await count(`SELECT count(*) AS n FROM journal_entries WHERE organization_id = :org AND kind = 'card_fee'`, { org: s.organization.id }))
      .toBe(await count(`SELECT count(*) AS n FROM payments WHERE organization_id = :org AND fee_cents > 0`, { org: s.organization.id }));
    expect(tb.accounts.find((a: { name: string }) => a.name === 'Card clearing').debitCents).toBe(paidTotal - fees);

    // Mail: each queued mail and each receipt reached the sink; a second copy only where a worker
    // died between the server's acceptance and writing it down (the delivery row's `interrupted`).
    const deliveries = await rows<{ key: string; status: string; interrupted: number }>(`SELECT key, status, interrupted FROM mail_deliveries`);
    expect(deliveries).toHaveLength(MAILS + DOCUMENT_MAILS);
    expect(deliveries.filter((d) => d.status !== 'sent')).toEqual([]);
    const interrupted = deliveries.reduce((n, d) => n + d.interrupted, 0);
    expect(interrupted).toBeLessThanOrEqual(MAIL_WORKERS);

    const caught = await caughtMail(sink.httpUrl);
    const counts = countByRecipientAndSubject(caught);
    for (let i = 0; i < MAILS; i++) {
      expect(counts.get(`kill-${i}.${process.pid}@example.test | Your sign-in link for your rentals with Kill test company`), `mail ${i}`).toBeGreaterThanOrEqual(1);
    }
    const receipts = caught.filter((m) => /^Receipt /.test(m.subject));
    expect(new Set(receipts.map((m) => m.subject)).size).toBe(PAYMENTS);
    const extraCopies = [...counts.values()].reduce((n, c) => n + (c - 1), 0);
    expect(extraCopies).toBeLessThanOrEqual(interrupted);
    expect(caught).toHaveLength(MAILS + DOCUMENT_MAILS + extraCopies);
  });
});
