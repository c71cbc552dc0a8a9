/**
 * The permission matrix: every route the router has (listed from the router itself, routes.ts),
 * tried as nobody, a customer signed in to their pages, the crew, the office, the bookkeeper and
 * the owner of company A, and the owner of company B on A's records. The table says which answer
 * each should get; the test fails on any difference, on a route without a row, and on a row
 * whose route is gone.
 *
 * Columns: anonymous · customer · crew · office · bookkeeper · owner · other (B's owner).
 *   'ok'   the guard let the request through: 2xx/3xx, or a validation or state answer (400, 409,
 *          410, 422) about the request itself;
 *   a number: exactly that status (401 no session, 403 role refused, 404 not yours or hidden...).
 * Bodies of successful answers are not checked: the point is who gets past the guard. Every
 * answer B's owner gets is checked to carry none of A's names.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { env } from '../../../server/env';
import { startMailSink } from '../../../server/fakes/mailSink';
import { ExportRun, Organization } from '../../../server/models';
import { bookingBody, TEST_PASSWORD } from '../../factories';
import { uniqueEmail } from '../../support';
import { send, securityFixture, siteCheck, WHO, type SecurityFixture, type Upload, type Who } from './fixture';
import { keysOf } from '../api/fieldCompany';
import { fillPath, listRoutes, routeKey } from './routes';

type F = SecurityFixture;
interface Probe {
  /** Path parameters, fetched again for each attempt (fresh records where a request uses one up). */
  params?: (f: F) => Record<string, string> | Promise<Record<string, string>>;
  query?: (f: F) => Record<string, string>;
  body?: (f: F) => unknown | Promise<unknown>;
  upload?: (f: F) => Upload;
  /** Each attempt on a fresh client of the role: the request ends or replaces the session. */
  fresh?: true;
  /** Run once before the attempts. */
  before?: (f: F) => Promise<void>;
  /** Why no role gets a 2xx here (a state answer is the best the route can give with this fixture). */
  stateOnly?: string;
}
interface Row extends Probe {
  expect: Record<Who, string>;
}

const row = (expected: string, probe: Probe = {}): Row => {
  const cells = expected.trim().split(/\s+/);
  if (cells.length !== WHO.length) throw new Error(`A row needs ${WHO.length} columns: "${expected}"`);
  return { ...probe, expect: Object.fromEntries(WHO.map((w, i) => [w, cells[i]])) as Record<Who, string> };
};

const id = (pick: (f: F) => string) => (f: F) => ({ id: pick(f) });
const bookingId = (pick: (f: F) => string) => (f: F) => ({ bookingId: pick(f) });
const range = () => ({ from: '2031-01-01', to: '2031-12-31' });
const token43 = () => 'x'.repeat(43);
const crewDay = '2031-01-04';

/** Both companies have a logo (DELETE /api/organization/logo takes it away). */
async function ensureLogos(f: F) {
  for (const who of ['owner', 'otherOwner'] as const) {
    const org = await Organization.findByPk(who === 'owner' ? f.org : f.b.organization.id);
    if (!org!.logoFileId) await send(f.clients[who], { method: 'POST', url: '/api/organization/logo', upload: f.uploads.logo });
  }
}

