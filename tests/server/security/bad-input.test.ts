/**
 * Bad input: every route that takes a JSON body (POST/PUT/PATCH, listed from the router) gets 200
 * property-based bodies from someone allowed to call it: random JSON values, its own keys holding
 * values of the wrong type, odd numbers and unicode, huge strings, deep nesting, extra keys, and
 * valid bodies with one value spoiled. Whatever comes, the answer is never a 5xx; a 4xx has the
 * error shape `{ error: { code, message, fields? } }` (a validation 400 names its fields); and a
 * 4xx leaves nothing half-saved in the company's main tables. Every write route also answers 413
 * to an oversized body, 415 to a body that is not JSON, and 400 to broken JSON.
 */
import fc from 'fast-check';
import { QueryTypes } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { sequelize } from '../../../server/db';
import { bookingBody } from '../../factories';
import { ApiClient } from '../../support';
import { CSRF_HEADER } from '../../../shared/types';
import { badAmount, badEmail, deepNesting, hugeString, keyed, LONE_SURROGATES, serialize, spoiled, type Shape } from './arbitraries';
import { PNG, PDF, securityFixture, send, siteCheck, type SecurityFixture } from './fixture';
import { fillPath, listRoutes, routeKey } from './routes';

type F = SecurityFixture;
interface Fuzz {
  /** Who sends it: the owner may call every staff route; public routes go without a session. */
  as: 'owner' | 'anonymous';
  params?: (f: F) => Record<string, string> | Promise<Record<string, string>>;
  shape: Shape;
  /** A valid body, spoiled one value at a time: reaches the checks behind validation. */
  base?: (f: F) => Record<string, unknown>;
  /**
   * Keys that always carry a bad value, so nearly every case fails validation: on success the
   * route e-mails, calls the card processor, renders a PDF or creates a company.
   */
  poison?: Record<string, fc.Arbitrary<unknown>>;
}
interface Skip {
  skip: string;
}

const LINE = ['itemId', 'description', 'quantity', 'unitPriceCents', 'extraDays', 'extraDayPriceCents', 'discountBp', 'discountCents', 'taxable', 'kind'];
const BOOKING: Shape = Object.fromEntries([
  ...['customerId', 'eventStart', 'eventEnd', 'deliveryStart', 'deliveryEnd', 'pickupStart', 'pickupEnd', 'siteLine1', 'siteCity', 'siteNotes', 'surface', 'anchoring',
    'utilityLocateNumber', 'utilityLocateDate', 'guestCount', 'seating', 'afterDark', 'deliveryMiles', 'setupLaborCents', 'discountBp', 'discountCents', 'damageWaiver',
    'ownInsurance', 'taxRateBp', 'securityDepositCents', 'notes'].map((k) => [k, true] as const),
  ['lines', LINE],
]);
const ITEM: Shape = Object.fromEntries(['name', 'kind', 'sku', 'description', 'quantityOwned', 'rentalPriceCents', 'extraDayPriceCents', 'replacementValueCents', 'purchaseCostCents',
  'taxable', 'active', 'tentType', 'widthFt', 'lengthFt', 'heightFt', 'sectionLengthFt', 'seats', 'polesPerSetup', 'stakesPerSetup', 'ballastPerSetupLbs', 'serviceType'].map((k) => [k, true]));
const CUSTOMER: Shape = Object.fromEntries(['type', 'name', 'contactName', 'email', 'phone', 'billingLine1', 'billingLine2', 'billingCity', 'billingRegion', 'billingPostalCode', 'notes', 'taxExempt'].map((k) => [k, true]));
const CLAUSE: Shape = { key: true, title: true, body: true, requiresInitials: true, position: true, active: true };
const keys = (...names: string[]): Shape => Object.fromEntries(names.map((k) => [k, true]));
const id = (pick: (f: F) => string) => (f: F) => ({ id: pick(f) });
const bookingId = (pick: (f: F) => string) => (f: F) => ({ bookingId: pick(f) });
const tentLine = (f: F) => ({ itemId: f.tent.id, quantity: 1, unitPriceCents: 90_000, description: 'Frame tent' });

