/**
 * The world the security tests act in: company A with one record of every kind the API names in
 * a path (bookings in each state, invoices, a payment, documents, signing links, a photo, a
 * clause, a calendar feed...), a signed-in client for every role, and company B whose owner must
 * find none of A's records. Records a request uses up (a draft to issue, a clause to delete, a
 * session to end) are made fresh for each attempt by the `fresh` makers.
 */
import type { Express } from 'express';
import type { Test } from 'supertest';
import { expect } from 'vitest';
import { createCalendarFeed } from '../../../server/commands/fieldCalendar';
import { openSigningLink } from '../../../server/commands/signing';
import { withTransaction } from '../../../server/db';
import { CustomerSignInToken, Document, type User } from '../../../server/models';
import { payLinkToken } from '../../../server/services/payLinks';
import { newToken } from '../../../server/services/tokens';
import { CSRF_HEADER } from '../../../shared/types';
import { bookingBody, buildCompany, buildCustomer, buildItem, buildUser, TEST_PASSWORD } from '../../factories';
import { ApiClient, linkToken, uniqueEmail, waitForMail } from '../../support';

/** Who tries a route: nobody, a customer signed in to their pages, each staff role of A, B's owner. */
export const WHO = ['anonymous', 'customer', 'crew', 'office', 'bookkeeper', 'owner', 'otherOwner'] as const;
export type Who = (typeof WHO)[number];
type StaffRole = 'crew' | 'office' | 'bookkeeper' | 'owner';

// A 1x1 PNG (PNG signature, IHDR, IDAT, IEND; PNG specification, ISO/IEC 15948).
export const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da6364f8cf500f00038601805a347d6b0000000049454e44ae426082', 'hex');
/** The smallest file file-type reads as a PDF: the %PDF- header is what it checks. */
export const PDF = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n');

export interface Upload {
  bytes: Buffer;
  filename: string;
  contentType: string;
}

export interface Call {
  method: string;
  url: string;
  query?: Record<string, string>;
  /** Sent as JSON. */
  body?: unknown;
  /** Sent as multipart/form-data in the field `file`. */
  upload?: Upload;
}

/** One request through a client, as the browser sends it: its address, and the CSRF header on writes. */
export function send(c: ApiClient, call: Call): Test {
  const method = call.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  let r = c.agent[method](call.url).set('X-Forwarded-For', c.ip).redirects(0);
  if (method !== 'get' && c.csrf) r = r.set(CSRF_HEADER, c.csrf);
  if (call.query) r = r.query(call.query);
  if (call.upload) return r.attach('file', call.upload.bytes, { filename: call.upload.filename, contentType: call.upload.contentType });
  if (call.body !== undefined) r = r.set('Content-Type', 'application/json').send(JSON.stringify(call.body));
  return r;
}

/** Sends and expects a 2xx: for building the fixture, where a failure should say what failed. */
async function ok(c: ApiClient, call: Call) {
  const res = await send(c, call);
  expect(res.status, `${call.method} ${call.url}: ${JSON.stringify(res.body)}`).toBeLessThan(300);
  return res.body;
}

/** A site checklist with an 811 locate ticket: staking can be marked ready on it. */
export const siteCheck = { locateRequested: true, locateNumber: '811-2031-0001', windMph: 8, exitsPlanned: true };

const rand = () => Math.random().toString(36).slice(2, 8);