// prettier-ignore
const MATRIX: Record<string, Row> = {
  //                                                    anon customer crew office books owner other
  'POST /api/webhooks/stripe':                   row('400  400  400  400  400  400  400', { body: () => ({ type: 'checkout.session.completed' }) }), // no signature header: the processor's signature is the only key
  'GET /api/health':                             row('ok   ok   ok   ok   ok   ok   ok'),

  // --- staff sign-in ---------------------------------------------------------------------------
  'POST /api/auth/signup':                       row('ok   ok   ok   ok   ok   ok   ok', { fresh: true, body: () => ({ organizationName: 'Matrix Rentals', name: 'New Owner', email: uniqueEmail('signup'), password: 'a long enough password' }) }),
  'POST /api/auth/signup/confirm':               row('ok   ok   ok   ok   ok   ok   ok', { body: () => ({ token: token43() }), stateOnly: 'a made-up token: 400 invalid_token, whoever asks' }),
  'POST /api/auth/login':                        row('ok   ok   ok   ok   ok   ok   ok', { fresh: true, body: (f) => ({ email: f.loginUser.email, password: TEST_PASSWORD }) }),
  'POST /api/auth/logout':                       row('401  401  ok   ok   ok   ok   ok', { fresh: true }),
  'POST /api/auth/logout-all':                   row('401  401  ok   ok   ok   ok   ok', { fresh: true }),
  'GET /api/auth/me':                            row('401  401  ok   ok   ok   ok   ok'),
  'POST /api/auth/password-reset/request':       row('ok   ok   ok   ok   ok   ok   ok', { body: () => ({ email: uniqueEmail('nobody') }) }),
  'POST /api/auth/password-reset/confirm':       row('ok   ok   ok   ok   ok   ok   ok', { body: () => ({ token: token43(), password: 'a long enough password' }), stateOnly: 'a made-up token: 400 invalid_token, whoever asks' }),
  'GET /api/auth/invites/:token':                row('ok   ok   ok   ok   ok   ok   ok', { params: () => ({ token: token43() }), stateOnly: 'a made-up token: 400 invalid_token, whoever asks' }),
  'POST /api/auth/invites/accept':               row('ok   ok   ok   ok   ok   ok   ok', { body: () => ({ token: token43(), password: 'a long enough password' }), stateOnly: 'a made-up token: 400 invalid_token, whoever asks' }),

  // --- users: the owner's ----------------------------------------------------------------------
  'GET /api/users':                              row('401  401  403  403  403  ok   ok'),
  'POST /api/users/invite':                      row('401  401  403  403  403  ok   ok', { body: () => ({ email: uniqueEmail('invitee'), name: 'Invited Person', role: 'crew' }) }),
  'PATCH /api/users/:id':                        row('401  401  403  403  403  ok   404', { params: id((f) => f.target.id), body: () => ({ role: 'office' }) }),
  'POST /api/users/:id/resend-invite':           row('401  401  403  403  403  ok   404', { params: id((f) => f.invited.id) }),

  // --- planning ----------------------------------------------------------------------------------
  'POST /api/planner':                           row('401  401  ok   ok   ok   ok   ok', { body: () => ({ guests: 80, seating: 'banquet' }) }),
  'POST /api/quotes/preview':                    row('401  401  403  ok   ok   ok   ok', { body: () => ({ lines: [{ description: 'Tent', quantity: 1, unitPriceCents: 10_000 }], taxRateBp: 725 }) }),
  // B's owner asking about A's tent gets an empty answer: items are looked up within the asker's company.
  'POST /api/availability/check':                row('401  401  ok   ok   ok   ok   ok', { body: (f) => ({ from: '2031-01-01T00:00:00Z', to: '2031-02-01T00:00:00Z', lines: [{ itemId: f.tent.id, quantity: 1 }] }) }),
  // The company's terms (tax rate, deposit share, delivery bands) are printed on every agreement; the crew's booking screen reads the rest (turnaround, space per guest, wind limit).
  'GET /api/organization/rules':                 row('401  401  ok   ok   ok   ok   ok'),
  'PUT /api/organization/rules':                 row('401  401  403  403  403  ok   ok', { body: () => ({}) }),

  // --- documents: crew never see one (404: documents carry prices; to the crew they do not exist) --
  'POST /api/bookings/:id/agreement':            row('401  401  403  ok   403  ok   404', { params: id((f) => f.bookings.agreementBooking.id) }),
  'POST /api/bookings/:id/invoice':              row('401  401  403  ok   403  ok   404', { params: id((f) => f.bookings.invoiceBooking.id) }),
  // Moved: receipts come from payments, credit notes from invoices; any signed-in person is told where.
  'POST /api/bookings/:id/receipt':              row('401  401  410  410  410  410  410', { params: id((f) => f.bookings.reserved.id) }),
  'POST /api/bookings/:id/credit-note':          row('401  401  410  410  410  410  410', { params: id((f) => f.bookings.reserved.id) }),
  'GET /api/bookings/:id/documents':             row('401  401  403  ok   ok   ok   404', { params: id((f) => f.bookings.reserved.id) }),
  'GET /api/documents/:id':                      row('401  401  404  ok   ok   ok   404', { params: id((f) => f.agreement.id) }),
  'GET /api/documents/:id/pdf':                  row('401  401  404  ok   ok   ok   404', { params: id((f) => f.agreement.id) }),
  'POST /api/documents/:id/send':                row('401  401  404  ok   403  ok   404', { params: id((f) => f.agreement.id), body: () => ({}) }),
  'GET /api/templates':                          row('401  401  403  ok   ok   ok   ok'),
  'GET /api/templates/:name':                    row('401  401  403  ok   ok   ok   ok', { params: () => ({ name: 'invoice' }) }),
  'PUT /api/templates/:name':                    row('401  401  403  403  403  ok   ok', { params: () => ({ name: 'invoice' }), body: (f) => ({ source: f.template.source }) }),
  'DELETE /api/templates/:name':                 row('401  401  403  403  403  ok   ok', { params: () => ({ name: 'invoice' }) }),
  'POST /api/templates/:name/preview':           row('401  401  403  ok   ok   ok   404', { params: () => ({ name: 'invoice' }), body: (f) => ({ source: f.template.source, bookingId: f.bookings.reserved.id }) }),
  'GET /api/clauses':                            row('401  401  403  ok   ok   ok   ok'),
  'POST /api/clauses':                           row('401  401  403  403  403  ok   ok', { body: (f) => f.clauseBody() }),
  'PUT /api/clauses/:id':                        row('401  401  403  403  403  ok   404', { params: id((f) => f.clause.id), body: (f) => f.clauseBody() }),
  'DELETE /api/clauses/:id':                     row('401  401  403  403  403  ok   404', { params: async (f) => ({ id: await f.fresh.clause() }) }),

  // --- signing: the office's side, then the customer's (the token is the key) ----------------------
  'POST /api/documents/:id/signature-request':   row('401  401  404  ok   403  ok   404', { params: id((f) => f.agreement.id), body: () => ({}) }),
  'GET /api/documents/:id/signature-requests':   row('401  401  404  ok   ok   ok   404', { params: id((f) => f.agreement.id) }),
  // 403, not 404, for the crew: the link is found in their company, then the role is refused.
  'POST /api/signature-requests/:id/resend':     row('401  401  403  ok   403  ok   404', { params: id((f) => f.signatureRequest.id) }),
  'POST /api/signature-requests/:id/void':       row('401  401  403  ok   403  ok   404', { params: async (f) => ({ id: await f.fresh.signatureRequest() }) }),
  'GET /api/documents/:id/verify':               row('401  401  404  ok   ok   ok   404', { params: id((f) => f.agreement.id) }),
  'GET /api/sign/:token':                        row('ok   ok   ok   ok   ok   ok   ok', { params: (f) => ({ token: f.signedToken }) }),
  'GET /api/sign/:token/document.pdf':           row('ok   ok   ok   ok   ok   ok   ok', { params: (f) => ({ token: f.signedToken }) }),
  'POST /api/sign/:token/consent':               row('ok   ok   ok   ok   ok   ok   ok', { params: async (f) => ({ token: await f.fresh.signingToken() }) }),
  'POST /api/sign/:token/withdraw-consent':      row('ok   ok   ok   ok   ok   ok   ok', { params: async (f) => ({ token: await f.fresh.signingToken() }) }),
  'POST /api/sign/:token':                       row('ok   ok   ok   ok   ok   ok   ok', {
    params: async (f) => ({ token: await f.fresh.signingToken() }), body: () => ({ typedName: 'Quennell Ashby', initials: {} }),
    stateOnly: 'a fresh link has no consent yet: 409 consent_required once the token is accepted (signing itself is in signing.test.ts)',
  }),
  'GET /api/sign/:token/signed.pdf':             row('ok   ok   ok   ok   ok   ok   ok', { params: (f) => ({ token: f.signedToken }) }),

  // --- money: the crew sees none; the bookkeeper reads; the office records; the owner gives back ----
  'GET /api/invoices':                           row('401  401  403  ok   ok   ok   ok'),
  'GET /api/invoices/:id':                       row('401  401  403  ok   ok   ok   404', { params: id((f) => f.openInvoice.id) }),
  'POST /api/bookings/:id/invoices':             row('401  401  403  ok   403  ok   404', { params: id((f) => f.bookings.reserved.id), body: () => ({ kind: 'additional', lines: [{ charge: 'late_return', description: 'Returned a day late', amountCents: 2_000 }] }) }),
  'POST /api/invoices/:id/issue':                row('401  401  403  ok   403  ok   404', { params: async (f) => ({ id: await f.fresh.draftInvoice() }) }),
  'POST /api/invoices/:id/void':                 row('401  401  403  403  403  ok   404', { params: async (f) => ({ id: await f.fresh.openInvoice() }), body: () => ({ reason: 'Entered twice' }) }),
  'POST /api/invoices/:id/pay-links/revoke':     row('401  401  403  ok   403  ok   404', { params: async (f) => ({ id: await f.fresh.openInvoice() }) }),
  'POST /api/invoices/:id/credit-notes':         row('401  401  403  ok   403  ok   404', { params: async (f) => ({ id: await f.fresh.openInvoice() }), body: () => ({ amountCents: 100, reason: 'Goodwill' }) }),
  'POST /api/invoices/:id/apply-credit':         row('401  401  403  ok   403  ok   404', { params: id((f) => f.openInvoice.id), body: () => ({ amountCents: 100 }) }),
  'GET /api/customers/:id/credit':               row('401  401  403  ok   ok   ok   404', { params: id((f) => f.customer.id) }),
  'POST /api/customers/:id/credit/refunds':      row('401  401  403  403  403  ok   404', { params: id((f) => f.customer.id), body: () => ({ amountCents: 100, method: 'cash', reason: 'Paid back in cash' }) }),
  // 400, not 404, for B's owner: the invoice id is in the body, and an id that is not theirs is an unknown invoice.
  'POST /api/payments':                          row('401  401  403  ok   403  ok   400', { body: (f) => ({ method: 'cash', invoiceId: f.openInvoice.id, amountCents: 100 }) }),
  'GET /api/bookings/:id/payments':              row('401  401  403  ok   ok   ok   404', { params: id((f) => f.bookings.reserved.id) }),
  'GET /api/bookings/:id/ledger':                row('401  401  403  ok   ok   ok   404', { params: id((f) => f.bookings.reserved.id) }),
  'POST /api/payments/:id/refunds':              row('401  401  403  403  403  ok   404', { params: id((f) => f.payment.id), body: () => ({ amountCents: 100, reason: 'Charged twice' }) }),
  'POST /api/bookings/:id/security-deposit':     row('401  401  403  ok   403  ok   404', { params: id((f) => f.bookings.reserved.id), body: () => ({ action: 'collect', amountCents: 100, method: 'cash' }) }),
  'GET /api/ledger/accounts':                    row('401  401  403  ok   ok   ok   ok'),
  'PUT /api/ledger/accounts/:id':                row('401  401  403  403  403  ok   404', { params: id((f) => f.account.id), body: (f) => ({ code: f.account.code, name: f.account.name }) }),
  'GET /api/customers/:id/statement':            row('401  401  403  ok   ok   ok   404', { params: id((f) => f.customer.id) }),
  'GET /api/ledger/trial-balance':               row('401  401  403  ok   ok   ok   ok', { query: () => ({ at: '2031-12-31' }) }),
  // Closing the books: the bookkeeper's and the owner's, each for their own company (closed-periods.test.ts).
  'GET /api/ledger/lock-date':                   row('401  401  403  403  ok   ok   ok'),
  'PUT /api/ledger/lock-date':                   row('401  401  403  403  ok   ok   ok', { body: () => ({ closedThrough: '2001-01-31' }) }),

  // --- the customer's own pages: a staff session is not a customer's -------------------------------
  'POST /api/portal/sign-in':                    row('ok   ok   ok   ok   ok   ok   ok', { body: () => ({ email: uniqueEmail('stranger') }) }),
  'POST /api/portal/sessions':                   row('ok   ok   ok   ok   ok   ok   ok', { fresh: true, body: (f) => f.fresh.customerLinkToken().then((token) => ({ token })) }),
  'GET /api/portal/me':                          row('401  ok   401  401  401  401  401'),
  'POST /api/portal/sign-out':                   row('ok   ok   ok   ok   ok   ok   ok', { fresh: true }), // signing out needs no session
  'GET /api/portal/bookings':                    row('401  ok   401  401  401  401  401'),
  'GET /api/portal/bookings/:id':                row('401  ok   401  401  401  401  401', { params: id((f) => f.bookings.reserved.id) }),
  'POST /api/portal/bookings/:id/sign':          row('401  ok   401  401  401  401  401', { params: id((f) => f.bookings.reserved.id) }),
  'GET /api/portal/documents/:id/pdf':           row('401  ok   401  401  401  401  401', { params: id((f) => f.openInvoice.documentId) }),
  // The invoice's own customer, or the office handing over the payment page.
  'POST /api/invoices/:id/checkout':             row('401  ok   403  ok   403  ok   404', { params: id((f) => f.openInvoice.id), body: () => ({}) }),
  'GET /api/portal/checkouts/:id':               row('401  ok   401  401  401  401  401', { params: id((f) => f.checkouts.customer) }),
  'GET /api/pay/:token':                         row('ok   ok   ok   ok   ok   ok   ok', { params: (f) => ({ token: f.payToken }) }),
  'POST /api/pay/:token/checkout':               row('ok   ok   ok   ok   ok   ok   ok', { params: (f) => ({ token: f.payToken }), body: () => ({}) }),
  'GET /api/pay/:token/checkouts/:checkoutId':   row('ok   ok   ok   ok   ok   ok   ok', { params: (f) => ({ token: f.payToken, checkoutId: f.checkouts.link }) }),
  'GET /api/pay/:token/documents/:documentId/pdf': row('ok ok   ok   ok   ok   ok   ok', { params: (f) => ({ token: f.payToken, documentId: f.openInvoice.documentId }) }),

  // --- the company ---------------------------------------------------------------------------------
  'POST /api/organization/logo':                 row('401  401  403  403  403  ok   ok', { upload: (f) => f.uploads.logo }),
  'GET /api/organization/logo':                  row('401  401  ok   ok   ok   ok   ok', { before: ensureLogos }),
  'DELETE /api/organization/logo':               row('401  401  403  403  403  ok   ok'),
  'GET /api/organization':                       row('401  401  ok   ok   ok   ok   ok'),
  'PATCH /api/organization':                     row('401  401  403  403  403  ok   ok', { body: () => ({}) }),

  // --- catalog: the owner keeps it; everyone reads it (the crew without prices) ------------------------
  'GET /api/items':                              row('401  401  ok   ok   ok   ok   ok'),
  'POST /api/items':                             row('401  401  403  403  403  ok   ok', { body: () => ({ name: 'Banquet chair', kind: 'chair', rentalPriceCents: 250 }) }),
  'POST /api/items/import':                      row('401  401  403  403  403  ok   ok', {
    query: () => ({ dryRun: 'true' }),
    upload: () => ({ bytes: Buffer.from('name,kind,quantity_owned,rental_price\r\nGarden chair,chair,10,2.50\r\n'), filename: 'stock.csv', contentType: 'text/csv' }),
  }),
  'GET /api/items/:id':                          row('401  401  ok   ok   ok   ok   404', { params: id((f) => f.tent.id) }),
  'PUT /api/items/:id':                          row('401  401  403  403  403  ok   404', { params: id((f) => f.tent.id), body: (f) => ({ name: f.tent.name, kind: 'tent', tentType: 'frame', widthFt: 20, lengthFt: 40, quantityOwned: 200, rentalPriceCents: 90_000 }) }),
  'GET /api/items/:id/availability':             row('401  401  ok   ok   ok   ok   404', { params: id((f) => f.tent.id), query: () => ({ from: '2031-01-01T00:00:00Z', to: '2031-02-01T00:00:00Z' }) }),

  // --- customers: everyone reads; the office and owner write ---------------------------------------------
  'GET /api/customers':                          row('401  401  ok   ok   ok   ok   ok'),
  'POST /api/customers':                         row('401  401  403  ok   403  ok   ok', { body: () => ({ name: 'Walk-in Customer' }) }),
  'GET /api/customers/:id':                      row('401  401  ok   ok   ok   ok   404', { params: id((f) => f.certCustomer.id) }),
  'PUT /api/customers/:id':                      row('401  401  403  ok   403  ok   404', { params: id((f) => f.certCustomer.id), body: (f) => ({ name: f.certCustomer.name, taxExempt: true }) }),
  'POST /api/customers/:id/exemption-certificate':   row('401  401  403  ok   403  ok   404', { params: id((f) => f.certCustomer.id), upload: (f) => f.uploads.certificate }),
  'GET /api/customers/:id/exemption-certificate':    row('401  401  403  ok   ok   ok   404', { params: id((f) => f.certCustomer.id) }),
  'DELETE /api/customers/:id/exemption-certificate': row('401  401  403  ok   403  ok   404', { params: async (f) => ({ id: await f.fresh.certCustomer() }) }),

  // --- bookings -------------------------------------------------------------------------------------------
  'GET /api/bookings':                           row('401  401  ok   ok   ok   ok   ok'),
  // 400 for B's owner: the customer id is in the body, and A's customer is not one of theirs.
  'POST /api/bookings':                          row('401  401  403  ok   403  ok   400', { body: (f) => bookingBody(f.customer.id, '2031-11-20', [{ itemId: null, quantity: 1, description: 'Delivery', kind: 'fee' }]) }),
  'GET /api/bookings/:id':                       row('401  401  ok   ok   ok   ok   404', { params: id((f) => f.bookings.draft.id) }),
  'PUT /api/bookings/:id':                       row('401  401  403  ok   403  ok   404', { params: id((f) => f.bookings.draft.id), body: (f) => bookingBody(f.customer.id, '2031-11-21', [{ itemId: null, quantity: 1, description: 'Delivery', kind: 'fee' }]) }),
  'POST /api/bookings/:id/status':               row('401  401  403  ok   403  ok   404', { params: async (f) => ({ id: await f.fresh.draftBooking() }), body: () => ({ status: 'quoted' }) }),
  'GET /api/bookings/:id/history':               row('401  401  ok   ok   ok   ok   404', { params: id((f) => f.bookings.reserved.id) }),

  // --- field: the people who go out on site (owner, office, crew); the office's side of the check-in -------
  'GET /api/field/today':                        row('401  401  ok   ok   403  ok   ok'),
  'GET /api/field/days/:date':                   row('401  401  ok   ok   403  ok   ok', { params: () => ({ date: crewDay }) }),
  'GET /api/field/days/:date/pdf':               row('401  401  ok   ok   403  ok   ok', { params: () => ({ date: crewDay }) }),
  'GET /api/field/bookings/:bookingId':          row('401  401  ok   ok   403  ok   404', { params: bookingId((f) => f.bookings.reserved.id) }),
  'PUT /api/field/bookings/:bookingId/site-check':     row('401  401  ok   ok   403  ok   404', { params: bookingId((f) => f.bookings.reserved.id), body: () => siteCheck }),
  'POST /api/field/bookings/:bookingId/ready-to-stake': row('401  401  ok   ok   403  ok   404', { params: bookingId((f) => f.bookings.reserved.id) }),
  'POST /api/field/bookings/:bookingId/marks':         row('401  401  ok   ok   403  ok   404', { params: bookingId((f) => f.bookings.out.id), body: () => ({ mark: 'delivered' }) }),
  'PUT /api/field/bookings/:bookingId/return-check':   row('401  401  ok   ok   403  ok   404', { params: bookingId((f) => f.bookings.out.id), body: () => ({ lines: [], submit: false }) }),
  'POST /api/field/bookings/:bookingId/photos':        row('401  401  ok   ok   403  ok   404', { params: bookingId((f) => f.bookings.reserved.id), query: () => ({ stage: 'site' }), upload: (f) => f.uploads.photo }),
  'GET /api/field/photos/:id':                   row('401  401  ok   ok   403  ok   404', { params: id((f) => f.photoId) }),
  'DELETE /api/field/photos/:id':                row('401  401  403  ok   403  ok   404', { params: async (f) => ({ id: await f.fresh.photo() }) }), // the taker or the office; the office took this one
  'GET /api/field/crew-members':                 row('401  401  ok   ok   403  ok   ok'),
  'GET /api/field/bookings/:bookingId/crew':     row('401  401  ok   ok   403  ok   404', { params: bookingId((f) => f.bookings.reserved.id) }),
  'PUT /api/field/bookings/:bookingId/crew':     row('401  401  403  ok   403  ok   404', { params: bookingId((f) => f.bookings.reserved.id), body: (f) => ({ userIds: [f.a.crew.id] }) }),
  'GET /api/field/calendar-feed':                row('401  401  ok   ok   403  ok   ok'),
  'POST /api/field/calendar-feed':               row('401  401  ok   ok   403  ok   ok'),
  'DELETE /api/field/calendar-feed':             row('401  401  ok   ok   403  ok   ok'),
  'GET /api/field/calendar/:file':               row('ok   ok   ok   ok   ok   ok   ok', { params: async (f) => ({ file: await f.fresh.calendarFile() }) }), // the secret address is the key
  'GET /api/field/bookings/:bookingId/charges':  row('401  401  403  ok   403  ok   404', { params: bookingId((f) => f.bookings.out.id) }),
  'POST /api/field/bookings/:bookingId/charges': row('401  401  403  ok   403  ok   404', {
    params: bookingId((f) => f.bookings.out.id), body: () => ({ lines: [{ key: 'line', charge: 'damage', description: 'Torn sidewall', amountCents: 100 }] }),
    stateOnly: 'the check-in is not submitted: 409 not_checked_in once the role is allowed (charges are made in field-charges.test.ts)',
  }),

  'GET /api/dashboard':                          row('401  401  ok   ok   ok   ok   ok'), // each gets their own company's figures; the crew's without money (dashboard.test.ts)

  // --- exports: the bookkeeper's and the owner's ------------------------------------------------------------
  'GET /api/exports/history':                    row('401  401  403  403  ok   ok   ok'),
  'POST /api/exports/history/:id/cancel':        row('401  401  403  403  ok   404  404', { // only the person who ran the download
    params: async (f) => ({ id: (await ExportRun.create({ organizationId: f.org, userId: f.a.bookkeeper.id, kind: 'journal', fromDate: '2031-01-01', toDate: '2031-01-31' })).id }),
  }),
  'GET /api/exports/:kind/count':                row('401  401  403  403  ok   ok   ok', { params: () => ({ kind: 'paid-invoices' }), query: range }),
  'GET /api/exports/trial-balance.csv':          row('401  401  403  403  ok   ok   ok', { query: () => ({ at: '2031-12-31' }) }),
  'GET /api/exports/paid-invoices.csv':          row('401  401  403  403  ok   ok   ok', { query: range }),
  'GET /api/exports/invoice-lines.csv':          row('401  401  403  403  ok   ok   ok', { query: range }),
  'GET /api/exports/payments.csv':               row('401  401  403  403  ok   ok   ok', { query: range }),
  'GET /api/exports/journal.csv':                row('401  401  403  403  ok   ok   ok', { query: range }),
  'GET /api/exports/invoices.zip':               row('401  401  403  403  ok   ok   ok', { query: range }),
  'GET /api/exports/ubl.zip':                    row('401  401  403  403  ok   ok   ok', { query: range }),

  // --- reports: the owner's, read by the bookkeeper ------------------------------------------------------------
  'GET /api/reports/aging':                      row('401  401  403  403  ok   ok   ok'),
  'GET /api/reports/deposits':                   row('401  401  403  403  ok   ok   ok'),
  'GET /api/reports/sales-tax':                  row('401  401  403  403  ok   ok   ok'),
  'GET /api/reports/revenue':                    row('401  401  403  403  ok   ok   ok'),
  'GET /api/reports/stock':                      row('401  401  403  403  ok   ok   ok'),
  'GET /api/reports/stock/items/:id':           row('401  401  403  403  ok   ok   404', { params: id((f) => f.tent.id) }),
  'GET /api/reports/shortfalls':                 row('401  401  403  403  ok   ok   ok'),
  // B's owner naming A's account and booking: 404, as for any record of another company.
  'GET /api/reports/entries':                    row('401  401  403  403  ok   ok   404', { query: (f) => ({ accountIds: f.account.id, bookingId: f.bookings.reserved.id }) }),

  // --- the demo's caught mail: mounted only with FAKES=on; a company's owner, that company's mail only ----
  'GET /api/dev/mail':                           row('401  401  403  403  403  ok   ok'),
  'DELETE /api/dev/mail':                        row('401  401  403  403  403  ok   ok'),
};

