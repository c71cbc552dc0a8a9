import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { CardCheckout, CustomerSignInToken, type User } from '../../../server/models';
import { hashToken } from '../../../server/services/tokens';
import { payLinkToken } from '../../../server/services/payLinks';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient, linkToken, mailTo, uniqueEmail, waitForMail } from '../../support';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);

/** A company with one customer whose booking has an issued deposit invoice (so the customer sees it). */
async function rental(email = uniqueEmail('renter')) {
  const c = await buildCompany();
  const customer = await buildCustomer(c.organization.id, { name: 'Tamsin Oyelaran', email });
  const chairs = await buildItem(c.organization.id, { name: 'White folding chair', kind: 'chair', quantityOwned: 300, rentalPriceCents: 250 });
  const office = await as(c.office);
  const booking = (await office.post('/api/bookings', bookingBody(customer.id, '2027-09-25', [{ itemId: chairs.id, quantity: 80, unitPriceCents: 250, description: 'White folding chair' }], { taxRateBp: 0, damageWaiver: false }))).body;
  const draft = (await office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).body;
  const invoice = (await office.post(`/api/invoices/${draft.id}/issue`)).body;
  return { ...c, customer, office, booking, invoice, email };
}

/** Signs a customer in the way they would: the e-mailed link's token traded for a session. */
async function customerSession(email: string) {
  const client = await new ApiClient(app).init();
  expect((await client.post('/api/portal/sign-in', { email, next: '/portal/bookings' })).status).toBe(202);
  const mail = await waitForMail(email, { subject: /sign-in link/i });
  const token = linkToken(mail, '/portal/welcome');
  const res = await client.post('/api/portal/sessions', { token });
  expect(res.status).toBe(200);
  expect(res.body).toMatchObject({ email, next: '/portal/bookings' });
  return { client, token };
}

describe('customer sign-in', () => {
  it('answers 202 for any address, mails a link only to a known one; the link works once and only for 15 minutes', async () => {
    const r = await rental();
    const stranger = uniqueEmail('stranger');
    const anon = await new ApiClient(app).init();
    expect((await anon.post('/api/portal/sign-in', { email: stranger })).status).toBe(202);
    expect((await anon.post('/api/portal/sign-in', { email: 'not-an-address' })).status).toBe(400);
    expect((await anon.get('/api/portal/bookings')).status).toBe(401);

    const { client, token } = await customerSession(r.email);
    const reused = await new ApiClient(app).init().then((c) => c.post('/api/portal/sessions', { token }));
    expect(reused.status).toBe(410);
    expect(reused.body.error.code).toBe('link_used');
    expect((await client.get('/api/portal/me')).body.email).toBe(r.email);
    await new Promise((res) => setTimeout(res, 300));
    expect(await mailTo(stranger)).toHaveLength(0);

    // A link older than 15 minutes is refused.
    await anon.post('/api/portal/sign-in', { email: r.email });
    const mails = await waitForMail(r.email, { subject: /sign-in link/i, count: 2 });
    const second = linkToken(mails, '/portal/welcome');
    await CustomerSignInToken.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { tokenHash: hashToken(second) } });
    expect((await anon.post('/api/portal/sessions', { token: second })).body.error.code).toBe('link_expired');

    // Signing out ends the session.
    expect((await client.post('/api/portal/sign-out')).status).toBe(204);
    expect((await client.get('/api/portal/bookings')).status).toBe(401);
  });
});

describe('the customer sees only their own', () => {
  it("a customer's session cannot open another customer's booking, invoice checkout, documents or payment", async () => {
    const mine = await rental();
    const theirs = await rental();
    const { client } = await customerSession(mine.email);

    const list = (await client.get('/api/portal/bookings')).body;
    expect(list.data.map((b: { id: string }) => b.id)).toEqual([mine.booking.id]);
    const own = await client.get(`/api/portal/bookings/${mine.booking.id}`);
    expect(own.status).toBe(200);
    expect(own.body).toMatchObject({ reference: mine.booking.reference, dueNowCents: mine.invoice.totalCents, company: { name: mine.organization.name } });
    expect(own.body.invoices).toHaveLength(1);
    // No prices of lines, no internal notes: what is rented and how many.
    expect(own.body.lines).toEqual([{ description: 'White folding chair', quantity: 80 }]);

    expect((await client.get(`/api/portal/bookings/${theirs.booking.id}`)).status).toBe(404);
    expect((await client.get(`/api/portal/documents/${theirs.invoice.documentId}/pdf`)).status).toBe(404);
    expect((await client.post(`/api/invoices/${theirs.invoice.id}/checkout`, {})).status).toBe(404);
    const pdf = await client.get(`/api/portal/documents/${mine.invoice.documentId}/pdf`);
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');

    const started = await client.post(`/api/invoices/${mine.invoice.id}/checkout`, {});
    expect(started.status).toBe(201);
    const checkout = (await CardCheckout.findByPk(started.body.checkoutId))!;
    expect(checkout.startedBy).toBe('customer');
    expect((await client.get(`/api/portal/checkouts/${checkout.id}`)).body).toMatchObject({ status: 'open', amountCents: mine.invoice.totalCents, invoiceNumber: mine.invoice.number });
    const other = await customerSession(theirs.email);
    expect((await other.client.get(`/api/portal/checkouts/${checkout.id}`)).status).toBe(404);
  });

  it('a pay link opens its own invoice only, and a made-up one opens nothing', async () => {
    const r = await rental();
    const anon = await new ApiClient(app).init();
    const token = payLinkToken(r.invoice.id);
    const link = await anon.get(`/api/pay/${token}`);
    expect(link.status).toBe(200);
    expect(link.body).toMatchObject({ bookingReference: r.booking.reference, invoice: { id: r.invoice.id, canPay: true } });
    const forged = `${r.invoice.id}.${'A'.repeat(32)}`;
    expect((await anon.get(`/api/pay/${forged}`)).status).toBe(404);
    const other = await rental();
    expect((await anon.get(`/api/pay/${token}/documents/${other.invoice.documentId}/pdf`)).status).toBe(404);
    expect((await anon.get(`/api/pay/${token}/documents/${r.invoice.documentId}/pdf`)).status).toBe(200);
    // The invoice e-mail carries the pay link.
    const mail = await waitForMail(r.email, { subject: new RegExp(r.invoice.number) });
    expect(mail.text).toContain(`/pay/${token}`);
  });
});