// prettier-ignore
const FUZZ: Record<string, Fuzz | Skip> = {
  'POST /api/webhooks/stripe':                  { as: 'anonymous', shape: keys('id', 'type', 'data', 'object', 'created', 'livemode') },
  'POST /api/auth/signup':                      { as: 'anonymous', shape: keys('organizationName', 'name', 'email', 'password'), poison: { email: badEmail } },
  'POST /api/auth/signup/confirm':              { as: 'anonymous', shape: keys('token') },
  'POST /api/auth/login':                       { as: 'anonymous', shape: keys('email', 'password') },
  'POST /api/auth/logout':                      { skip: 'takes no body (and would end the session)' },
  'POST /api/auth/logout-all':                  { skip: 'takes no body (and would end every session)' },
  'POST /api/auth/password-reset/request':      { as: 'anonymous', shape: keys('email') },
  'POST /api/auth/password-reset/confirm':      { as: 'anonymous', shape: keys('token', 'password') },
  'POST /api/auth/invites/accept':              { as: 'anonymous', shape: keys('token', 'name', 'password') },
  'POST /api/users/invite':                     { as: 'owner', shape: keys('email', 'name', 'role'), poison: { email: badEmail } },
  'PATCH /api/users/:id':                       { as: 'owner', params: id((f) => f.target.id), shape: keys('role', 'disabled') },
  'POST /api/users/:id/resend-invite':          { skip: 'takes no body (and e-mails an invitation each time)' },
  'POST /api/planner':                          { as: 'owner', shape: keys('widthFt', 'lengthFt', 'guests', 'seating', 'openSided', 'afterDark'), base: () => ({ guests: 120, seating: 'banquet', afterDark: true }) },
  'POST /api/quotes/preview':                   {
    as: 'owner',
    shape: { ...keys('taxRateBp', 'taxExempt', 'discountBp', 'discountCents', 'deliveryMiles', 'setupLaborCents', 'damageWaiverBp', 'depositBp', 'depositMinCents', 'securityDepositCents', 'balanceDueDays', 'signingDate', 'eventDate'), lines: LINE, deliveryBands: ['upToMiles', 'feeCents'] },
    base: () => ({ lines: [{ description: 'Tent', quantity: 2, unitPriceCents: 10_000, extraDays: 1, extraDayPriceCents: 2_000, discountBp: 500 }], taxRateBp: 887.5, deliveryMiles: 12, deliveryBands: [{ upToMiles: 25, feeCents: 5_000 }], depositBp: 3000 }),
  },
  'POST /api/availability/check':               { as: 'owner', shape: { ...keys('from', 'to', 'excludeBookingId'), lines: ['itemId', 'quantity'] }, base: (f) => ({ from: '2031-01-01T00:00:00Z', to: '2031-03-01T00:00:00Z', lines: [{ itemId: f.tent.id, quantity: 3 }] }) },
  'PUT /api/organization/rules':                {
    as: 'owner',
    shape: { ...keys('taxRateBp', 'depositBp', 'depositMinCents', 'balanceDueDays', 'damageWaiverBp', 'turnaroundHours', 'permitAreaSqFt', 'sqFtPerGuest', 'invoicePrefix', 'reminders', 'signingLinkDays', 'windLimitMph', 'can'), deliveryBands: ['upToMiles', 'feeCents'] },
    base: () => ({ taxRateBp: 725, turnaroundHours: 24, sqFtPerGuest: { banquet: 8, rows: 6, standing: 5, mixed: 8 }, deliveryBands: [{ upToMiles: 10, feeCents: 7_500 }] }),
  },
  'POST /api/exports/history/:id/cancel':       { skip: 'takes no body (marks a download cancelled)' },
  'POST /api/bookings/:id/agreement':           { skip: 'takes no body (issues a PDF each time)' },
  'POST /api/bookings/:id/invoice':             { skip: 'takes no body (issues an invoice and its PDF)' },
  'POST /api/bookings/:id/receipt':             { skip: 'takes no body: 410, moved to payments' },
  'POST /api/bookings/:id/credit-note':         { skip: 'takes no body: 410, moved to invoices' },
  'POST /api/documents/:id/send':               { as: 'owner', params: id((f) => f.agreement.id), shape: keys('to'), poison: { to: badEmail } },
  'PUT /api/templates/:name':                   { as: 'owner', params: () => ({ name: 'email-credit-note' }), shape: keys('source'), base: (f) => ({ source: f.template.source }) },
  'POST /api/templates/:name/preview':          { as: 'owner', params: () => ({ name: 'invoice' }), shape: keys('source', 'bookingId'), base: (f) => ({ source: f.template.source, bookingId: f.bookings.reserved.id }) },
  'POST /api/clauses':                          { as: 'owner', shape: CLAUSE, base: (f) => f.clauseBody() },
  'PUT /api/clauses/:id':                       { as: 'owner', params: id((f) => f.clause.id), shape: CLAUSE, base: (f) => f.clauseBody() },
  'POST /api/documents/:id/signature-request':  { as: 'owner', params: id((f) => f.agreement.id), shape: keys('to'), poison: { to: badEmail } },
  'POST /api/signature-requests/:id/resend':    { skip: 'takes no body (e-mails a new link each time)' },
  'POST /api/signature-requests/:id/void':      { skip: 'takes no body' },
  'POST /api/sign/:token/consent':              { skip: 'takes no body' },
  'POST /api/sign/:token/withdraw-consent':     { skip: 'takes no body' },
  // A consented link: bodies get past consent to the initials and the drawing.
  'POST /api/sign/:token':                      {
    as: 'anonymous', params: async (f) => ({ token: await consentedToken(f) }), shape: keys('typedName', 'signatureImage', 'initials'),
    base: () => ({ typedName: 'Quennell Ashby', initials: { 'no-such-clause': 'QA' }, signatureImage: `data:image/png;base64,${PNG.toString('base64')}` }),
  },
  'POST /api/bookings/:id/invoices':            { as: 'owner', params: id((f) => f.bookings.reserved.id), shape: { kind: true, lines: ['charge', 'description', 'amountCents', 'taxable'] }, base: () => ({ kind: 'additional', lines: [{ charge: 'damage', description: 'Torn sidewall', amountCents: 12_000 }] }) },
  'POST /api/invoices/:id/issue':               { skip: 'takes no body (issues the invoice and its PDF)' },
  'POST /api/invoices/:id/pay-links/revoke':   { skip: 'takes no body (withdraws the invoice\'s pay links)' },
  'POST /api/invoices/:id/void':                { as: 'owner', params: async (f) => ({ id: await f.fresh.openInvoice() }), shape: keys('reason') },
  'POST /api/invoices/:id/credit-notes':        { as: 'owner', params: id((f) => f.openInvoice.id), shape: keys('amountCents', 'reason'), poison: { amountCents: badAmount } },
  'POST /api/invoices/:id/apply-credit':        { as: 'owner', params: id((f) => f.openInvoice.id), shape: keys('amountCents') },
  'POST /api/customers/:id/credit/refunds':     { as: 'owner', params: id((f) => f.customer.id), shape: keys('amountCents', 'method', 'reason'), base: () => ({ amountCents: 100, method: 'cash', reason: 'Paid back' }) },
  'POST /api/payments':                         { as: 'owner', shape: { ...keys('method', 'reference', 'receivedAt', 'invoiceId', 'amountCents', 'keepExcessAsCredit'), allocations: ['invoiceId', 'amountCents'] }, poison: { amountCents: badAmount } },
  'POST /api/payments/:id/refunds':             { as: 'owner', params: id((f) => f.payment.id), shape: keys('amountCents', 'reason'), base: () => ({ amountCents: 1, reason: 'Charged twice' }) },
  'POST /api/bookings/:id/security-deposit':    { as: 'owner', params: id((f) => f.bookings.reserved.id), shape: keys('action', 'invoiceId', 'amountCents', 'method', 'reason'), base: (f) => ({ action: 'apply', invoiceId: f.openInvoice.id, amountCents: 100 }) },
  'PUT /api/ledger/accounts/:id':               { as: 'owner', params: id((f) => f.account.id), shape: keys('code', 'name') },
  // A valid body closes the fixture's books through a day long before anything it posts.
  'PUT /api/ledger/lock-date':                  { as: 'owner', shape: keys('closedThrough'), base: () => ({ closedThrough: '2001-01-31' }) },
  'POST /api/portal/sign-in':                   { as: 'anonymous', shape: keys('email', 'next'), poison: { email: badEmail } },
  'POST /api/portal/sessions':                  { as: 'anonymous', shape: keys('token') },
  'POST /api/portal/sign-out':                  { skip: 'takes no body' },
  'POST /api/portal/bookings/:id/sign':         { skip: "takes no body (opens a signing link on the customer's own booking)" },
  'POST /api/invoices/:id/checkout':            { as: 'owner', params: id((f) => f.openInvoice.id), shape: keys('amountCents'), poison: { amountCents: badAmount } },
  'POST /api/pay/:token/checkout':              { as: 'anonymous', params: (f) => ({ token: f.payToken }), shape: keys('amountCents'), poison: { amountCents: badAmount } },
  'POST /api/organization/logo':                { skip: 'multipart upload: its 413 and 415 are checked below' },
  'PATCH /api/organization':                    { as: 'owner', shape: keys('name', 'addressLine1', 'addressLine2', 'city', 'region', 'postalCode', 'country', 'phone', 'email', 'currency', 'timeZone') },
  'POST /api/items':                            { as: 'owner', shape: ITEM, base: () => ({ name: 'Fuzz chair', kind: 'chair', rentalPriceCents: 250, quantityOwned: 10 }) },
  'POST /api/items/import':                     { skip: 'multipart upload: its 413 and 415 are checked below' },
  'PUT /api/items/:id':                         { as: 'owner', params: id((f) => f.tent.id), shape: ITEM, base: (f) => ({ name: f.tent.name, kind: 'tent', tentType: 'frame', widthFt: 20, lengthFt: 40, quantityOwned: 200, rentalPriceCents: 90_000 }) },
  'POST /api/customers':                        { as: 'owner', shape: CUSTOMER, base: () => ({ name: 'Fuzz Customer', email: 'fuzz@example.test', phone: '555-0100' }) },
  'PUT /api/customers/:id':                     { as: 'owner', params: id((f) => f.certCustomer.id), shape: CUSTOMER, base: (f) => ({ name: f.certCustomer.name, taxExempt: true }) },
  'POST /api/customers/:id/exemption-certificate': { skip: 'multipart upload: its 413 and 415 are checked below' },
  'POST /api/bookings':                         { as: 'owner', shape: BOOKING, base: (f) => bookingBody(f.customer.id, '2032-06-10', [tentLine(f)], { guestCount: 60 }) },
  'PUT /api/bookings/:id':                      { as: 'owner', params: id((f) => f.bookings.draft.id), shape: BOOKING, base: (f) => bookingBody(f.customer.id, '2032-06-12', [tentLine(f)]) },
  'POST /api/bookings/:id/status':              { as: 'owner', params: id((f) => f.bookings.draft.id), shape: keys('status', 'note') },
  'PUT /api/field/bookings/:bookingId/site-check':     { as: 'owner', params: bookingId((f) => f.bookings.reserved.id), shape: keys(...Object.keys(siteCheck), 'hardSurfaceBallast', 'privateLines', 'privateLinesNotes', 'buildingClearanceFt', 'lotLineClearanceFt', 'locateRequestedOn', 'notes'), base: () => siteCheck },
  'POST /api/field/bookings/:bookingId/ready-to-stake': { skip: 'takes no body' },
  'POST /api/field/bookings/:bookingId/marks':  { as: 'owner', params: bookingId((f) => f.bookings.out.id), shape: keys('mark') },
  'PUT /api/field/bookings/:bookingId/return-check':   { as: 'owner', params: bookingId((f) => f.bookings.out.id), shape: { ...keys('notes', 'submit'), lines: ['key', 'returned', 'damaged', 'notes'] } },
  'POST /api/field/bookings/:bookingId/photos': { skip: 'multipart upload: its 413 and 415 are checked below' },
  'PUT /api/field/bookings/:bookingId/crew':    { as: 'owner', params: bookingId((f) => f.bookings.reserved.id), shape: { userIds: true }, base: (f) => ({ userIds: [f.a.crew.id] }) },
  'POST /api/field/calendar-feed':              { skip: 'takes no body' },
  'POST /api/field/bookings/:bookingId/charges': { as: 'owner', params: bookingId((f) => f.bookings.out.id), shape: { lines: ['key', 'charge', 'description', 'amountCents'] } },
};