/** 'ok' for anything that got past the guard; otherwise the status itself. */
function passes(expected: string, status: number) {
  if (expected === 'ok') return status < 400 || [400, 409, 410, 422].includes(status);
  return status === Number(expected);
}

const app = createApp();
const routes = listRoutes(app);
let f: F;
let sink: Awaited<ReturnType<typeof startMailSink>>;
const sharedSink = env.MAIL_SINK_URL;

beforeAll(async () => {
  // DELETE /api/dev/mail empties the mail sink: point this process's dev routes at a sink of its
  // own, so the other test files' mail stays where they look for it (the fixture's own mail goes
  // through the app server's worker to the shared sink, read with waitForMail as usual).
  sink = await startMailSink({ smtpPort: 0, httpPort: 0 });
  env.MAIL_SINK_URL = sink.httpUrl;
  f = await securityFixture(app);
}, 120_000);

afterAll(async () => {
  env.MAIL_SINK_URL = sharedSink;
  await sink?.close();
});

describe('the matrix covers the router', () => {
  it('has a row for every route the router answers', () => {
    const missing = routes.map(routeKey).filter((k) => !(k in MATRIX));
    expect(
      missing,
      `These routes have no row in tests/server/security/permissions.test.ts. Add one per route saying what ` +
        `anonymous, customer, crew, office, bookkeeper, owner and another company's owner get (e.g. '401 401 403 ok ok ok 404'):\n  ${missing.join('\n  ')}`,
    ).toEqual([]);
  });

  it('has no row for a route that is gone', () => {
    const known = new Set(routes.map(routeKey));
    const stale = Object.keys(MATRIX).filter((k) => !known.has(k));
    expect(stale, `These rows name routes the router no longer has; remove or rename them:\n  ${stale.join('\n  ')}`).toEqual([]);
  });
});