export async function securityFixture(app: Express) {
  const signIn = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);

  const a = await buildCompany();
  const org = a.organization.id;
  // Spares of each role: requests that end sessions (logout, logout-all) use these, so the main clients stay signed in.
  const spares: Record<StaffRole, User> = {
    crew: await buildUser({ organizationId: org, role: 'crew' }),
    office: await buildUser({ organizationId: org, role: 'office' }),
    bookkeeper: await buildUser({ organizationId: org, role: 'bookkeeper' }),
    owner: await buildUser({ organizationId: org, role: 'owner' }),
  };
  const target = await buildUser({ organizationId: org, role: 'office', name: 'Target Office' });
  const invited = await buildUser({ organizationId: org, role: 'crew', status: 'invited' });
  const feedUser = await buildUser({ organizationId: org, role: 'crew', name: 'Feed Crew' });
  const loginUser = await buildUser({ organizationId: org, role: 'crew', name: 'Login Crew' });
  const b = await buildCompany();
  const bSpareOwner = await buildUser({ organizationId: b.organization.id, role: 'owner' });

  // Names that appear in A's records and nowhere else (booking references are per company, so not
  // these): B's owner must never read them.
  const customerEmail = uniqueEmail('renter');
  const customer = await buildCustomer(org, { name: `Quennell Ashby ${rand()}`, email: customerEmail });
  const certCustomer = await buildCustomer(org, { name: `Tamsin Exempt ${rand()}` });
  const tent = await buildItem(org, {
    name: `Marquee ${rand()}`, kind: 'tent', tentType: 'frame', widthFt: 20, lengthFt: 40, quantityOwned: 200, rentalPriceCents: 90_000,
    replacementValueCents: 500_000, polesPerSetup: 12, stakesPerSetup: 16, ballastPerSetupLbs: 2000,
  });
  const markers = [a.organization.name, customer.name, certCustomer.name, tent.name];

  const office = await signIn(a.office);
  const owner = await signIn(a.owner);
  const crew = await signIn(a.crew);
  const bookkeeper = await signIn(a.bookkeeper);
  const otherOwner = await signIn(b.owner);

  let day = 0;
  /** A booking of one tent on its own day (2031 onwards, so it never meets another test's stock). */
  const newBooking = async (status?: 'quoted' | 'reserved' | 'out') => {
    day += 3;
    const date = new Date(Date.UTC(2031, 0, 1) + day * 86_400_000).toISOString().slice(0, 10);
    const booking = await ok(office, {
      method: 'POST', url: '/api/bookings',
      body: bookingBody(customer.id, date, [{ itemId: tent.id, quantity: 1, unitPriceCents: 90_000, description: tent.name }], { securityDepositCents: 50_000, siteLine1: '4 Larch Lane', siteCity: 'Millbrook' }),
    });
    const path: string[] = status === 'out' ? ['reserved', 'out'] : status ? [status] : [];
    for (const s of path) await ok(office, { method: 'POST', url: `/api/bookings/${booking.id}/status`, body: { status: s } });
    return booking as { id: string; reference: string };
  };
  const agreementOf = async (bookingId: string) => (await ok(office, { method: 'POST', url: `/api/bookings/${bookingId}/agreement` })) as { id: string };
  /** A draft additional-charges invoice on a booking (any number can be made), and one issued. */
  const draftInvoiceOn = async (bookingId: string) =>
    (await ok(office, { method: 'POST', url: `/api/bookings/${bookingId}/invoices`, body: { kind: 'additional', lines: [{ charge: 'cleaning', description: 'Cleaning the floor', amountCents: 4_000 }] } })).id as string;
  const issue = async (invoiceId: string) => (await ok(office, { method: 'POST', url: `/api/invoices/${invoiceId}/issue` })) as { id: string; documentId: string; totalCents: number };

  const draft = await newBooking();
  const quoted = await newBooking('quoted');
  const reserved = await newBooking('reserved');
  const out = await newBooking('out');
  const invoiceBooking = await newBooking('quoted');
  const agreementBooking = await newBooking('quoted');

  // Money on the reserved booking: an open deposit invoice (the customer sees it), partly paid.
  const depositDraft = await ok(office, { method: 'POST', url: `/api/bookings/${reserved.id}/invoices`, body: { kind: 'deposit' } });
  const openInvoice = await issue(depositDraft.id);
  const payment = (await ok(office, { method: 'POST', url: '/api/payments', body: { method: 'check', invoiceId: openInvoice.id, amountCents: 10_000, reference: '1001' } })) as { id: string };
  // Account credit for the customer (an overpayment kept as credit), so credit can be applied and paid back.
  const overpaid = await issue(await draftInvoiceOn(reserved.id));
  await ok(office, { method: 'POST', url: '/api/payments', body: { method: 'cash', invoiceId: overpaid.id, amountCents: overpaid.totalCents + 5_000, keepExcessAsCredit: true } });
  const agreement = await agreementOf(reserved.id);
  const signatureRequest = (await ok(office, { method: 'POST', url: `/api/documents/${agreement.id}/signature-request`, body: {} })) as { id: string };

  // A signed agreement (for the signed copy's link) and an agreement whose links the tests open afresh.
  const signedBooking = await newBooking('quoted');
  const signedDoc = await agreementOf(signedBooking.id);
  const pendingDoc = await agreementOf(quoted.id);
  /** A signing link's token, as the e-mail would carry it (the office's command that e-mails it, without the e-mail). */
  const link = async (docId: string) =>
    withTransaction(async (t) => (await openSigningLink(a.office, (await Document.findByPk(docId, { transaction: t }))!, customerEmail, null, t)).token);
  const signedToken = await link(signedDoc.id);
  const anon = await new ApiClient(app).init();
  const page = await ok(anon, { method: 'GET', url: `/api/sign/${signedToken}` });
  const initials = Object.fromEntries((page.clauses as { key: string }[]).map((c) => [c.key, 'QA']));
  await ok(anon, { method: 'POST', url: `/api/sign/${signedToken}/consent` });
  await ok(anon, { method: 'POST', url: `/api/sign/${signedToken}`, body: { typedName: 'Quennell Ashby', initials } });

  // The customer signs in to their pages the way they would: the e-mailed link's token for a session.
  const customerClient = await new ApiClient(app).init();
  await ok(customerClient, { method: 'POST', url: '/api/portal/sign-in', body: { email: customerEmail } });
  const mail = await waitForMail(customerEmail, { subject: /sign-in link/i });
  await ok(customerClient, { method: 'POST', url: '/api/portal/sessions', body: { token: linkToken(mail, '/portal/welcome') } });
  const customerCheckout = (await ok(customerClient, { method: 'POST', url: `/api/invoices/${openInvoice.id}/checkout`, body: {} })) as { checkoutId: string };
  const payToken = payLinkToken(openInvoice.id);
  const linkCheckout = (await ok(anon, { method: 'POST', url: `/api/pay/${payToken}/checkout`, body: {} })) as { checkoutId: string };

  // Field: crew on the reserved booking, its locate ticket (so staking can be marked ready), a photo of the site.
  await ok(office, { method: 'PUT', url: `/api/field/bookings/${reserved.id}/crew`, body: { userIds: [a.crew.id] } });
  await ok(crew, { method: 'PUT', url: `/api/field/bookings/${reserved.id}/site-check`, body: siteCheck });
  const withPhoto = await ok(crew, { method: 'POST', url: `/api/field/bookings/${reserved.id}/photos`, query: { stage: 'site' }, upload: { bytes: PNG, filename: 'site.png', contentType: 'image/png' } });
  const photoId = (withPhoto.photos as { id: string }[])[0].id;

  // Files: both companies' logos, a customer's exemption certificate.
  const logo: Upload = { bytes: PNG, filename: 'logo.png', contentType: 'image/png' };
  await ok(owner, { method: 'POST', url: '/api/organization/logo', upload: logo });
  await ok(otherOwner, { method: 'POST', url: '/api/organization/logo', upload: logo });
  const certificate: Upload = { bytes: PDF, filename: 'exempt.pdf', contentType: 'application/pdf' };
  await ok(office, { method: 'POST', url: `/api/customers/${certCustomer.id}/exemption-certificate`, upload: certificate });

  // The owner's library and books.
  const clauseBody = () => ({ key: `security-${rand()}`, title: 'Stakes and guy lines', body: 'Keep clear of the guy lines.', position: 900 });
  const clause = (await ok(owner, { method: 'POST', url: '/api/clauses', body: clauseBody() })) as { id: string };
  const template = (await ok(owner, { method: 'GET', url: '/api/templates/invoice' })) as { source: string };
  const accounts = (await ok(owner, { method: 'GET', url: '/api/ledger/accounts' })).data as { id: string; code: string; name: string }[];

  const fresh = {
    /** A new signed-in client for the role, as a spare person of it (B's spare owner for otherOwner). */
    client: async (who: Who): Promise<ApiClient> => {
      if (who === 'anonymous') return new ApiClient(app).init();
      if (who === 'customer') {
        const c = await new ApiClient(app).init();
        await ok(c, { method: 'POST', url: '/api/portal/sessions', body: { token: await fresh.customerLinkToken() } });
        return c;
      }
      return signIn(who === 'otherOwner' ? bSpareOwner : spares[who]);
    },
    /** A sign-in link's token, as the e-mail would carry it (the row the sign-in route writes). */
    customerLinkToken: async () => {
      const { token, hash } = newToken();
      await CustomerSignInToken.create({ organizationId: org, email: customerEmail, tokenHash: hash, next: null, expiresAt: new Date(Date.now() + 15 * 60_000) });
      return token;
    },
    draftBooking: async () => (await newBooking()).id,
    draftInvoice: () => draftInvoiceOn(reserved.id),
    openInvoice: async () => (await issue(await draftInvoiceOn(reserved.id))).id,
    clause: async () => (await ok(owner, { method: 'POST', url: '/api/clauses', body: clauseBody() })).id as string,
    certCustomer: async () => {
      const c = await buildCustomer(org, { name: 'Certificate Holder' });
      await ok(office, { method: 'POST', url: `/api/customers/${c.id}/exemption-certificate`, upload: certificate });
      return c.id;
    },
    calendarFile: async () => `${(await withTransaction((t) => createCalendarFeed(feedUser, null as never, t))).token}.ics`,
    signingToken: () => link(pendingDoc.id),
    /** A photo the office took on the reserved booking (the crew may not take it off; the office and the owner may). */
    photo: async () => {
      const body = await ok(office, { method: 'POST', url: `/api/field/bookings/${reserved.id}/photos`, query: { stage: 'site' }, upload: { bytes: PNG, filename: 'extra.png', contentType: 'image/png' } });
      const photos = body.photos as { id: string }[];
      return photos[photos.length - 1].id;
    },
    signatureRequest: async () => (await ok(office, { method: 'POST', url: `/api/documents/${agreement.id}/signature-request`, body: {} })).id as string,
  };

  return {
    app, a, b, org, customer, customerEmail, certCustomer, tent, target, invited, loginUser, markers,
    clients: { anonymous: anon, customer: customerClient, crew, office, bookkeeper, owner, otherOwner } satisfies Record<Who, ApiClient>,
    bookings: { draft, quoted, reserved, out, invoiceBooking, agreementBooking, signedBooking },
    openInvoice, payment, agreement, signatureRequest, signedToken, payToken, photoId, clause, template, account: accounts[0],
    checkouts: { customer: customerCheckout.checkoutId, link: linkCheckout.checkoutId },
    uploads: { logo, certificate, photo: { bytes: PNG, filename: 'site.png', contentType: 'image/png' } satisfies Upload },
    clauseBody, fresh,
  };
}

export type SecurityFixture = Awaited<ReturnType<typeof securityFixture>>;
