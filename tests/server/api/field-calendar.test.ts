import ICAL from 'ical.js';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { CalendarFeed } from '../../../server/models';
import { ApiClient } from '../../support';
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
