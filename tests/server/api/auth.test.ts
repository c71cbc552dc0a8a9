import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { Organization, Session, User } from '../../../server/models';
import { buildCompany, buildUser, TEST_PASSWORD } from '../../factories';
import { ApiClient, linkToken, uniqueEmail, waitForMail } from '../../support';

const app = createApp();
const client = () => new ApiClient(app).init();

describe('POST /api/auth/signup', () => {
  it('400 names every bad field and keeps nothing', async () => {
    const c = await client();
    const res = await c.post('/api/auth/signup', { organizationName: '', name: 'A', email: 'not-an-email', password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'organizationName', 'password']);
    expect(res.body.error.fields.password).toMatch(/at least 10/);
  });

  it('202 and a link by e-mail; the link makes the company and its owner, signs in, and sends a welcome mail', async () => {
    const c = await client();
    const email = uniqueEmail('founder');
    const res = await c.post('/api/auth/signup', { organizationName: 'Meadow Canopy Rentals', name: 'Ada Quill', email: email.toUpperCase(), password: 'a-long-password' });
    expect(res.status).toBe(202);
    expect(res.body.message).toMatch(/Check your e-mail/);
    // Nothing is made, and nobody signed in, until the link is opened.
    expect((await c.get('/api/auth/me')).status).toBe(401);
    expect(await User.count({ where: { email } })).toBe(0);

    const link = await waitForMail(email, { subject: /Finish creating Meadow Canopy Rentals/ });
    const token = linkToken(link, '/sign-up/confirm');
    expect((await c.post('/api/auth/signup/confirm', { token: 'x' })).status).toBe(400);
    const done = await c.post('/api/auth/signup/confirm', { token });
    expect(done.status).toBe(201);
    expect(done.body.user).toMatchObject({ email, role: 'owner', name: 'Ada Quill' });
    expect(done.body.organization.name).toBe('Meadow Canopy Rentals');
    expect(done.body.areas).toEqual(expect.arrayContaining(['dashboard', 'users', 'settings']));
    const cookie = ([] as string[]).concat(done.headers['set-cookie']).find((s) => s.startsWith('guyline_session='))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect((await c.get('/api/auth/me')).body.user.email).toBe(email);
    const mail = await waitForMail(email, { subject: /Welcome/ });
    expect(mail.text).toContain('Meadow Canopy Rentals');
    // The company's signing certificate is made by a job, off the request.
    let org = await Organization.findByPk(done.body.organization.id);
    for (let i = 0; i < 100 && !org!.certificatePem; i++) {
      await new Promise((r) => setTimeout(r, 200));
      org = await Organization.findByPk(done.body.organization.id);
    }
    expect(org!.certificatePem).toMatch(/BEGIN CERTIFICATE/);
  });

  it('an address with an account gets the same 202, no session, and a note by e-mail instead of a link', async () => {
    const user = await buildUser();
    const res = await (await client()).post('/api/auth/signup', { organizationName: 'Other Co', name: 'B', email: user.email, password: 'a-long-password' });
    expect(res.status).toBe(202);
    expect(res.body.message).toMatch(/Check your e-mail/);
    expect(([] as string[]).concat(res.headers['set-cookie'] ?? []).some((s) => s.startsWith('guyline_session='))).toBe(false);
    const note = await waitForMail(user.email, { subject: /tried to sign up/ });
    expect(note.text).not.toMatch(/sign-up\/confirm/);
  });
});