/** The uploads: the limit each route declares, and who may upload. */
const UPLOADS: Record<string, { maxBytes: number; params?: (f: F) => Record<string, string>; query?: Record<string, string>; who: 'owner' | 'crew' }> = {
  'POST /api/organization/logo': { maxBytes: 1024 * 1024, who: 'owner' },
  'POST /api/items/import': { maxBytes: 1024 * 1024, who: 'owner' },
  'POST /api/customers/:id/exemption-certificate': { maxBytes: 5 * 1024 * 1024, params: id((f) => f.certCustomer.id), who: 'owner' },
  'POST /api/field/bookings/:bookingId/photos': { maxBytes: 10 * 1024 * 1024, params: bookingId((f) => f.bookings.reserved.id), query: { stage: 'site' }, who: 'crew' },
};

async function consentedToken(f: F) {
  const token = await f.fresh.signingToken();
  await send(f.clients.anonymous, { method: 'POST', url: `/api/sign/${token}/consent` });
  return token;
}

/** Rows of the company's main tables: a 4xx must leave every count as it was. */
const TABLES = ['bookings', 'booking_lines', 'invoices', 'payments', 'journal_entries', 'customers', 'items', 'documents'];
async function counts(organizationId: string) {
  const [row] = await sequelize.query<Record<string, string>>(
    `SELECT ${TABLES.map((t) => `(SELECT count(*) FROM ${t} WHERE organization_id = :org) AS ${t}`).join(', ')}`,
    { replacements: { org: organizationId }, type: QueryTypes.SELECT },
  );
  return row;
}

