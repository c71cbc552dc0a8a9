import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { Document, DocumentSend, Invoice, StoredFile, type User } from '../../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient, uniqueEmail, waitForMail } from '../../support';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const anon = () => new ApiClient(app).init();

async function bookingFor(office: User, organizationId: string, email = uniqueEmail('renter')) {
  const customer = await buildCustomer(organizationId, { name: 'Ulla Pellow', email });
  const tent = await buildItem(organizationId, { name: '20x20 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 20, quantityOwned: 1, rentalPriceCents: 35_000 });
  const o = await as(office);
  const res = await o.post('/api/bookings', bookingBody(customer.id, '2027-06-19', [{ itemId: tent.id, quantity: 1, unitPriceCents: 35_000, description: '20x20 pole tent' }], { taxRateBp: 725, damageWaiver: false }));
  return { client: o, booking: res.body, email };
}

const pdfBytes = (c: ApiClient, id: string) =>
  c.agent.get(`/api/documents/${id}/pdf`).set('X-Forwarded-For', c.ip).buffer(true).parse((res, cb) => {
    const chunks: Buffer[] = [];
    res.on('data', (x: Buffer) => chunks.push(x));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  });

describe('issuing documents', () => {
  it('401 -> 403 (crew) -> 404 (other company) -> 201; a new version replaces the old one; the PDF is the stored bytes', async () => {
    const { office, crew, organization } = await buildCompany();
    const other = await buildCompany();
    const { client: o, booking } = await bookingFor(office, organization.id);
    expect((await (await anon()).post(`/api/bookings/${booking.id}/agreement`)).status).toBe(401);
    expect((await (await as(crew)).post(`/api/bookings/${booking.id}/agreement`)).status).toBe(403);
    expect((await (await as(other.owner)).post(`/api/bookings/${booking.id}/agreement`)).status).toBe(404);

    const first = await o.post(`/api/bookings/${booking.id}/agreement`);
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({ kind: 'rental_agreement', version: 1, status: 'issued', number: `RA-${booking.reference}`, bookingId: booking.id });
    const pdf = await pdfBytes(o, first.body.id);
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-disposition']).toMatch(/^attachment; filename="RA-B-\d+\.pdf"$/);
    expect(pdf.headers['x-content-type-options']).toBe('nosniff');
    expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
    expect(createHash('sha256').update(pdf.body as Buffer).digest('hex')).toBe(first.body.sha256);

    const second = await o.post(`/api/bookings/${booking.id}/agreement`);
    expect(second.body).toMatchObject({ version: 2, number: `RA-${booking.reference}-2`, status: 'issued' });
    expect((await o.get(`/api/documents/${first.body.id}`)).body.status).toBe('replaced');
    // The first version's bytes never change.
    const again = await pdfBytes(o, first.body.id);
    expect(createHash('sha256').update(again.body as Buffer).digest('hex')).toBe(first.body.sha256);

    // One invoice series: the booking's invoice is an invoice record, numbered per company and year.
    const invoice = await o.post(`/api/bookings/${booking.id}/invoice`);
    expect(invoice.status).toBe(201);
    expect(invoice.body.number).toMatch(/^INV-\d{4}-0001$/);
    expect(await Invoice.count({ where: { bookingId: booking.id, kind: 'balance', status: 'open', documentId: invoice.body.id } })).toBe(1);
    expect((await o.post(`/api/bookings/${booking.id}/invoice`)).body.error.code).toBe('nothing_to_invoice');
    const list = await o.get(`/api/bookings/${booking.id}/documents`);
    expect(list.body.data.map((d: { version: number; kind: string }) => `${d.kind}:${d.version}`)).toEqual(['invoice:1', 'rental_agreement:2', 'rental_agreement:1']);
    expect((await (await as(crew)).get(`/api/documents/${first.body.id}`)).status).toBe(404);
    expect(await StoredFile.count({ where: { organizationId: organization.id, purpose: 'document:rental_agreement' } })).toBe(2);
  });

  it('sends the exact stored PDF by e-mail once, even when asked twice at once', async () => {
    const { office, organization } = await buildCompany();
    const { client: o, booking, email } = await bookingFor(office, organization.id);
    const doc = (await o.post(`/api/bookings/${booking.id}/agreement`)).body;
    const [a, b] = await Promise.all([o.post(`/api/documents/${doc.id}/send`, {}), o.post(`/api/documents/${doc.id}/send`, {})]);
    expect([a.status, b.status]).toEqual([202, 202]);
    expect(a.body.send.id).toBe(b.body.send.id);
    const mail = await waitForMail(email, { subject: /agreement/i });
    expect(mail.attachments).toHaveLength(1);
    expect(mail.attachments[0]).toMatchObject({ contentType: 'application/pdf', sha256: doc.sha256 });
    await expect.poll(async () => (await DocumentSend.findByPk(a.body.send.id))?.status, { timeout: 10_000 }).toBe('sent');
    expect(await DocumentSend.count({ where: { documentId: doc.id } })).toBe(1);
    const history = await o.get(`/api/bookings/${booking.id}/history`);
    expect(history.body.data.map((h: { action: string }) => h.action)).toEqual(expect.arrayContaining(['document.issued', 'document.send_queued', 'document.sent']));
    expect(await Document.count({ where: { bookingId: booking.id } })).toBe(1);
  });
});

describe('receipts, credit notes and the logo', () => {
  // A 1x1 PNG (PNG signature, IHDR, IDAT, IEND).
  const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da6364f8cf500f00038601805a347d6b0000000049454e44ae426082', 'hex');

  it('receipts and credit notes are no longer written free-hand: they come from payments and credits on invoices', async () => {
    const { office, owner, organization } = await buildCompany();
    const { client: o, booking } = await bookingFor(office, organization.id);
    const receipt = await o.post(`/api/bookings/${booking.id}/receipt`, { amountCents: 11_261, method: 'check', receivedAt: '2027-05-01T15:00:00Z' });
    expect(receipt.status).toBe(410);
    expect(receipt.body.error.message).toMatch(/\/api\/payments/);
    const credit = await (await as(owner)).post(`/api/bookings/${booking.id}/credit-note`, { amountCents: 5_000, reason: 'Two chairs arrived broken' });
    expect(credit.status).toBe(410);
    expect(await Document.count({ where: { bookingId: booking.id } })).toBe(0);
  });

  it('the owner uploads a PNG or JPEG logo that documents print; other files are refused', async () => {
    const { owner, office } = await buildCompany();
    const o = await as(owner);
    const up = (c: ApiClient, bytes: Buffer, name: string) =>
      c.agent.post('/api/organization/logo').set('X-CSRF-Token', c.csrf).set('X-Forwarded-For', c.ip).attach('file', bytes, name);
    expect((await up(await as(office), PNG, 'logo.png')).status).toBe(403);
    expect((await up(o, Buffer.from('%PDF-1.4 not an image'), 'logo.png')).status).toBe(415);
    expect((await up(o, Buffer.alloc(1024 * 1024 + 1, 1), 'logo.png')).status).toBe(413);
    const ok = await up(o, PNG, 'logo.png');
    expect(ok.status).toBe(200);
    expect(ok.body.hasLogo).toBe(true);
    expect((await o.get('/api/organization/logo')).headers['content-type']).toBe('image/png');
    expect((await o.delete('/api/organization/logo')).body.hasLogo).toBe(false);
  });
});

describe('templates and clauses', () => {
  it('a template with an unknown variable or bad syntax is a 400 naming the line; nothing is saved', async () => {
    const { owner, office } = await buildCompany();
    const o = await as(owner);
    const list = await o.get('/api/templates');
    expect(list.body.data.map((t: { name: string }) => t.name)).toContain('rental-agreement');
    const bad = await o.agent.put('/api/templates/invoice').set('X-CSRF-Token', o.csrf).set('X-Forwarded-For', o.ip).send({ source: '# Invoice\n\nHello {{customer.name}}\n\nTotal {{totals.totl}}\n' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('template_invalid');
    expect(bad.body.problems[0]).toMatchObject({ line: 5 });
    expect(bad.body.error.fields.source).toMatch(/^line 5: /);
    const syntax = await o.agent.put('/api/templates/invoice').set('X-CSRF-Token', o.csrf).set('X-Forwarded-For', o.ip).send({ source: '# Invoice\n\n{{#each lines}}\n{{description}}\n' });
    expect(syntax.status).toBe(400);
    expect(syntax.body.problems[0].line).toBeGreaterThanOrEqual(3);
    expect((await o.get('/api/templates/invoice')).body.isDefault).toBe(true);
    const off = await as(office);
    expect((await off.agent.put('/api/templates/invoice').set('X-CSRF-Token', off.csrf).set('X-Forwarded-For', off.ip).send({ source: '# x' })).status).toBe(403);
    const good = await o.agent.put('/api/templates/invoice').set('X-CSRF-Token', o.csrf).set('X-Forwarded-For', o.ip).send({ source: '# Invoice {{document.number}}\n\nFor {{customer.name}}.\n\n{{lineItems}}\n' });
    expect(good.status).toBe(200);
    expect(good.body.isDefault).toBe(false);
    expect((await o.delete('/api/templates/invoice')).body.isDefault).toBe(true);
  });

  it('the clause library starts from the defaults and the agreement carries the company\'s clauses', async () => {
    const { owner, office, organization } = await buildCompany();
    const o = await as(owner);
    const clauses = await o.get('/api/clauses');
    expect(clauses.body.total).toBeGreaterThanOrEqual(11);
    const titles = clauses.body.data.map((c: { title: string }) => c.title.toLowerCase()).join(' | ');
    for (const word of ['utilit', 'wind', 'damage', 'fire', 'electric', 'cancel', 'payment']) expect(titles).toContain(word);
    const bad = await o.post('/api/clauses', { key: 'pets', title: 'Pets', body: 'Dogs stay out of {{booking.tnet}}.', position: 500 });
    expect(bad.status).toBe(400);
    expect(bad.body.problems[0]).toMatchObject({ line: 1 });
    const added = await o.post('/api/clauses', { key: 'pets', title: 'Pets under the tent', body: 'Pets stay outside the tent at {{booking.reference}}.', requiresInitials: true, position: 500 });
    expect(added.status).toBe(201);
    const { booking } = await bookingFor(office, organization.id);
    const doc = await o.post(`/api/bookings/${booking.id}/agreement`);
    const stored = await Document.findByPk(doc.body.id);
    expect(stored!.markdown).toContain('Pets under the tent');
    expect(stored!.markdown).toContain(`Pets stay outside the tent at ${booking.reference}.`);
  });
});

describe('editing a booking after its documents were issued', () => {
  it('issues a new version of the agreement when what it says changed, and none when nothing did', async () => {
    const { office, organization } = await buildCompany();
    const { client: o, booking } = await bookingFor(office, organization.id);
    const first = (await o.post(`/api/bookings/${booking.id}/agreement`)).body;
    const put = (body: Record<string, unknown>) => o.agent.put(`/api/bookings/${booking.id}`).set('X-CSRF-Token', o.csrf).set('X-Forwarded-For', o.ip).send(body);
    const same = {
      customerId: booking.customer.id, eventStart: booking.eventStart, eventEnd: booking.eventEnd, deliveryStart: booking.deliveryStart,
      deliveryEnd: booking.deliveryEnd, pickupStart: booking.pickupStart, pickupEnd: booking.pickupEnd, taxRateBp: 725, damageWaiver: false,
      lines: booking.lines.map((l: Record<string, unknown>) => ({ itemId: l.itemId, description: l.description, quantity: l.quantity, unitPriceCents: l.unitPriceCents, taxable: l.taxable, kind: l.kind })),
    };
    expect((await put(same)).status).toBe(200);
    expect(await Document.count({ where: { bookingId: booking.id, kind: 'rental_agreement' } })).toBe(1);
    expect((await put({ ...same, guestCount: 30, siteNotes: 'Gate is 9 ft wide' })).status).toBe(200);
    const versions = await Document.findAll({ where: { bookingId: booking.id, kind: 'rental_agreement' }, order: [['version', 'ASC']] });
    expect(versions.map((d) => `${d.version}:${d.status}`)).toEqual(['1:replaced', '2:issued']);
    expect(versions[0].id).toBe(first.id);
    expect(versions[1].markdown).toContain('Gate is 9 ft wide');
  });
});
