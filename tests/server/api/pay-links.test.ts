/** Pay links end: on their end day, or when the office withdraws an invoice's links; a new one is sent the usual way. */
import { createHmac } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { env } from '../../../server/env';
import { AuditLog, Invoice, type User } from '../../../server/models';
import { PAY_LINK_DAYS, payLinkToken } from '../../../server/services/payLinks';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient, uniqueEmail, waitForMail } from '../../support';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const anon = () => new ApiClient(app).init();
const DAY_MS = 86_400_000;

/** A company whose customer's deposit invoice is issued (and so e-mailed with its pay link). */
async function issuedInvoice() {
  const c = await buildCompany();
  const email = uniqueEmail('payer');
  const customer = await buildCustomer(c.organization.id, { name: 'Odile Marchbank', email });
  const chairs = await buildItem(c.organization.id, { name: 'White folding chair', kind: 'chair', quantityOwned: 300, rentalPriceCents: 250 });
  const desk = await as(c.office);
  const booking = (await desk.post('/api/bookings', bookingBody(customer.id, '2027-09-25', [{ itemId: chairs.id, quantity: 80, unitPriceCents: 250, description: 'White folding chair' }], { taxRateBp: 0, damageWaiver: false }))).body;
  const draft = (await desk.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).body;
  const invoice = (await desk.post(`/api/invoices/${draft.id}/issue`)).body as { id: string; number: string; documentId: string; payUrl: string };
  expect(invoice.payUrl).toMatch(/\/pay\//);
  return { ...c, email, desk, booking, invoice };
}

const tokenOf = (text: string) => text.match(/\/pay\/([A-Za-z0-9._-]+)/)![1];

describe('POST /api/invoices/:id/pay-links/revoke', () => {
  it('401 -> 400 -> 403 -> 404 -> the office withdraws every link so far; they answer 410 and a new one works', async () => {
    const r = await issuedInvoice();
    const mailed = tokenOf((await waitForMail(r.email, { subject: new RegExp(r.invoice.number) })).text);
    const copied = tokenOf(r.invoice.payUrl);
    const visitor = await anon();
    expect((await visitor.get(`/api/pay/${mailed}`)).status).toBe(200);

    const url = `/api/invoices/${r.invoice.id}/pay-links/revoke`;
    expect((await visitor.post(url)).status).toBe(401);
    expect((await (await as(r.office)).post('/api/invoices/not-an-invoice/pay-links/revoke')).status).toBe(400);
    expect((await (await as(r.crew)).post(url)).status).toBe(403);
    expect((await (await as(r.bookkeeper)).post(url)).status).toBe(403);
    expect((await (await as((await buildCompany()).owner)).post(url)).status).toBe(404);
    expect((await visitor.get(`/api/pay/${mailed}`)).status).toBe(200);

    const revoked = await r.desk.post(url);
    expect(revoked.status).toBe(200);
    for (const token of [mailed, copied]) {
      const gone = await visitor.get(`/api/pay/${token}`);
      expect(gone.status).toBe(410);
      expect(gone.body.error.code).toBe('link_expired');
      expect(gone.body.error.message).toBe(
        `${r.organization.name} has withdrawn this pay link. Ask ${r.organization.name} to send you a new one, or sign in with your e-mail address to see what you owe and pay it there.`,
      );
      expect(gone.body.company.name).toBe(r.organization.name);
      // Nothing else of the invoice opens through it either.
      expect((await visitor.post(`/api/pay/${token}/checkout`, {})).status).toBe(410);
      expect((await visitor.get(`/api/pay/${token}/documents/${r.invoice.documentId}/pdf`)).status).toBe(410);
    }
    // The answer carries a fresh link, which works.
    const fresh = tokenOf(revoked.body.payUrl);
    expect(fresh).not.toBe(copied);
    expect((await visitor.get(`/api/pay/${fresh}`)).status).toBe(200);
    const row = await AuditLog.findOne({ where: { action: 'invoice.pay_links_revoked', subjectId: r.booking.id } });
    expect(row).toMatchObject({ actorUserId: r.office.id, data: { invoiceId: r.invoice.id, number: r.invoice.number, generation: 1 } });

    // The invoice e-mailed again (to the corrected address) carries a working link.
    const corrected = uniqueEmail('payer-corrected');
    expect((await r.desk.post(`/api/documents/${r.invoice.documentId}/send`, { to: corrected })).status).toBeLessThan(300);
    const again = tokenOf((await waitForMail(corrected, { subject: new RegExp(r.invoice.number) })).text);
    expect((await visitor.get(`/api/pay/${again}`)).status).toBe(200);
    expect((await visitor.get(`/api/pay/${mailed}`)).status).toBe(410);
  });
});

describe('a pay link’s end', () => {
  it(`works for ${PAY_LINK_DAYS} days from when it was made, then answers 410; its end cannot be moved`, async () => {
    const r = await issuedInvoice();
    const visitor = await anon();
    const now = Date.now();
    const madeJustInTime = payLinkToken(r.invoice.id, 0, new Date(now - (PAY_LINK_DAYS - 1) * DAY_MS));
    expect((await visitor.get(`/api/pay/${madeJustInTime}`)).status).toBe(200);
    const tooOld = payLinkToken(r.invoice.id, 0, new Date(now - (PAY_LINK_DAYS + 1) * DAY_MS));
    const gone = await visitor.get(`/api/pay/${tooOld}`);
    expect(gone.status).toBe(410);
    expect(gone.body.error.code).toBe('link_expired');
    expect(gone.body.error.message).toContain(`pay links work for ${PAY_LINK_DAYS} days. Ask ${r.organization.name} to send you a new one`);
    // A later end day written into the link breaks its HMAC: not one of ours.
    const [id, generation, endDay, mac] = tooOld.split('.');
    expect((await visitor.get(`/api/pay/${[id, generation, String(Number(endDay) + 30), mac].join('.')}`)).status).toBe(404);
    // Nor can a withdrawn link claim the new generation.
    await r.desk.post(`/api/invoices/${r.invoice.id}/pay-links/revoke`);
    const current = payLinkToken(r.invoice.id, 0).split('.');
    expect((await visitor.get(`/api/pay/${[current[0], '1', current[2], current[3]].join('.')}`)).status).toBe(404);
  });

  it(`a link from before links had an end (id and HMAC) works until ${PAY_LINK_DAYS} days after the issue date, and is withdrawn like the rest`, async () => {
    const r = await issuedInvoice();
    const visitor = await anon();
    // The format of the e-mails sent before this change, made as they were made.
    const key = createHmac('sha256', env.JWT_SECRET).update('guyline pay links v1').digest();
    const old = `${r.invoice.id}.${createHmac('sha256', key).update(r.invoice.id).digest('base64url').slice(0, 32)}`;
    expect((await visitor.get(`/api/pay/${old}`)).status).toBe(200);
    const issued = (await Invoice.findByPk(r.invoice.id))!;
    const daysAgo = (n: number) => new Date(Date.now() - n * DAY_MS).toISOString().slice(0, 10);
    await issued.update({ issueDate: daysAgo(PAY_LINK_DAYS + 2) });
    expect((await visitor.get(`/api/pay/${old}`)).status).toBe(410);
    await issued.update({ issueDate: daysAgo(PAY_LINK_DAYS - 2) });
    expect((await visitor.get(`/api/pay/${old}`)).status).toBe(200);
    await r.desk.post(`/api/invoices/${r.invoice.id}/pay-links/revoke`);
    expect((await visitor.get(`/api/pay/${old}`)).status).toBe(410);
  });
});
