import ICAL from 'ical.js';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { CalendarFeed } from '../../../server/models';
import { ApiClient, linkToken, waitForMail } from '../../support';
import { as as signIn, booking, fieldCompany } from './fieldCompany';

const app = createApp();
const as = (user: Parameters<typeof signIn>[1]) => signIn(app, user);

const feedPath = (url: string) => new URL(url).pathname;

describe('the crew calendar feed (RFC 5545)', () => {
  it('a secret, revocable address whose feed parses with ical.js and holds each of the person’s stops', async () => {
    const c = await fieldCompany();
    const office = await as(c.office);
    const mine = await booking(office, c.customer.id, '2027-06-12', [{ itemId: c.tent.id, quantity: 1, unitPriceCents: 45_000, description: '20x30 pole tent' }], { siteNotes: 'Park on the gravel; soft lawn.' });
    const alsoMine = await booking(office, c.customer.id, '2027-06-20', [{ itemId: c.chairs.id, quantity: 60, description: 'White folding chair' }]);
    const notMine = await booking(office, c.customer.id, '2027-06-15', [{ itemId: c.chairs.id, quantity: 10, description: 'White folding chair' }]);
    for (const b of [mine, alsoMine]) {
      const r = await office.agent.put(`/api/field/bookings/${b.id}/crew`).set('X-CSRF-Token', office.csrf).set('X-Forwarded-For', office.ip).send({ userIds: [c.crew.id] });
      expect(r.status).toBe(200);
    }
    expect((await (await new ApiClient(app).init()).post('/api/field/calendar-feed')).status).toBe(401);
    expect((await (await as(c.bookkeeper)).post('/api/field/calendar-feed')).status).toBe(403);

    const crew = await as(c.crew);
    expect((await crew.get('/api/field/calendar-feed')).body).toEqual({ active: false, createdAt: null, lastUsedAt: null });
    const made = await crew.post('/api/field/calendar-feed');
    expect(made.status).toBe(201);
    expect(made.body.url).toMatch(/\/api\/field\/calendar\/[A-Za-z0-9_-]{43}\.ics$/);
    // Only the token's hash is kept.
    const token = made.body.url.match(/calendar\/(.+)\.ics$/)[1];
    expect((await CalendarFeed.findAll({ where: { userId: c.crew.id } })).map((f) => f.tokenHash)).not.toContain(token);

    // The feed needs no session: calendar apps fetch it with the address alone.
    const res = await new ApiClient(app).get(feedPath(made.body.url));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/calendar/);
    const cal = new ICAL.Component(ICAL.parse(res.text));
    expect(cal.getFirstPropertyValue('version')).toBe('2.0'); // RFC 5545 §3.7.4: VERSION:2.0
    expect(cal.getFirstPropertyValue('prodid')).toBeTruthy(); // RFC 5545 §3.7.3: PRODID is required
    const events = cal.getAllSubcomponents('vevent').map((v) => new ICAL.Event(v));
    // Each of the person's stops: a delivery and a pickup per booking they are on, and no other.
    expect(events.map((e) => e.summary).sort()).toEqual(
      [`Delivery ${mine.reference}: Wren Ashgrove`, `Pickup ${mine.reference}: Wren Ashgrove`, `Delivery ${alsoMine.reference}: Wren Ashgrove`, `Pickup ${alsoMine.reference}: Wren Ashgrove`].sort(),
    );
    expect(events.some((e) => e.summary.includes(notMine.reference))).toBe(false);
    const delivery = events.find((e) => e.summary === `Delivery ${mine.reference}: Wren Ashgrove`)!;
    // bookingBody: delivered the day before the event, 14:00–18:00 UTC.
    expect(delivery.startDate.toJSDate().toISOString()).toBe('2027-06-11T14:00:00.000Z');
    expect(delivery.endDate.toJSDate().toISOString()).toBe('2027-06-11T18:00:00.000Z');
    expect(delivery.location).toBe('12 Fox Run, Millbrook, IL 60000');
    expect(delivery.description).toContain('Park on the gravel; soft lawn.');
    expect(delivery.description).toContain('1 x 20x30 pole tent');
    expect(delivery.uid).toBe(`${mine.id}-delivery@${new URL(process.env.APP_URL!).hostname}`);
    // No money in the feed.
    expect(res.text).not.toMatch(/\$|450\.00|45000/);

    // A new address revokes the old one; revoking leaves none.
    const again = await crew.post('/api/field/calendar-feed');
    expect((await new ApiClient(app).get(feedPath(made.body.url))).status).toBe(404);
    expect((await new ApiClient(app).get(feedPath(again.body.url))).status).toBe(200);
    expect((await crew.get('/api/field/calendar-feed')).body).toMatchObject({ active: true, lastUsedAt: expect.any(String) });
    expect((await crew.delete('/api/field/calendar-feed')).status).toBe(200);
    expect((await new ApiClient(app).get(feedPath(again.body.url))).status).toBe(404);
    expect((await new ApiClient(app).get('/api/field/calendar/not-a-token.ics')).status).toBe(400);
  });
});

