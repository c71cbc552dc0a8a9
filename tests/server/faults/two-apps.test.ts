/**
 * More than one machine: two app processes on one database, as behind a load balancer. A session
 * signed in on one works on the other (and ends on both), the sign-in rate limit counts across
 * both, every background job and every webhook event is handled exactly once across both, and
 * reserving the last unit stays race-safe when the two offices are served by different processes.
 */
import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AppProcess, caughtMail, countByRecipientAndSubject, freePort, freshDatabase, pollUntil, RemoteClient, type LogLine } from './support';

const db = await freshDatabase('two_apps');
process.env.DATABASE_URL = db.url;

const { migrate } = await import('../../../server/cli');
const { sequelize } = await import('../../../server/db');
const { Booking, CardCheckout } = await import('../../../server/models');
const { queueMail } = await import('../../../server/services/mailer');
const { startMailSink } = await import('../../../server/fakes/mailSink');
const { signatureHeader, startCardFake } = await import('../../../server/fakes/stripe');
const { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } = await import('../../factories');

let sink: Awaited<ReturnType<typeof startMailSink>>;
let card: Awaited<ReturnType<typeof startCardFake>>;
let a: AppProcess;
let b: AppProcess;
const webhookSecret = `whsec_two_${randomBytes(16).toString('hex')}`;

const count = async (sql: string, replacements: Record<string, unknown> = {}) =>
  Number(((await sequelize.query(sql, { replacements, type: 'SELECT' })) as { n: string }[])[0].n);

beforeAll(async () => {
  await migrate(() => {});
  sink = await startMailSink({ smtpPort: 0, httpPort: 0 });
  const apiKey = 'sk_test_guyline_two_apps';
  card = await startCardFake({ port: 0, webhookSecret, apiKey });
  // The same settings for both, as a deployment gives every process: database, secrets, services.
  const shared = {
    DATABASE_URL: db.url, SMTP_URL: sink.smtpUrl, MAIL_SINK_URL: sink.httpUrl,
    STRIPE_SECRET_KEY: apiKey, STRIPE_API_URL: card.url, STRIPE_WEBHOOK_SECRET: webhookSecret,
  };
  a = new AppProcess('app A', await freePort(), shared);
  b = new AppProcess('app B', await freePort(), shared);
  await Promise.all([a.start(), b.start()]);
});

afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
  await card?.close();
  await sink?.close();
  const { stopBoss } = await import('../../../server/services/jobs');
  await stopBoss();
  await db.drop();
}, 60_000);

/** The ids each app's log says it handled with `msg`, read from the `field` of its log lines. */
function handledBy(app: AppProcess, msg: string, field: string) {
  return app.log().filter((l: LogLine) => l.msg === msg).map((l) => String(l[field]));
}