describe('who gets past the guard', () => {
  for (const route of routes) {
    const key = routeKey(route);
    const r = MATRIX[key];
    if (!r) continue;
    it(key, async () => {
      await r.before?.(f);
      const wrong: string[] = [];
      let succeeded = false;
      for (const who of WHO) {
        const client = r.fresh ? await f.fresh.client(who) : f.clients[who];
        const url = fillPath(route.path, (await r.params?.(f)) ?? {});
        const res = await send(client, { method: route.method, url, query: r.query?.(f), body: await r.body?.(f), upload: r.upload?.(f) });
        if (res.status < 400) succeeded = true;
        const expected = r.expect[who];
        if (!passes(expected, res.status)) wrong.push(`${who}: expected ${expected}, got ${res.status} ${JSON.stringify(res.body?.error ?? '').slice(0, 160)}`);
        if (who === 'otherOwner' && r.expect.anonymous !== 'ok') {
          // Another company's owner learns nothing of A: no name of A's company, customers, stock or
          // bookings. (Public routes are left out: there the token in the address is the key, whoever holds it.)
          const text = res.text ?? '';
          for (const m of f.markers) if (text.includes(m)) wrong.push(`otherOwner: the answer (${res.status}) contains A's "${m}"`);
        }
      }
      expect(wrong, `${key}\n  ${wrong.join('\n  ')}`).toEqual([]);
      // An honest probe: where the table says 'ok', someone really got a 2xx/3xx, unless the row says why not.
      if (Object.values(r.expect).includes('ok') && !r.stateOnly) expect(succeeded, `${key}: no role got a 2xx/3xx; fix the probe or say why (stateOnly)`).toBe(true);
    });
  }
});

