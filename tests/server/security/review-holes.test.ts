/**
 * The holes an attacker's review found (caught mail, customers across companies, a signed
 * agreement that changed silently, a GET that changed data, cached answers, a CSRF token from
 * another session), each tried with the attack that found it.
 */
import { spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { createApp } from '../../../server/app';
import type { User } from '../../../server/models';
import type { CaughtMail } from '../../../shared/schemas/mail';
import { CSRF_COOKIE, CSRF_HEADER, SESSION_COOKIE } from '../../../shared/types';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { allCaughtMail, ApiClient, linkToken, uniqueEmail, waitForMail } from '../../support';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const visitor = () => new ApiClient(app).init();

describe('the demo caught-mail screen (GET/DELETE /api/dev/mail)', () => {
  it('is for a signed-in owner only, who sees only mail sent for their own company', async () => {
    const a = await buildCompany();
    const b = await buildCompany();
    // The attack: ask for a reset of A's office account, then read the link from the caught mail.
    const attacker = await visitor();
    expect((await attacker.post('/api/auth/password-reset/request', { email: a.office.email })).status).toBe(202);
    expect((await attacker.post('/api/auth/password-reset/request', { email: b.office.email })).status).toBe(202);
    await waitForMail(a.office.email, { subject: /reset/i });
    await waitForMail(b.office.email, { subject: /reset/i });

    expect((await attacker.get('/api/dev/mail')).status).toBe(401);
    expect((await attacker.delete('/api/dev/mail')).status).toBe(401);
    for (const who of [a.crew, a.office, a.bookkeeper]) {
      const c = await as(who);
      expect((await c.get('/api/dev/mail')).status).toBe(403);
      expect((await c.delete('/api/dev/mail')).status).toBe(403);
    }
    // The sink's own API, on loopback, answers nobody without its token.
    const direct = await fetch(`${inject('mailSinkUrl')}/messages`);
    expect(direct.status).toBe(401);

    const ownerA = await as(a.owner);
    const mineA = (await ownerA.get('/api/dev/mail')).body as CaughtMail[];
    expect(mineA.some((m) => m.to.includes(a.office.email) && /reset/i.test(m.subject))).toBe(true);
    // Every message A's owner sees was sent for A: none of another company's customers or staff.
    const everything = await allCaughtMail();
    const aAddresses = new Set([a.owner, a.office, a.crew, a.bookkeeper].map((u) => u.email));
    expect(everything.some((m) => m.to.includes(b.office.email))).toBe(true);
    expect(mineA.every((m) => m.to.every((t) => aAddresses.has(t)))).toBe(true);

    const ownerB = await as(b.owner);
    const seenByB = (await ownerB.get('/api/dev/mail')).body as CaughtMail[];
    expect(seenByB.some((m) => m.to.includes(b.office.email))).toBe(true);
    expect(seenByB.some((m) => m.to.some((t) => aAddresses.has(t)))).toBe(false);
    expect(JSON.stringify(seenByB)).not.toContain(a.organization.name);
    // B emptying its inbox leaves A's mail where it is.
    expect((await ownerB.delete('/api/dev/mail')).status).toBe(204);
    expect(((await ownerA.get('/api/dev/mail')).body as CaughtMail[]).some((m) => m.to.includes(a.office.email))).toBe(true);

    // And so the takeover fails: no link reached the attacker, so the account keeps its password.
    expect((await attacker.post('/api/auth/password-reset/confirm', { token: 'x'.repeat(43), password: 'a-new-password-9' })).status).toBe(400);
    await as(a.office);
  });

  it('a production server refuses to start with the fakes on unless the demo flag says so', () => {
    const env = {
      PATH: process.env.PATH,
      NODE_ENV: 'production',
      DATABASE_URL: 'postgres://127.0.0.1:1/none',
      JWT_SECRET: randomBytes(40).toString('hex'),
      SIGNING_KEY_SECRET: randomBytes(40).toString('hex'),
      FAKES: 'on',
    };
    const load = (extra: Record<string, string>) =>
      spawnSync(process.execPath, ['--import', 'tsx', '-e', "await import('./server/env.ts')"], { env: { ...env, ...extra }, encoding: 'utf8' });
    const refused = load({});
    expect(refused.status).toBe(1);
    expect(refused.stderr).toMatch(/cannot start: FAKES=on .*GUYLINE_DEMO=on/);
    expect(load({ GUYLINE_DEMO: 'on' }).status).toBe(0);
    expect(load({ FAKES: 'off' }).status).toBe(0);
  });
});

/** A company whose customer (by e-mail) has a booking with an issued invoice. */
async function rental(email: string, label: string) {
  const c = await buildCompany();
  const customer = await buildCustomer(c.organization.id, { name: `Renter of ${label}`, email });
  const chairs = await buildItem(c.organization.id, { name: 'White folding chair', kind: 'chair', quantityOwned: 300, rentalPriceCents: 250 });
  const office = await as(c.office);
  const booking = (await office.post('/api/bookings', bookingBody(customer.id, '2027-10-02', [{ itemId: chairs.id, quantity: 40, unitPriceCents: 250, description: `Chairs (${label})` }], { taxRateBp: 0, damageWaiver: false }))).body;
  const draft = (await office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).body;
  const invoice = (await office.post(`/api/invoices/${draft.id}/issue`)).body;
  return { ...c, office, customer, booking, invoice };
}

describe("a customer's pages belong to one company", () => {
  it('a second company putting the same address on its own record gets its own link, never a place on the first company’s pages', async () => {
    const email = uniqueEmail('renter');
    const real = await rental(email, 'real');
    const squatter = await rental(email, 'urgent balance');

    const c = await visitor();
    expect((await c.post('/api/portal/sign-in', { email })).status).toBe(202);
    const mails = await waitForMail(email, { subject: /sign-in link/i, count: 2 }).then(() => allCaughtMail());
    const links = mails.filter((m) => m.to.includes(email) && /sign-in link/i.test(m.subject));
    expect(links).toHaveLength(2);
    const realMail = links.find((m) => m.subject.includes(real.organization.name))!;
    expect(realMail).toBeDefined();
    expect(links.find((m) => m.subject.includes(squatter.organization.name))).toBeDefined();

    const session = await c.post('/api/portal/sessions', { token: linkToken(realMail, '/portal/welcome') });
    expect(session.status).toBe(200);
    expect(session.body.company).toMatchObject({ id: real.organization.id, name: real.organization.name });
    expect((await c.get('/api/portal/me')).body.company.name).toBe(real.organization.name);

    const list = (await c.get('/api/portal/bookings')).body;
    expect(list.data.map((b: { id: string }) => b.id)).toEqual([real.booking.id]);
    expect(JSON.stringify(list)).not.toContain(squatter.organization.name);
    // The other company's booking, its invoice's checkout and its documents do not exist here.
    expect((await c.get(`/api/portal/bookings/${squatter.booking.id}`)).status).toBe(404);
    expect((await c.post(`/api/invoices/${squatter.invoice.id}/checkout`, {})).status).toBe(404);
    expect((await c.get(`/api/portal/documents/${squatter.invoice.documentId}/pdf`)).status).toBe(404);
    expect((await c.get(`/api/portal/bookings/${real.booking.id}`)).status).toBe(200);
  });
});

const PNG = 'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==';

async function signCurrent(office: ApiClient, documentId: string, email: string, count: number) {
  expect((await office.post(`/api/documents/${documentId}/signature-request`, {})).status).toBe(201);
  const mail = await waitForMail(email, { subject: /sign your rental agreement/i, count });
  const token = mail.text.match(/\/sign\/([A-Za-z0-9_-]+)/)![1];
  const v = await visitor();
  const page = await v.get(`/api/sign/${token}`);
  const initials = Object.fromEntries(page.body.clauses.map((cl: { key: string }) => [cl.key, 'QM']));
  await v.post(`/api/sign/${token}/consent`);
  const signed = await v.post(`/api/sign/${token}`, { typedName: 'Quill Marrow', signatureImage: PNG, initials });
  expect(signed.status).toBe(201);
}

describe('a signed agreement cannot change silently', () => {
  it('a change after signing marks the booking changed since signed, shows the customer the new version to sign, and holds the next invoice until then', async () => {
    const c = await buildCompany();
    const email = uniqueEmail('signer');
    const customer = await buildCustomer(c.organization.id, { name: 'Quill Marrow', email });
    const tent = await buildItem(c.organization.id, { name: '20x20 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 20, quantityOwned: 2, rentalPriceCents: 35_000 });
    const office = await as(c.office);
    const body = (price: number) => bookingBody(customer.id, '2027-10-09', [{ itemId: tent.id, quantity: 1, unitPriceCents: price, description: '20x20 pole tent' }]);
    const booking = (await office.post('/api/bookings', body(35_000))).body;
    await office.post(`/api/bookings/${booking.id}/status`, { status: 'quoted' });
    const v1 = (await office.post(`/api/bookings/${booking.id}/agreement`)).body;
    await signCurrent(office, v1.id, email, 1);
    expect((await office.get(`/api/bookings/${booking.id}/documents`)).body.agreement).toMatchObject({ state: 'signed', currentNumber: v1.number });

    // The office changes the price of the signed, reserved booking.
    expect((await office.put(`/api/bookings/${booking.id}`, body(42_000))).status).toBe(200);
    const docs = (await office.get(`/api/bookings/${booking.id}/documents`)).body;
    expect(docs.agreement).toMatchObject({ state: 'changed_since_signed', lastSignedNumber: `${v1.number}-S` });
    const v2 = docs.data.find((d: { kind: string; status: string }) => d.kind === 'rental_agreement' && d.status === 'issued');
    expect(v2.version).toBe(2);

    // The customer's pages say so: the current version awaits a signature.
    const cust = await visitor();
    await cust.post('/api/portal/sign-in', { email });
    const token = linkToken(await waitForMail(email, { subject: /sign-in link/i }), '/portal/welcome');
    await cust.post('/api/portal/sessions', { token });
    const page = (await cust.get(`/api/portal/bookings/${booking.id}`)).body;
    expect(page.agreement).toMatchObject({ state: 'awaiting', documentNumber: v2.number, changedSinceSigned: { documentNumber: `${v1.number}-S` } });
    expect(page.needsAction).toBe(true);

    // The next invoice waits for the new signature.
    const draft = (await office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).body;
    const held = await office.post(`/api/invoices/${draft.id}/issue`);
    expect(held.status).toBe(409);
    expect(held.body.error.code).toBe('changed_since_signed');
    expect(held.body.error.message).toContain(v2.number);

    await signCurrent(office, v2.id, email, 2);
    expect((await cust.get(`/api/portal/bookings/${booking.id}`)).body.agreement).toMatchObject({ state: 'signed', documentNumber: `${v2.number}-S` });
    expect((await office.post(`/api/invoices/${draft.id}/issue`)).status).toBe(200);
  });
});

describe('"Read and sign" is a POST behind the CSRF check', () => {
  it('a GET changes nothing; a POST without the CSRF header is refused; with it, the signing page address', async () => {
    const r = await rental(uniqueEmail('reader'), 'reader');
    await r.office.post(`/api/bookings/${r.booking.id}/status`, { status: 'quoted' });
    await r.office.post(`/api/bookings/${r.booking.id}/agreement`);
    const c = await visitor();
    await c.post('/api/portal/sign-in', { email: r.customer.email });
    await c.post('/api/portal/sessions', { token: linkToken(await waitForMail(r.customer.email, { subject: /sign-in link/i }), '/portal/welcome') });

    expect((await c.get(`/api/portal/bookings/${r.booking.id}/sign`)).status).toBe(404);
    expect((await c.post(`/api/portal/bookings/${r.booking.id}/sign`, {}, { csrf: false })).status).toBe(403);
    const ok = await c.post(`/api/portal/bookings/${r.booking.id}/sign`, {});
    expect(ok.status).toBe(200);
    expect(ok.body.url).toMatch(/^\/sign\/[A-Za-z0-9_-]{40,}$/);
  });
});

describe('API answers and the CSRF token', () => {
  it('every JSON answer says Cache-Control: no-store, errors included', async () => {
    const c = await buildCompany();
    const owner = await as(c.owner);
    for (const res of [
      await owner.get('/api/auth/me'),
      await owner.get('/api/bookings'),
      await owner.get('/api/health'),
      await owner.get(`/api/bookings/${'0'.repeat(8)}-0000-4000-8000-${'0'.repeat(12)}`),
      await (await visitor()).get('/api/auth/me'),
      await owner.get('/api/no-such-route'),
    ]) {
      expect(res.headers['content-type']).toMatch(/json/);
      expect(res.headers['cache-control']).toBe('no-store');
    }
  });

  it('a token made for another session, or one without its signature, is refused', async () => {
    const c = await buildCompany();
    const login = async (user: User) => {
      const agent = request.agent(app);
      const r = await agent.post('/api/auth/login').set('X-Forwarded-For', `2001:db8::c5:${Math.floor(Math.random() * 9999)}`).send({ email: user.email, password: TEST_PASSWORD });
      expect(r.status).toBe(200);
      const cookies = ([] as string[]).concat(r.headers['set-cookie'] ?? []);
      const value = (name: string) => cookies.filter((s) => s.startsWith(`${name}=`)).map((s) => s.slice(name.length + 1).split(';')[0]).pop()!;
      return { session: value(SESSION_COOKIE), csrf: value(CSRF_COOKIE) };
    };
    const office = await login(c.office);
    const other = await login(c.owner);
    const write = (session: string, token: string) =>
      request(app).post('/api/auth/logout').set('Cookie', `${SESSION_COOKIE}=${session}; ${CSRF_COOKIE}=${token}`).set(CSRF_HEADER, token);

    // Another session's token, planted as the cookie and echoed in the header: refused.
    const planted = await write(office.session, other.csrf);
    expect(planted.status).toBe(403);
    expect(planted.body.error.code).toBe('csrf');
    // A made-up token that matches itself, as plain double submit would take: refused.
    expect((await write(office.session, 'made-up-token')).status).toBe(403);
    // The session's own token: through.
    expect((await write(office.session, office.csrf)).status).toBe(204);
  });
});