function post(c: ApiClient, method: string, url: string, text: string, contentType = 'application/json') {
  const m = method.toLowerCase() as 'post' | 'put' | 'patch';
  let r = c.agent[m](url).set('X-Forwarded-For', c.ip).set('Content-Type', contentType);
  if (c.csrf) r = r.set(CSRF_HEADER, c.csrf);
  return r.send(text);
}

/** The one error shape; a validation 400 names each field with a message. */
function expectErrorShape(res: { status: number; body: unknown }, context: string) {
  const error = (res.body as { error?: { code?: unknown; message?: unknown; fields?: unknown } })?.error;
  expect(error, `${context}: no { error } in ${JSON.stringify(res.body).slice(0, 300)}`).toBeTruthy();
  expect(typeof error!.code === 'string' && typeof error!.message === 'string' && (error!.message as string).length > 0, `${context}: error without code or message`).toBe(true);
  if (error!.fields !== undefined) {
    expect(typeof error!.fields === 'object' && Object.values(error!.fields as object).every((m) => typeof m === 'string' && m.length > 0), `${context}: fields must map to messages`).toBe(true);
  }
  if (res.status === 400 && error!.code === 'validation') expect(Object.keys((error!.fields as object) ?? {}).length, `${context}: a validation 400 names its fields`).toBeGreaterThan(0);
}