describe('the feed ends with the person’s access', () => {
  /** A crew member with a live feed on one reserved booking; the address and a way to read it without a session. */
  async function liveFeed() {
    const c = await fieldCompany();
    const office = await as(c.office);
    const b = await booking(office, c.customer.id, '2027-07-10', [{ itemId: c.chairs.id, quantity: 20, description: 'White folding chair' }]);
    await office.agent.put(`/api/field/bookings/${b.id}/crew`).set('X-CSRF-Token', office.csrf).set('X-Forwarded-For', office.ip).send({ userIds: [c.crew.id] });
    const crewClient = await as(c.crew);
    const made = await crewClient.post('/api/field/calendar-feed');
    expect(made.status).toBe(201);
    const read = async () => (await new ApiClient(app).get(feedPath(made.body.url))).status;
    expect(await read()).toBe(200);
    return { ...c, crewClient, read };
  }

  it('sign out everywhere revokes the feed address', async () => {
    const f = await liveFeed();
    expect((await f.crewClient.post('/api/auth/logout-all')).status).toBe(204);
    expect(await f.read()).toBe(404);
    expect(await CalendarFeed.count({ where: { userId: f.crew.id, revokedAt: null } })).toBe(0);
  });

  it('a password reset through the e-mailed link revokes the feed address', async () => {
    const f = await liveFeed();
    const stranger = await new ApiClient(app).init();
    expect((await stranger.post('/api/auth/password-reset/request', { email: f.crew.email })).status).toBe(202);
    // Asking alone changes nothing: only the confirmed reset does.
    expect(await f.read()).toBe(200);
    const token = linkToken(await waitForMail(f.crew.email, { subject: /Reset/ }), '/reset-password');
    expect((await stranger.post('/api/auth/password-reset/confirm', { token, password: 'a-brand-new-password' })).status).toBe(204);
    expect(await f.read()).toBe(404);
  });

  it('a person moved to a role without the calendar loses the feed at once, and gets it back with the role', async () => {
    const f = await liveFeed();
    const owner = await as(f.owner);
    expect((await owner.patch(`/api/users/${f.crew.id}`, { role: 'bookkeeper' })).status).toBe(200);
    expect(await f.read()).toBe(404);
    // Nothing was revoked: the rule is read at every request, so the crew role brings it back.
    expect((await owner.patch(`/api/users/${f.crew.id}`, { role: 'crew' })).status).toBe(200);
    expect(await f.read()).toBe(200);
  });

  it('a disabled person’s feed stops, and stays stopped when they are enabled again', async () => {
    const f = await liveFeed();
    const owner = await as(f.owner);
    expect((await owner.patch(`/api/users/${f.crew.id}`, { disabled: true })).status).toBe(200);
    expect(await f.read()).toBe(404);
    expect((await owner.patch(`/api/users/${f.crew.id}`, { disabled: false })).status).toBe(200);
    expect(await f.read()).toBe(404);
  });
});
