/**
 * Home's figures (GET /api/dashboard): each one is the same count or sum the list it links to
 * gives, so a figure on Home never disagrees with the screen behind it; the crew gets no money.
 */
import { describe, expect, it } from 'vitest';
import { addDays, dateInZone } from '../../../shared/dates';
import { createApp } from '../../../server/app';
import { Invoice, Organization, type User } from '../../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient } from '../../support';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const sum = (rows: { balanceCents: number }[]) => rows.reduce((s, r) => s + r.balanceCents, 0);

describe('Home’s figures', () => {
  it('open, overdue and received money equal the invoice lists and the payment; bookings by status; the crew sees stops and no money', async () => {
    const c = await buildCompany();
    const org = (await Organization.findByPk(c.organization.id))!;
    const customer = await buildCustomer(c.organization.id, { name: 'Ines Calloway' });
    const tent = await buildItem(c.organization.id, { name: 'Frame tent 20x20', kind: 'tent', tentType: 'frame', widthFt: 20, lengthFt: 20, quantityOwned: 5, rentalPriceCents: 40_000 });
    const office = await as(c.office);
    const anon = await new ApiClient(app).init();
    expect((await anon.get('/api/dashboard')).status).toBe(401);

    const empty = (await office.get('/api/dashboard')).body;
    expect(empty.today).toBe(dateInZone(new Date(), org.timeZone));
    expect(empty.money).toMatchObject({ openCount: 0, openCents: 0, overdueCount: 0, overdueCents: 0, receivedLast7DaysCents: 0, currency: org.currency });

    const first = (await office.post('/api/bookings', bookingBody(customer.id, '2031-06-14', [{ itemId: tent.id, quantity: 1, unitPriceCents: 40_000 }]))).body;
    const second = (await office.post('/api/bookings', bookingBody(customer.id, '2031-06-21', [{ itemId: tent.id, quantity: 1, unitPriceCents: 40_000 }]))).body;
    expect((await office.post(`/api/bookings/${second.id}/status`, { status: 'quoted' })).status).toBe(200);

    // Two balance invoices: the first partly paid by check, the second past its due date.
    const a = (await office.post(`/api/invoices/${(await office.post(`/api/bookings/${first.id}/invoices`, { kind: 'balance' })).body.id}/issue`)).body;
    const b = (await office.post(`/api/invoices/${(await office.post(`/api/bookings/${second.id}/invoices`, { kind: 'balance' })).body.id}/issue`)).body;
    const paid = await office.post('/api/payments', { invoiceId: a.id, method: 'check', amountCents: 10_000, reference: 'Check 1042' });
    expect(paid.status).toBe(201);
    await Invoice.update({ dueDate: addDays(dateInZone(new Date(), org.timeZone), -3) }, { where: { id: b.id } });

    const d = (await office.get('/api/dashboard')).body;
    const open = (await office.get('/api/invoices?status=open,partly_paid&pageSize=100')).body.data;
    const overdue = (await office.get('/api/invoices?status=overdue&pageSize=100')).body.data;
    expect(open).toHaveLength(2);
    expect(overdue.map((i: { id: string }) => i.id)).toEqual([b.id]);
    expect(d.money).toEqual({
      currency: org.currency,
      openCount: open.length,
      openCents: sum(open),
      overdueCount: 1,
      overdueCents: sum(overdue),
      receivedLast7DaysCents: 10_000,
    });
    // What is owed is what was invoiced less what was paid: nothing lost between them.
    expect(d.money.openCents).toBe(a.totalCents + b.totalCents - 10_000);
    expect(d.bookings).toMatchObject({ quoted: 1, awaitingSignature: 0 });

    const crew = (await (await as(c.crew)).get('/api/dashboard')).body;
    expect(crew.money).toBeNull();
    expect(crew.stops).toEqual({ deliveries: expect.any(Number), pickups: expect.any(Number), mine: 0 });
    expect(crew.bookings.quoted).toBe(1);
    const books = (await (await as(c.bookkeeper)).get('/api/dashboard')).body;
    expect(books.money.openCents).toBe(d.money.openCents);

    // Another company's figures are its own.
    const other = await buildCompany();
    const theirs = (await (await as(other.owner)).get('/api/dashboard')).body;
    expect([theirs.money.openCount, theirs.bookings.quoted]).toEqual([0, 0]);
  });
});