describe('two app processes on one database', () => {
  it('a session signed in on one works on the other, and signing out on one ends it on both', async () => {
    const c = await buildCompany();
    const browser = await new RemoteClient().signIn(a.url, c.office.email, TEST_PASSWORD);
    const meOnB = await browser.get(`${b.url}/api/auth/me`);
    expect(meOnB.status).toBe(200);
    expect(meOnB.body.user.id).toBe(c.office.id);
    // A write on B with the CSRF token A handed out.
    const created = await browser.post(`${b.url}/api/customers`, { name: 'Maren Holt' });
    expect(created.status).toBe(201);
    expect((await browser.get(`${a.url}/api/customers/${created.body.id}`)).body.name).toBe('Maren Holt');
    // Signing out on B revokes the session row: the same cookie, kept, no longer works on A.
    const kept = new Map(browser.cookies);
    expect((await browser.post(`${b.url}/api/auth/logout`)).status).toBe(204);
    browser.cookies = kept;
    expect((await browser.get(`${a.url}/api/auth/me`)).status).toBe(401);
  });

  it('failed sign-ins count across both: the sixth wrong password is refused whichever process gets it', async () => {
    const c = await buildCompany();
    const guesser = new RemoteClient();
    await guesser.get(`${a.url}/api/health`);
    for (let i = 0; i < 5; i++) {
      const on = i % 2 === 0 ? a : b;
      expect((await guesser.post(`${on.url}/api/auth/login`, { email: c.crew.email, password: `wrong-${i}` })).status).toBe(401);
    }
    for (const on of [a, b]) {
      const r = await guesser.post(`${on.url}/api/auth/login`, { email: c.crew.email, password: TEST_PASSWORD });
      expect(r.status).toBe(429);
      expect(r.body.error.code).toBe('rate_limited');
    }
  });

  it('each queued e-mail, each document and each webhook event is handled exactly once across both', { timeout: 120_000 }, async () => {
    const c = await buildCompany();
    const office = await new RemoteClient().signIn(a.url, c.office.email, TEST_PASSWORD);
    const tent = await buildItem(c.organization.id, { name: '20x20 frame tent', kind: 'tent', tentType: 'frame', widthFt: 20, lengthFt: 20, quantityOwned: 50, rentalPriceCents: 60_000 });

    // E-mails: queued here, sent by whichever process's worker takes the job.
    const MAILS = 40;
    const label = `two-${process.pid}`;
    const jobIds: string[] = [];
    for (let i = 0; i < MAILS; i++) jobIds.push((await queueMail(c.organization.id, `${label}-${i}@example.test`, 'portal-sign-in', { companyName: 'Two apps company', link: `${a.url}/portal/welcome?token=t${i}` }))!);

    // Documents and webhook events: four issued invoices (each e-mailed), twenty card payments on
    // them reported by the processor; every event delivered to both processes at the same time.
    const INVOICES = 4;
    const PAYMENTS = 20;
    const checkouts: InstanceType<typeof CardCheckout>[] = [];
    for (let i = 0; i < INVOICES; i++) {
      const customer = await buildCustomer(c.organization.id, { name: `Payer ${i}`, email: `${label}-payer-${i}@example.test` });
      const booking = await office.post(`${(i % 2 ? b : a).url}/api/bookings`, bookingBody(customer.id, '2027-05-15', [{ itemId: tent.id, quantity: 1, unitPriceCents: 60_000, description: '20x20 frame tent' }], { taxRateBp: 0, damageWaiver: false }));
      const draft = await office.post(`${(i % 2 ? a : b).url}/api/bookings/${booking.body.id}/invoices`, { kind: 'balance' });
      const invoice = await office.post(`${(i % 2 ? b : a).url}/api/invoices/${draft.body.id}/issue`);
      expect(invoice.status).toBe(200);
      for (let k = 0; k < PAYMENTS / INVOICES; k++) {
        checkouts.push(await CardCheckout.create({
          organizationId: c.organization.id, invoiceId: invoice.body.id, bookingId: booking.body.id, customerId: customer.id, amountCents: 5_000 + 10 * i + k,
          currency: 'USD', startedBy: 'staff', idempotencyKey: `${label}-${i}-${k}`, stripeSessionId: `cs_test_${label}_${i}_${k}`,
        }));
      }
    }
    const deliveries = await Promise.all(checkouts.map(async (checkout, n) => {
      const payload = JSON.stringify({
        id: `evt_${label}_${n}`, object: 'event', type: 'payment_intent.succeeded', api_version: '2025-01-01', created: Math.floor(Date.now() / 1000), livemode: false,
        pending_webhooks: 1, request: { id: null, idempotency_key: null },
        data: { object: { id: `pi_${label}_${n}`, object: 'payment_intent', amount: checkout.amountCents, amount_received: checkout.amountCents, status: 'succeeded', latest_charge: `ch_${label}_${n}`, metadata: { checkoutId: checkout.id } } },
      });
      const deliver = (app: AppProcess) =>
        fetch(`${app.url}/api/webhooks/stripe`, {
          method: 'POST',
          headers: { 'Content-Type': 'application/json', 'Stripe-Signature': signatureHeader(payload, webhookSecret, Math.floor(Date.now() / 1000)) },
          body: payload,
        }).then(async (r) => ({ status: r.status, body: (await r.json()) as { duplicate: boolean } }));
      // Alternately first to A and first to B, the other copy at the same moment.
      return Promise.all(n % 2 ? [deliver(a), deliver(b)] : [deliver(b), deliver(a)]);
    }));
    for (const pair of deliveries) {
      expect(pair.map((r) => r.status)).toEqual([200, 200]);
      // Stored once: exactly one of the two copies was new.
      expect(pair.filter((r) => !r.body.duplicate)).toHaveLength(1);
    }

    const documentMails = INVOICES + PAYMENTS;
    await pollUntil('every job done', async () => {
      const open = await count(`SELECT count(*) AS n FROM pgboss.job WHERE name IN ('send-mail', 'send-document', 'card-event') AND state <> 'completed'`);
      const sent = await count(`SELECT count(*) AS n FROM document_sends WHERE organization_id = :org AND status = 'sent'`, { org: c.organization.id });
      const paid = await count(`SELECT count(*) AS n FROM card_checkouts WHERE organization_id = :org AND status = 'paid'`, { org: c.organization.id });
      return open === 0 && sent === documentMails && paid === PAYMENTS;
    }, { tries: 400, everyMs: 250 });

    // Handled the first time: no job failed and waited for a retry (two payments of one company
    // recorded at once by the two processes used to deadlock on the company row).
    expect(await count(`SELECT count(*) AS n FROM pgboss.job WHERE name IN ('send-mail', 'send-document', 'card-event') AND retry_count > 0`)).toBe(0);
    // Webhooks: each event stored once, delivered twice, handled once; one payment each.
    expect(await count(`SELECT count(*) AS n FROM stripe_events WHERE id LIKE :p AND processed_at IS NOT NULL AND deliveries = 2`, { p: `evt_${label}_%` })).toBe(PAYMENTS);
    expect(await count(`SELECT count(*) AS n FROM payments WHERE organization_id = :org`, { org: c.organization.id })).toBe(PAYMENTS);
    expect(await count(`SELECT count(DISTINCT stripe_payment_intent_id) AS n FROM payments WHERE organization_id = :org`, { org: c.organization.id })).toBe(PAYMENTS);
    const paidTotal = checkouts.reduce((n, ch) => n + ch.amountCents, 0);
    expect(await count(`SELECT sum(paid_cents) AS n FROM invoices WHERE organization_id = :org`, { org: c.organization.id })).toBe(paidTotal);

    // Mail: each queued mail and each document once in the sink, sent by one process or the other.
    const mine = (await caughtMail(sink.httpUrl)).filter((m) => m.to.some((t) => t.startsWith(`${label}-`)));
    expect(mine).toHaveLength(MAILS + documentMails);
    expect([...countByRecipientAndSubject(mine).values()].filter((n) => n !== 1)).toEqual([]);
    const mailA = handledBy(a, 'mail sent', 'jobId').filter((id) => jobIds.includes(id));
    const mailB = handledBy(b, 'mail sent', 'jobId').filter((id) => jobIds.includes(id));
    expect([...mailA, ...mailB].sort()).toEqual([...jobIds].sort());
    expect(mailA.filter((id) => mailB.includes(id))).toEqual([]);
    const sendIds = ((await sequelize.query(`SELECT id FROM document_sends WHERE organization_id = :org`, { replacements: { org: c.organization.id }, type: 'SELECT' })) as { id: string }[]).map((r) => r.id);
    const docsA = handledBy(a, 'document sent', 'sendId').filter((id) => sendIds.includes(id));
    const docsB = handledBy(b, 'document sent', 'sendId').filter((id) => sendIds.includes(id));
    expect([...docsA, ...docsB].sort()).toEqual([...sendIds].sort());
    expect(await count(`SELECT count(*) AS n FROM mail_deliveries WHERE attempts <> 1 OR interrupted <> 0`)).toBe(0);
  });

  it('two offices on different processes reserving the last tent at once: exactly one wins, every time', { timeout: 60_000 }, async () => {
    const c = await buildCompany();
    const [onA, onB] = await Promise.all([
      new RemoteClient().signIn(a.url, c.owner.email, TEST_PASSWORD),
      new RemoteClient().signIn(b.url, c.office.email, TEST_PASSWORD),
    ]);
    const first = await buildCustomer(c.organization.id, { name: 'Juniper Vale' });
    const second = await buildCustomer(c.organization.id, { name: 'Osric Dunmore' });
    for (let round = 0; round < 5; round++) {
      const tent = await buildItem(c.organization.id, { name: `Last 20x30 pole tent ${round}`, kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 30, quantityOwned: 1, rentalPriceCents: 45_000 });
      const x = await onA.post(`${a.url}/api/bookings`, bookingBody(first.id, '2027-06-12', [{ itemId: tent.id, quantity: 1 }]));
      const y = await onB.post(`${b.url}/api/bookings`, bookingBody(second.id, '2027-06-12', [{ itemId: tent.id, quantity: 1 }]));
      const [rx, ry] = await Promise.all([
        onA.post(`${a.url}/api/bookings/${x.body.id}/status`, { status: 'reserved' }),
        onB.post(`${b.url}/api/bookings/${y.body.id}/status`, { status: 'reserved' }),
      ]);
      expect([rx.status, ry.status].sort()).toEqual([200, 409]);
      const lost = rx.status === 409 ? rx : ry;
      expect(lost.body.error.code).toBe('shortfall');
      expect(lost.body.shortfalls).toEqual([{ itemId: tent.id, name: tent.name, requested: 1, available: 0, shortfall: 1 }]);
      expect((await Booking.findAll({ where: { id: [x.body.id, y.body.id] } })).map((bk) => bk.status).sort()).toEqual(['draft', 'reserved']);
    }
  });
});