describe('what a role reads where it may read', () => {
  it("the crew reads a customer without their tax exemption certificate (a tax record); the office gets it", async () => {
    const url = `/api/customers/${f.certCustomer.id}`;
    const asOffice = await send(f.clients.office, { method: 'GET', url });
    const asCrew = await send(f.clients.crew, { method: 'GET', url });
    expect([asOffice.status, asOffice.body.can.readCertificate, asOffice.body.exemptionCertificate?.filename]).toEqual([200, true, expect.any(String)]);
    expect([asCrew.status, asCrew.body.can.readCertificate, asCrew.body.exemptionCertificate]).toEqual([200, false, null]);
  });

  it("the crew reads a booking's history without the amounts in it (the crew sees no money)", async () => {
    const url = `/api/bookings/${f.bookings.reserved.id}/history`;
    const asOffice = await send(f.clients.office, { method: 'GET', url });
    const asCrew = await send(f.clients.crew, { method: 'GET', url });
    expect(asCrew.status).toBe(200);
    const amounts = (body: { data: { data: unknown }[] }) => [...keysOf(body.data.map((e) => e.data))].filter((k) => k.endsWith('Cents'));
    // The trail holds amounts (the invoices' totals, the payment): the office sees them...
    expect(amounts(asOffice.body)).toEqual(expect.arrayContaining(['totalCents', 'amountCents']));
    // ...the crew sees the same events without them.
    expect(amounts(asCrew.body)).toEqual([]);
    expect(asCrew.body.data.map((e: { action: string }) => e.action)).toEqual(asOffice.body.data.map((e: { action: string }) => e.action));
  });
});
