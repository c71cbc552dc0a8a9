import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { AuditLog, Booking, Shortfall, type User } from '../../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient } from '../../support';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const anon = () => new ApiClient(app).init();

async function company() {
  const c = await buildCompany();
  const customer = await buildCustomer(c.organization.id, { name: 'Wren Ashgrove', phone: '555-0199' });
  const tent = await buildItem(c.organization.id, { name: '20x30 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 30, quantityOwned: 1, rentalPriceCents: 45_000 });
  const chairs = await buildItem(c.organization.id, { name: 'Chair', kind: 'chair', quantityOwned: 100, rentalPriceCents: 200 });
  return { ...c, customer, tent, chairs };
}

describe('POST /api/bookings', () => {
  it('401 -> 400 (every bad field) -> 403 -> 201 with a reference, lines and totals', async () => {
    const { owner, crew, customer, tent, chairs } = await company();
    const body = bookingBody(customer.id, '2027-06-12', [
      { itemId: tent.id, quantity: 1, unitPriceCents: 45_000, description: '20x30 pole tent' },
      { itemId: chairs.id, quantity: 75, unitPriceCents: 200, description: 'Chair' },
    ], { taxRateBp: 725, guestCount: 75, damageWaiver: false });
    expect((await (await anon()).post('/api/bookings', body)).status).toBe(401);
    const o = await as(owner);
    const bad = await o.post('/api/bookings', {
      ...body,
      eventEnd: '2027-06-11T10:00:00Z',
      pickupStart: '2027-06-01T10:00:00Z',
      lines: [{ itemId: tent.id, quantity: -2, unitPriceCents: -1, description: 'x' }],
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toMatchObject({
      eventEnd: expect.stringMatching(/before it starts/),
      pickupStart: expect.stringMatching(/before delivery/),
      'lines.0.quantity': expect.any(String),
      'lines.0.unitPriceCents': expect.any(String),
    });
    const unknownItem = await o.post('/api/bookings', { ...body, lines: [{ itemId: '00000000-0000-4000-8000-000000000000', quantity: 1, unitPriceCents: 5, description: 'x' }] });
    expect(unknownItem.status).toBe(400);
    expect(unknownItem.body.error.fields['lines.0.itemId']).toBeDefined();
    expect((await (await as(crew)).post('/api/bookings', body)).status).toBe(403);
    expect(await Booking.count({ where: { organizationId: owner.organizationId } })).toBe(0);

    const res = await o.post('/api/bookings', body);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ reference: 'B-1001', status: 'draft', customer: { id: customer.id, name: 'Wren Ashgrove' } });
    expect(res.body.lines).toHaveLength(2);
    expect(res.body.lines[0]).toMatchObject({ itemId: tent.id, available: 1, shortfall: 0 });
    // 450.00 + 75 x 2.00 = 600.00 of taxable rentals at 7.25% = 43.50 (worked by hand: 600 x 0.0725).
    expect(res.body.totals).toMatchObject({ subtotalCents: 60_000, taxCents: 4_350, totalCents: 64_350 });
    expect((await Booking.findByPk(res.body.id))!.totalCents).toBe(64_350);
    expect(await AuditLog.count({ where: { subjectId: res.body.id, action: 'booking.created' } })).toBe(1);
  });
});

describe('reserving', () => {
  it('exactly one of two offices reserving the last tent at once succeeds; the other gets a 409 naming it', async () => {
    const { owner, office, customer, tent } = await company();
    const o = await as(owner);
    const f = await as(office);
    const a = await o.post('/api/bookings', bookingBody(customer.id, '2027-06-12', [{ itemId: tent.id, quantity: 1 }]));
    const b = await f.post('/api/bookings', bookingBody(customer.id, '2027-06-12', [{ itemId: tent.id, quantity: 1 }]));
    const [ra, rb] = await Promise.all([
      o.post(`/api/bookings/${a.body.id}/status`, { status: 'reserved' }),
      f.post(`/api/bookings/${b.body.id}/status`, { status: 'reserved' }),
    ]);
    const codes = [ra.status, rb.status].sort();
    expect(codes).toEqual([200, 409]);
    const lost = ra.status === 409 ? ra : rb;
    expect(lost.body.error.code).toBe('shortfall');
    expect(lost.body.shortfalls).toEqual([{ itemId: tent.id, name: '20x30 pole tent', requested: 1, available: 0, shortfall: 1 }]);
    expect(lost.body.error.message).toContain('20x30 pole tent is short by 1');
    const statuses = (await Booking.findAll({ where: { id: [a.body.id, b.body.id] } })).map((x) => x.status).sort();
    expect(statuses).toEqual(['draft', 'reserved']);
    // The loser's shortfall is kept for the purchasing report.
    expect(await Shortfall.count({ where: { itemId: tent.id, shortfall: 1 } })).toBe(1);
    // The loser's booking now shows the shortfall on its line.
    const loserId = ra.status === 409 ? a.body.id : b.body.id;
    const shown = await o.get(`/api/bookings/${loserId}`);
    expect(shown.body.lines[0]).toMatchObject({ available: 0, shortfall: 1 });
  });

  it('holds from delivery to pickup plus the turnaround buffer; back-to-back outside it is fine', async () => {
    const { owner, customer, tent, organization } = await company();
    const o = await as(owner);
    const first = await o.post('/api/bookings', bookingBody(customer.id, '2027-07-10', [{ itemId: tent.id, quantity: 1 }]));
    expect((await o.post(`/api/bookings/${first.body.id}/status`, { status: 'reserved' })).status).toBe(200);
    // First pickup ends 2027-07-11 18:00Z; with the default 24 h buffer the tent is back 07-12 18:00Z.
    const inside = bookingBody(customer.id, '2027-07-12', [{ itemId: tent.id, quantity: 1 }]); // delivery 07-11 14:00Z
    const tooSoon = await o.post('/api/bookings', inside);
    expect(tooSoon.body.lines[0]).toMatchObject({ available: 0, shortfall: 1 });
    expect((await o.post(`/api/bookings/${tooSoon.body.id}/status`, { status: 'reserved' })).status).toBe(409);
    const later = await o.post('/api/bookings', bookingBody(customer.id, '2027-07-14', [{ itemId: tent.id, quantity: 1 }])); // delivery 07-13 14:00Z
    expect((await o.post(`/api/bookings/${later.body.id}/status`, { status: 'reserved' })).status).toBe(200);
    // The item's month shows the holds day by day in the company's time zone (America/Chicago by default).
    const month = await o.get(`/api/items/${tent.id}/availability?from=2027-07-01T05:00:00Z&to=2027-08-01T05:00:00Z`);
    expect(month.status).toBe(200);
    expect(month.body.days).toHaveLength(31);
    expect(month.body.free).toBe(0);
    const day = (d: string) => month.body.days.find((x: { date: string }) => x.date === d);
    expect(day('2027-07-05')).toMatchObject({ reserved: 0, free: 1 });
    expect(day('2027-07-10')).toMatchObject({ reserved: 1, free: 0 });
    expect(month.body.holds.map((h: { reference: string }) => h.reference).sort()).toEqual([first.body.reference, later.body.reference].sort());
    expect(organization.timeZone).toBe('America/Chicago');
  });

  it('status changes follow the allowed order and the roles: crew marks out, bookkeeper cannot', async () => {
    const { owner, crew, bookkeeper, customer, tent } = await company();
    const o = await as(owner);
    const b = await o.post('/api/bookings', bookingBody(customer.id, '2027-08-07', [{ itemId: tent.id, quantity: 1 }]));
    const id = b.body.id;
    expect((await o.post(`/api/bookings/${id}/status`, { status: 'closed' })).status).toBe(409);
    expect((await o.post(`/api/bookings/${id}/status`, { status: 'flying' })).status).toBe(400);
    expect((await (await as(bookkeeper)).post(`/api/bookings/${id}/status`, { status: 'quoted' })).status).toBe(403);
    expect((await o.post(`/api/bookings/${id}/status`, { status: 'quoted' })).status).toBe(200);
    expect((await o.post(`/api/bookings/${id}/status`, { status: 'reserved' })).status).toBe(200);
    const c = await as(crew);
    const out = await c.post(`/api/bookings/${id}/status`, { status: 'out' });
    expect(out.status).toBe(200);
    expect(out.body.totals).toBeNull();
    expect(out.body.lines[0].unitPriceCents).toBe(0);
    expect((await c.post(`/api/bookings/${id}/status`, { status: 'returned' })).status).toBe(200);
    expect((await c.post(`/api/bookings/${id}/status`, { status: 'closed' })).status).toBe(403);
    expect((await o.post(`/api/bookings/${id}/status`, { status: 'closed' })).status).toBe(200);
    const history = await o.get(`/api/bookings/${id}/history`);
    expect(history.body.data.filter((h: { action: string }) => h.action === 'booking.status_changed').map((h: { data: { to: string } }) => h.data.to)).toEqual(['closed', 'returned', 'out', 'reserved', 'quoted']);
  });
});

describe('GET /api/bookings', () => {
  it('filters by status, dates and text; 404 for another company', async () => {
    const { owner, customer, tent, chairs } = await company();
    const other = await company();
    const o = await as(owner);
    const june = await o.post('/api/bookings', bookingBody(customer.id, '2027-06-05', [{ itemId: chairs.id, quantity: 10 }]));
    await o.post('/api/bookings', bookingBody(customer.id, '2027-09-05', [{ itemId: tent.id, quantity: 1 }]));
    await o.post(`/api/bookings/${june.body.id}/status`, { status: 'quoted' });
    expect((await o.get('/api/bookings?status=nope')).status).toBe(400);
    const quoted = await o.get('/api/bookings?status=quoted');
    expect(quoted.body.total).toBe(1);
    expect(quoted.body.data[0]).toMatchObject({ id: june.body.id, status: 'quoted' });
    const summer = await o.get('/api/bookings?from=2027-06-01T00:00:00Z&to=2027-07-01T00:00:00Z');
    expect(summer.body.data.map((b: { id: string }) => b.id)).toEqual([june.body.id]);
    expect((await o.get('/api/bookings?q=ashgrove')).body.total).toBe(2);
    const foreign = await (await as(other.owner)).post('/api/bookings', bookingBody(other.customer.id, '2027-06-05', []));
    expect((await o.get(`/api/bookings/${foreign.body.id}`)).status).toBe(404);
    expect((await o.post(`/api/bookings/${foreign.body.id}/status`, { status: 'quoted' })).status).toBe(404);
  });

  it('answers list rows: no lines, the stored total for the office, no money for the crew', async () => {
    const { owner, office, crew, organization, customer, tent, chairs } = await company();
    const o = await as(owner);
    const made = await o.post('/api/bookings', bookingBody(customer.id, '2027-06-05', [
      { itemId: tent.id, quantity: 1, unitPriceCents: 45_000 },
      { itemId: chairs.id, quantity: 40, unitPriceCents: 200 },
    ], { taxRateBp: 725, deliveryMiles: 12, damageWaiver: true }));
    expect(made.status).toBe(201);
    const quoted = (id: string) => o.get(`/api/bookings/${id}`).then((r) => r.body.totals.totalCents as number);
    const listed = async (client: Awaited<ReturnType<typeof as>>) => (await client.get(`/api/bookings?customerId=${customer.id}`)).body.data[0];

    const row = await listed(await as(office));
    expect(Object.keys(row).sort()).toEqual(['currency', 'customer', 'eventEnd', 'eventStart', 'guestCount', 'id', 'reference', 'siteCity', 'siteLine1', 'status', 'totalCents']);
    expect(row).toMatchObject({ id: made.body.id, reference: made.body.reference, status: 'draft', customer: { id: customer.id, name: 'Wren Ashgrove' }, eventStart: made.body.eventStart, currency: organization.currency });
    expect(row.totalCents).toBe(made.body.totals.totalCents);
    expect(row.totalCents).toBeGreaterThan(0);
    expect((await o.get(`/api/bookings?customerId=${customer.id}&page=2`)).body).toEqual({ data: [], total: 1 });

    const crewRow = await listed(await as(crew));
    expect(crewRow.id).toBe(made.body.id);
    expect(crewRow.totalCents).toBeNull();
    expect(JSON.stringify(crewRow)).not.toMatch(/Cents":[1-9]|lines|totals/);

    // The quote reads the customer's exemption and the company's rules: the stored total follows both.
    const put = (url: string, body: object) => o.agent.put(url).set('X-CSRF-Token', o.csrf).set('X-Forwarded-For', o.ip).send(body);
    const exempt = await put(`/api/customers/${customer.id}`, { name: 'Wren Ashgrove', phone: '555-0199', taxExempt: true });
    expect(exempt.status).toBe(200);
    expect((await listed(o)).totalCents).toBe(await quoted(made.body.id));
    expect((await listed(o)).totalCents).toBeLessThan(row.totalCents);
    const before = (await listed(o)).totalCents;
    expect((await put('/api/organization/rules', { damageWaiverBp: 2500 })).status).toBe(200);
    expect((await listed(o)).totalCents).toBe(await quoted(made.body.id));
    expect((await listed(o)).totalCents).toBeGreaterThan(before);
  });

  it('the page is read while the session is checked, and answered only when the check passes: a signed-out session gets 401 and no rows', async () => {
    const { owner, customer, chairs } = await company();
    const o = await as(owner);
    await o.post('/api/bookings', bookingBody(customer.id, '2027-06-05', [{ itemId: chairs.id, quantity: 10 }]));
    const other = await as(owner);
    expect((await o.get('/api/bookings')).body.total).toBe(1);
    // The same person signs out everywhere from another browser: the first one's token is still signed, its session is not.
    expect((await other.post('/api/auth/logout-all')).status).toBe(204);
    const after = await o.get('/api/bookings');
    expect(after.status).toBe(401);
    expect(after.body.data).toBeUndefined();
    expect(JSON.stringify(after.body)).not.toContain('Wren Ashgrove');
    // No cookie at all: 401 before anything is read.
    expect((await (await new ApiClient(app).init()).get('/api/bookings')).status).toBe(401);
  });
});