describe('POST /api/auth/login and GET /api/auth/me', () => {
  it('GET /me is 401 without a session', async () => {
    const res = await (await client()).get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('400 on a malformed body, 401 on a wrong password, 200 with the session', async () => {
    const { office } = await buildCompany();
    const c = await client();
    expect((await c.post('/api/auth/login', { email: 'x' })).status).toBe(400);
    const wrong = await c.post('/api/auth/login', { email: office.email, password: 'wrong-password!' });
    expect(wrong.status).toBe(401);
    expect(wrong.body.error.code).toBe('invalid_credentials');
    const ok = await c.post('/api/auth/login', { email: office.email, password: TEST_PASSWORD });
    expect(ok.status).toBe(200);
    expect(ok.body.user).toMatchObject({ id: office.id, role: 'office' });
    expect(ok.body.user.passwordHash).toBeUndefined();
    expect(ok.body.areas).not.toContain('users');
    const me = await c.get('/api/auth/me');
    expect(me.body).toEqual(ok.body);
  });

  it('gives the same answer for an unknown e-mail as for a wrong password', async () => {
    const c = await client();
    const res = await c.post('/api/auth/login', { email: uniqueEmail('nobody'), password: 'whatever-password' });
    expect(res.status).toBe(401);
    expect(res.body.error.message).toBe('E-mail or password is not right.');
  });

  it('rate limits repeated failures with 429, even when the right password follows', async () => {
    const { crew } = await buildCompany();
    const c = await client();
    for (let i = 0; i < 5; i++) {
      expect((await c.post('/api/auth/login', { email: crew.email, password: `wrong-${i}-password` })).status).toBe(401);
    }
    const blocked = await c.post('/api/auth/login', { email: crew.email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('rate_limited');
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
    // Another address is not blocked.
    const other = await client();
    expect((await other.post('/api/auth/login', { email: crew.email, password: TEST_PASSWORD })).status).toBe(200);
  });

  it('a disabled user cannot sign in and loses the open session', async () => {
    const { owner, office } = await buildCompany();
    const officeClient = await (await client()).login(office.email, TEST_PASSWORD);
    const ownerClient = await (await client()).login(owner.email, TEST_PASSWORD);
    expect((await ownerClient.patch(`/api/users/${office.id}`, { disabled: true })).status).toBe(200);
    expect((await officeClient.get('/api/auth/me')).status).toBe(401);
    expect((await (await client()).post('/api/auth/login', { email: office.email, password: TEST_PASSWORD })).status).toBe(401);
  });
});

describe('signing out', () => {
  it('logout ends this session only; logout-all ends every session', async () => {
    const user = await buildUser({ role: 'bookkeeper' });
    const a = await (await client()).login(user.email, TEST_PASSWORD);
    const b = await (await client()).login(user.email, TEST_PASSWORD);
    const c = await (await client()).login(user.email, TEST_PASSWORD);
    expect((await a.post('/api/auth/logout')).status).toBe(204);
    expect((await a.get('/api/auth/me')).status).toBe(401);
    expect((await b.get('/api/auth/me')).status).toBe(200);
    expect((await b.post('/api/auth/logout-all')).status).toBe(204);
    expect((await b.get('/api/auth/me')).status).toBe(401);
    expect((await c.get('/api/auth/me')).status).toBe(401);
    expect(await Session.count({ where: { userId: user.id, revokedAt: null } })).toBe(0);
  });

  it('logout is 401 without a session', async () => {
    expect((await (await client()).post('/api/auth/logout')).status).toBe(401);
  });
});

describe('CSRF double submit', () => {
  it('refuses a write made with the session cookie but without the header', async () => {
    const user = await buildUser();
    const c = await (await client()).login(user.email, TEST_PASSWORD);
    const res = await c.post('/api/auth/logout', undefined, { csrf: false });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf');
    // A wrong token is refused too; the session is still alive.
    const saved = c.csrf;
    c.csrf = 'x'.repeat(saved.length);
    expect((await c.patch('/api/organization', { name: 'Renamed' })).body.error.code).toBe('csrf');
    c.csrf = saved;
    expect((await c.get('/api/auth/me')).status).toBe(200);
  });

  it('sets a readable guyline_csrf cookie', async () => {
    const res = await new ApiClient(app).get('/api/health');
    const cookie = ([] as string[]).concat(res.headers['set-cookie']).find((s) => s.startsWith('guyline_csrf='))!;
    expect(cookie).toBeDefined();
    expect(cookie).not.toMatch(/HttpOnly/i);
  });
});

describe('password reset', () => {
  it('202 for known and unknown addresses alike; the link sets a new password once', async () => {
    const user = await buildUser({ role: 'crew' });
    const c = await client();
    const unknown = await c.post('/api/auth/password-reset/request', { email: uniqueEmail('ghost') });
    const known = await c.post('/api/auth/password-reset/request', { email: user.email });
    expect(unknown.status).toBe(202);
    expect(known.status).toBe(202);
    expect(known.body).toEqual(unknown.body);

    const mail = await waitForMail(user.email, { subject: /Reset/ });
    const token = linkToken(mail, '/reset-password');
    expect((await c.post('/api/auth/password-reset/confirm', { token, password: 'short' })).status).toBe(400);
    expect((await c.post('/api/auth/password-reset/confirm', { token, password: 'a-brand-new-password' })).status).toBe(204);
    const again = await c.post('/api/auth/password-reset/confirm', { token, password: 'another-new-password' });
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('invalid_token');

    expect((await (await client()).post('/api/auth/login', { email: user.email, password: TEST_PASSWORD })).status).toBe(401);
    expect((await (await client()).post('/api/auth/login', { email: user.email, password: 'a-brand-new-password' })).status).toBe(200);
  });

  it('rate limits reset requests with 429', async () => {
    const c = await client();
    const email = uniqueEmail('flood');
    const codes: number[] = [];
    for (let i = 0; i < 4; i++) codes.push((await c.post('/api/auth/password-reset/request', { email })).status);
    expect(codes).toEqual([202, 202, 202, 429]);
  });
});