function bodiesFor(fuzz: Fuzz, f: F): fc.Arbitrary<unknown> {
  const choices: fc.WeightedArbitrary<unknown>[] = [
    { weight: 2, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
    { weight: 6, arbitrary: keyed(fuzz.shape) },
    { weight: 1, arbitrary: deepNesting },
    { weight: 1, arbitrary: hugeString },
  ];
  if (fuzz.base) choices.push({ weight: 6, arbitrary: spoiled(fuzz.base(f)) });
  const poison = fuzz.poison;
  const any = fc.oneof(...choices);
  if (!poison) return any;
  // Objects get the poisoned keys on top; anything else fails validation by its shape already.
  return fc.tuple(any, fc.record(poison)).map(([body, bad]) => (body && typeof body === 'object' && !Array.isArray(body) ? { ...body, ...bad } : body));
}

const app = createApp();
const routes = listRoutes(app);
const writes = routes.filter((r) => ['POST', 'PUT', 'PATCH'].includes(r.method));
let f: F;

beforeAll(async () => {
  f = await securityFixture(app);
}, 120_000);

describe('the fuzz table covers the router', () => {
  it('names every POST, PUT and PATCH route, as fuzzed or as taking no JSON body', () => {
    const missing = writes.map(routeKey).filter((k) => !(k in FUZZ));
    expect(missing, `Add these routes to FUZZ in tests/server/security/bad-input.test.ts (their body's keys, who may call them):\n  ${missing.join('\n  ')}`).toEqual([]);
    const known = new Set(writes.map(routeKey));
    expect(Object.keys(FUZZ).filter((k) => !known.has(k)), 'FUZZ rows for routes that are gone').toEqual([]);
  });
});

describe('200 bad bodies for each route: never a 5xx, always the error shape, nothing half-saved', () => {
  for (const route of writes) {
    const key = routeKey(route);
    const fuzz = FUZZ[key];
    if (!fuzz || 'skip' in fuzz) continue;
    it(key, async () => {
      const client = f.clients[fuzz.as === 'owner' ? 'owner' : 'anonymous'];
      const url = fillPath(route.path, (await fuzz.params?.(f)) ?? {});
      // The counts after one request are the counts before the next: one query a case.
      let before = await counts(f.org);
      await fc.assert(
        fc.asyncProperty(bodiesFor(fuzz, f), async (body) => {
          const text = serialize(body);
          const res = await post(client, route.method, url, text);
          const context = `${key} with ${text.slice(0, 200)} -> ${res.status}`;
          expect(res.status, `${context} ${JSON.stringify(res.body).slice(0, 300)}`).toBeLessThan(500);
          const after = await counts(f.org);
          if (res.status >= 400) {
            expectErrorShape(res, context);
            expect(after, `${context}: a refused request changed the tables`).toEqual(before);
          }
          before = after;
        }),
        // The first failure is reported as found: shrinking would replay hundreds of requests.
        { numRuns: 200, endOnFailure: true },
      );
    }, 120_000);
  }
});

describe('text PostgreSQL cannot store', () => {
  it('a null character (U+0000) is a 400 naming the field, in a body, a query or a path, never a 500', async () => {
    const owner = f.clients.owner;
    const inBody = await send(owner, { method: 'POST', url: '/api/customers', body: { name: 'Nul\u0000 Person' } });
    // Was a 500: the audit row's JSONB refuses it.
    const inReason = await send(owner, { method: 'POST', url: `/api/payments/${f.payment.id}/refunds`, body: { amountCents: 1, reason: 'a\u0000b' } });
    const inQuery = await send(owner, { method: 'GET', url: '/api/customers', query: { q: 'a\u0000b' } });
    const inPath = await send(f.clients.anonymous, { method: 'GET', url: `/api/auth/invites/${'t'.repeat(30)}%00` });
    expect([inBody, inReason, inQuery, inPath].map((r) => [r.status, Object.keys(r.body.error?.fields ?? {})])).toEqual([
      [400, ['name']],
      [400, ['reason']],
      [400, ['q']],
      [400, ['token']],
    ]);
  });

  // Found by this file's fuzzing: the refund's audit row (JSONB) answered 500 before validate() refused lone surrogates.
  it('half of a surrogate pair is a 400 naming the field, never a 500; a whole emoji is fine', async () => {
    const owner = f.clients.owner;
    const half = await send(owner, { method: 'POST', url: `/api/customers/${f.customer.id}/credit/refunds`, body: { amountCents: 100, method: 'cash', reason: LONE_SURROGATES[1] } });
    expect([half.status, Object.keys(half.body.error?.fields ?? {})]).toEqual([400, ['reason']]);
    expect((await send(owner, { method: 'POST', url: '/api/customers', body: { name: 'Tent party 🎪' } })).status).toBe(201);
  });

  it("in an uploaded file's name: never a 500", async () => {
    const csv = Buffer.from('name,kind,quantity_owned,rental_price\r\nNul chair,chair,4,2.50\r\n');
    const uploads = [
      await send(f.clients.owner, { method: 'POST', url: '/api/items/import', upload: { bytes: csv, filename: 'stock\u0000.csv', contentType: 'text/csv' } }),
      await send(f.clients.owner, { method: 'POST', url: '/api/organization/logo', upload: { bytes: PNG, filename: 'logo\u0000.png', contentType: 'image/png' } }),
      await send(f.clients.office, { method: 'POST', url: `/api/customers/${f.certCustomer.id}/exemption-certificate`, upload: { bytes: PDF, filename: 'cert\u0000.pdf', contentType: 'application/pdf' } }),
    ];
    // busboy refuses a part header with a null (or any control character) in it: the form is malformed, a 400.
    expect(uploads.map((r) => r.status)).toEqual([400, 400, 400]);
    uploads.forEach((r) => expectErrorShape(r, 'malformed upload'));
  });
});

describe('bodies the parser refuses, before any route', () => {
  const oversized = JSON.stringify({ notes: 'x'.repeat(1024 * 1024 + 10) });
  it('413 for a JSON body over 1 MB, 415 for a body that is not JSON, 400 for broken JSON: on every write route', async () => {
    const wrong: string[] = [];
    for (const route of writes) {
      const key = routeKey(route);
      const url = fillPath(route.path, Object.fromEntries([...route.path.matchAll(/:(\w+)/g)].map((m) => [m[1], '00000000-0000-4000-8000-000000000000'])));
      const c = f.clients.owner;
      // The webhook reads raw bytes of any type: its answer to all three is the missing signature.
      const webhook = key === 'POST /api/webhooks/stripe';
      const cases: [string, string, number][] = [
        ['oversized JSON', oversized, 413],
        ['text/plain', 'amountCents=100', webhook ? 400 : 415],
        ['broken JSON', '{"amountCents": 100,', 400],
      ];
      for (const [what, text, status] of cases) {
        const res = await post(c, route.method, url, text, what === 'text/plain' ? 'text/plain' : 'application/json');
        if (res.status !== status) wrong.push(`${key} ${what}: expected ${status}, got ${res.status}`);
        else expectErrorShape(res, `${key} ${what}`);
      }
      const form = await post(c, route.method, url, 'amountCents=100', 'application/x-www-form-urlencoded');
      if (form.status !== (webhook ? 400 : 415)) wrong.push(`${key} form-encoded: expected ${webhook ? 400 : 415}, got ${form.status}`);
    }
    expect(wrong).toEqual([]);
  }, 120_000);

  it('a body nested 300,000 deep (JSON.parse takes it) is never a 5xx, on every fuzzed route', async () => {
    const deep = `${'['.repeat(300_000)}1${']'.repeat(300_000)}`;
    for (const route of writes) {
      const fuzz = FUZZ[routeKey(route)];
      if (!fuzz || 'skip' in fuzz) continue;
      const res = await post(f.clients[fuzz.as], route.method, fillPath(route.path, (await fuzz.params?.(f)) ?? {}), deep);
      expect(res.status, routeKey(route)).toBeLessThan(500);
      if (res.status >= 400) expectErrorShape(res, routeKey(route));
      // The rules route merges the sent fields over the current rules; an array is no set of fields.
      if (routeKey(route) === 'PUT /api/organization/rules') expect(res.status).toBe(400);
    }
  }, 120_000);

  it('uploads: 413 for a file over the limit, 415 for JSON instead of a file', async () => {
    for (const [key, upload] of Object.entries(UPLOADS)) {
      const [method, path] = key.split(' ');
      const url = fillPath(path, upload.params?.(f) ?? {});
      const c = f.clients[upload.who];
      const big = Buffer.concat([key.includes('exemption') ? PDF : PNG, Buffer.alloc(upload.maxBytes + 1 - PNG.length)]);
      const tooLarge = await send(c, { method, url, query: upload.query, upload: { bytes: big, filename: 'big.png', contentType: 'image/png' } });
      expect(tooLarge.status, key).toBe(413);
      expectErrorShape(tooLarge, key);
      const json = await send(c, { method, url, query: upload.query, body: { file: 'not a file' } });
      expect(json.status, key).toBe(415);
      expectErrorShape(json, key);
      // A form cut off in the middle of the file: the request's fault, a 400.
      const cut = await c.agent.post(url).query(upload.query ?? {}).set('X-Forwarded-For', c.ip).set(CSRF_HEADER, c.csrf)
        .set('Content-Type', 'multipart/form-data; boundary=----guyline').send('------guyline\r\nContent-Disposition: form-data; name="file"; filename="a.png"\r\nContent-Type: image/png\r\n\r\n\x89PNG');
      expect(cut.status, key).toBe(400);
      expectErrorShape(cut, key);
    }
  }, 120_000);
});
