import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { Booking, Document, SigningEvent, SigningRequest, type User } from '../../../server/models';
import { readFile } from '../../../server/services/storage';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient, uniqueEmail, waitForMail } from '../../support';
import type { CaughtMail } from '../../../shared/schemas/mail';

const signToken = (mail: CaughtMail) => {
  const m = mail.text.match(/\/sign\/([A-Za-z0-9_-]+)/);
  if (!m) throw new Error(`No signing link in "${mail.subject}"`);
  return m[1];
};

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const visitor = () => new ApiClient(app).init();

/** A company with a quoted booking of its only tent and an issued agreement. */
async function agreement() {
  const c = await buildCompany();
  const email = uniqueEmail('signer');
  const customer = await buildCustomer(c.organization.id, { name: 'Yara Ellery', email });
  const tent = await buildItem(c.organization.id, { name: '20x20 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 20, quantityOwned: 1, rentalPriceCents: 35_000 });
  const office = await as(c.office);
  const booking = (await office.post('/api/bookings', bookingBody(customer.id, '2027-09-18', [{ itemId: tent.id, quantity: 1, unitPriceCents: 35_000, description: '20x20 pole tent' }]))).body;
  await office.post(`/api/bookings/${booking.id}/status`, { status: 'quoted' });
  const doc = (await office.post(`/api/bookings/${booking.id}/agreement`)).body;
  return { ...c, office, customer, tent, booking, doc, email };
}

async function sendLink(a: Awaited<ReturnType<typeof agreement>>) {
  const res = await a.office.post(`/api/documents/${a.doc.id}/signature-request`, {});
  expect(res.status).toBe(201);
  const mail = await waitForMail(a.email, { subject: /sign your rental agreement/i, count: 1 });
  return { request: res.body, token: signToken(mail) };
}

async function initialsFor(token: string) {
  const page = await (await visitor()).get(`/api/sign/${token}`);
  return Object.fromEntries(page.body.clauses.map((c: { key: string }) => [c.key, 'YE']));
}

const pdfsig = (bytes: Buffer) => {
  const file = path.join(mkdtempSync(path.join(tmpdir(), 'gl-sig-')), 'signed.pdf');
  writeFileSync(file, bytes);
  // pdfsig(1), poppler-utils (Debian 12): exits 0 whether or not the signature checks out.
  return execFileSync('/usr/bin/pdfsig', [file], { encoding: 'utf8' });
};

// A drawn signature as the pad sends it: a PNG data URL (a valid 1x1 image).
const PNG = 'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==';
// The same header with a broken body: must be a 400, never a 500.
const BROKEN_PNG = 'data:image/png;base64,' + Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d49444154789c6360000002000154a24f5d0000000049454e44ae426082', 'hex').toString('base64');

describe('sending an agreement for signature', () => {
  it('401 -> 403 (bookkeeper) -> 404 (other company) -> 201, and the link arrives by e-mail', async () => {
    const a = await agreement();
    const other = await buildCompany();
    expect((await (await visitor()).post(`/api/documents/${a.doc.id}/signature-request`, {})).status).toBe(401);
    expect((await (await as(a.bookkeeper)).post(`/api/documents/${a.doc.id}/signature-request`, {})).status).toBe(403);
    expect((await (await as(other.owner)).post(`/api/documents/${a.doc.id}/signature-request`, {})).status).toBe(404);
    const { request, token } = await sendLink(a);
    expect(request).toMatchObject({ status: 'pending', sentTo: a.email, documentId: a.doc.id });
    // At least 128 bits: 32 random bytes in base64url are 43 characters; only the hash is stored.
    expect(token.length).toBeGreaterThanOrEqual(43);
    const row = (await SigningRequest.findByPk(request.id))!;
    expect(row.tokenHash).not.toContain(token);
    expect(row.tokenHash).toHaveLength(64);
  });
});

describe('the public signing page', () => {
  it('shows every element of the 15 U.S.C. §7001(c)(1) disclosure and the clauses that ask for initials', async () => {
    const a = await agreement();
    const { token } = await sendLink(a);
    const page = await (await visitor()).get(`/api/sign/${token}`);
    expect(page.status).toBe(200);
    const d = page.body.disclosure;
    // 15 U.S.C. §7001(c)(1)(B)(i): paper copy and the right to withdraw, with its consequences.
    expect(d.paperCopy).toMatch(/paper/i);
    expect(d.withdrawal).toMatch(/withdraw/i);
    // §7001(c)(1)(B)(ii): the scope of the consent.
    expect(d.scope).toMatch(/only this rental agreement/i);
    // §7001(c)(1)(B)(iii): how to withdraw and how to update contact information.
    expect(d.procedures).toMatch(/withdraw/i);
    expect(d.procedures).toMatch(/e-mail address|phone/i);
    // §7001(c)(1)(B)(iv): how to get a paper copy after consent, and any fee.
    expect(d.paperCopyRequest).toMatch(/free of charge/i);
    // §7001(c)(1)(C)(i): hardware and software requirements.
    expect(d.requirements).toMatch(/browser/i);
    expect(d.requirements).toMatch(/PDF/);
    // §7001(c)(1)(C)(ii): consent that shows the consumer can access the records.
    expect(d.demonstration).toMatch(/open the agreement as a PDF/i);
    expect(page.body.clauses.length).toBe(4);
    expect(page.body.document.html).toContain('Rental agreement');
    const pdf = await (await visitor()).get(page.body.document.pdfUrl);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    expect(await SigningEvent.count({ where: { event: 'opened' } })).toBeGreaterThan(0);
  });

  it('consent first, every initial, then a digitally signed copy that pdfsig verifies; the booking is reserved', async () => {
    const a = await agreement();
    const { token } = await sendLink(a);
    const v = await visitor();
    const initials = await initialsFor(token);
    const early = await v.post(`/api/sign/${token}`, { typedName: 'Yara Ellery', signatureImage: PNG, initials });
    expect(early.status).toBe(409);
    expect(early.body.error.code).toBe('consent_required');
    expect((await v.post(`/api/sign/${token}/consent`)).body.consentedAt).not.toBeNull();
    const missing = await v.post(`/api/sign/${token}`, { typedName: 'Yara Ellery', initials: { ...initials, weather: '' } });
    expect(missing.status).toBe(400);
    const key = Object.keys(initials)[0];
    const partial = await v.post(`/api/sign/${token}`, { typedName: 'Yara Ellery', initials: { [key]: 'YE' } });
    expect(partial.status).toBe(400);
    expect(Object.keys(partial.body.error.fields).length).toBe(Object.keys(initials).length - 1);
    expect((await Booking.findByPk(a.booking.id))!.status).toBe('quoted');

    const broken = await v.post(`/api/sign/${token}`, { typedName: 'Yara Ellery', signatureImage: BROKEN_PNG, initials });
    expect(broken.status).toBe(400);
    expect(broken.body.error.fields.signatureImage).toBeDefined();
    const signed = await v.post(`/api/sign/${token}`, { typedName: 'Yara Ellery', signatureImage: PNG, initials });
    expect(signed.status).toBe(201);
    expect((await Booking.findByPk(a.booking.id))!.status).toBe('reserved');
    const doc = (await Document.findByPk(signed.body.signedDocumentId))!;
    expect(doc.kind).toBe('signed_agreement');
    const bytes = (await readFile(doc.organizationId, doc.fileId))!.data;
    const ok = pdfsig(bytes);
    expect(ok).toContain('Signature is Valid');
    expect(ok).toContain('Total document signed');
    // One byte changed inside the signed range (the start of the file, well before /Contents).
    const tampered = Buffer.from(bytes);
    const at = tampered.indexOf('Rental agreement');
    tampered[at > 0 ? at : 200] ^= 0x01;
    expect(pdfsig(tampered)).toContain('Digest Mismatch');
    const verify = await a.office.get(`/api/documents/${doc.id}/verify`);
    expect(verify.body).toMatchObject({ hashMatches: true, signature: { signed: true, intact: true, coversWholeDocument: true } });
    const trail = (await SigningEvent.findAll({ where: { signingRequestId: (await SigningRequest.findOne({ where: { bookingId: a.booking.id } }))!.id } })).map((e) => e.event);
    expect(trail).toEqual(expect.arrayContaining(['sent', 'opened', 'consented', 'initialed', 'signed']));
    // The customer downloads the signed copy; the link cannot sign again.
    expect((await v.get(signed.body.signedPdfUrl)).status).toBe(200);
    expect((await v.post(`/api/sign/${token}`, { typedName: 'Yara Ellery', initials })).body.error.code).toBe('already_signed');
    const copy = await waitForMail(a.email, { subject: /^Signed:/ });
    expect(copy.attachments[0].sha256).toBe(doc.sha256);
  });

  it('two submissions at once sign once', async () => {
    const a = await agreement();
    const { token } = await sendLink(a);
    const v = await visitor();
    await v.post(`/api/sign/${token}/consent`);
    const initials = await initialsFor(token);
    const [x, y] = await Promise.all([
      v.post(`/api/sign/${token}`, { typedName: 'Yara Ellery', initials }),
      v.post(`/api/sign/${token}`, { typedName: 'Yara Ellery', initials }),
    ]);
    expect([x.status, y.status].sort()).toEqual([201, 409]);
    expect(await Document.count({ where: { bookingId: a.booking.id, kind: 'signed_agreement' } })).toBe(1);
  });

  it('wrong, expired, voided and replaced links each say so; nothing is signed', async () => {
    const a = await agreement();
    const v = await visitor();
    expect((await v.get('/api/sign/not-a-real-token-at-all-0123456789')).body.error.code).toBe('link_unknown');
    const first = await sendLink(a);
    const second = await a.office.post(`/api/signature-requests/${first.request.id}/resend`);
    expect(second.status).toBe(201);
    const replaced = await v.get(`/api/sign/${first.token}`);
    expect(replaced.status).toBe(410);
    expect(replaced.body.error.code).toBe('link_replaced');
    expect(replaced.body.company.name).toBe(a.organization.name);
    const mails = await waitForMail(a.email, { subject: /sign your rental agreement/i, count: 2 });
    const secondToken = signToken(mails);
    expect((await a.office.post(`/api/signature-requests/${second.body.id}/void`)).body.status).toBe('void');
    expect((await v.get(`/api/sign/${secondToken}`)).body.error.code).toBe('link_void');
    const third = await a.office.post(`/api/signature-requests/${second.body.id}/resend`);
    await SigningRequest.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { id: third.body.id } });
    const thirdToken = signToken(await waitForMail(a.email, { subject: /sign your rental agreement/i, count: 3 }));
    expect((await v.get(`/api/sign/${thirdToken}`)).body.error.code).toBe('link_expired');
    expect(await Document.count({ where: { bookingId: a.booking.id, kind: 'signed_agreement' } })).toBe(0);
  });

  it('when the stock is gone the customer is told, the office is told, and nothing is half-done', async () => {
    const a = await agreement();
    const { token } = await sendLink(a);
    // Another booking takes the only tent on the same dates first.
    const other = await buildCustomer(a.organization.id, { name: 'Someone Else' });
    const rival = (await a.office.post('/api/bookings', bookingBody(other.id, '2027-09-18', [{ itemId: a.tent.id, quantity: 1 }]))).body;
    expect((await a.office.post(`/api/bookings/${rival.id}/status`, { status: 'reserved' })).status).toBe(200);
    const v = await visitor();
    await v.post(`/api/sign/${token}/consent`);
    const res = await v.post(`/api/sign/${token}`, { typedName: 'Yara Ellery', initials: await initialsFor(token) });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('stock_gone');
    expect((await Booking.findByPk(a.booking.id))!.status).toBe('quoted');
    expect(await Document.count({ where: { bookingId: a.booking.id, kind: 'signed_agreement' } })).toBe(0);
    expect((await SigningRequest.findOne({ where: { bookingId: a.booking.id } }))!.status).toBe('pending');
    await waitForMail(a.owner.email, { subject: /no longer free/ });
    expect(await SigningEvent.count({ where: { event: 'refused_stock' } })).toBeGreaterThan(0);
  });
});
