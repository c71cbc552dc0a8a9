/**
 * The customer's own pages (no password: an e-mailed one-time link), pay links from invoice
 * e-mails, and card checkouts. A customer session belongs to one company: the customer sees a
 * booking only when it is that company's and the booking's customer record has their e-mail
 * address; anything else is a 404, as if it did not exist. A customer of two companies gets one
 * link per company and signs in to each separately, so one company can never put its invoices
 * on the pages of another company's customer.
 */
import { Router, type NextFunction, type Request, type Response } from 'express';
import { col, fn, Op, where as sqlWhere } from 'sequelize';
import { z } from 'zod';
import { dateInZone } from '../../../shared/dates';
import { IdParams } from '../../../shared/schemas/common';
import {
  CheckoutRequest, PortalSessionRequest, PortalSignInRequest, type CheckoutResponse, type CheckoutState, type PayLink, type PortalBooking,
  type PortalBookingSummary, type PortalCompany, type PortalInvoice, type PortalMe, type PortalSignStart,
} from '../../../shared/schemas/portal';
import { startCheckout, systemActor } from '../../commands/cardPayments';
import { openSigningLink } from '../../commands/signing';
import { withTransaction } from '../../db';
import { env } from '../../env';
import { HttpError, notFound, unauthenticated } from '../../errors';
import { securityDepositHeldCents } from '../../ledger/balances';
import { auth, authenticate } from '../../middlewares/authenticate';
import { consumePortalLink } from '../../middlewares/rateLimit';
import { parsed, validate } from '../../middlewares/validate';
import {
  Booking, BookingLine, CardCheckout, Customer, CustomerSession, CustomerSignInToken, Document, Invoice, Organization, Payment, PaymentAllocation, SigningRequest,
} from '../../models';
import { authorize, sameOrganization } from '../../policies';
import { agreementStateOf } from '../../services/agreementState';
import { clearCustomerSessionCookie, readCustomerSession, startCustomerSession } from '../../services/customerSessions';
import { queueJob } from '../../services/jobs';
import type { AccountRequest } from '../../jobs/accountRequests';
import { payLinkEnded, payLinkGone, payLinkToken, readPayLink } from '../../services/payLinks';
import { contentDisposition } from '../../services/downloads';
import { readFile } from '../../services/storage';
import { cardPaymentsEnabled } from '../../services/stripe';
import { hashToken } from '../../services/tokens';

export const portalRouter = Router();

declare module 'express-serve-static-core' {
  interface Request {
    customer?: CustomerSession;
  }
}

async function customerOnly(req: Request, _res: Response, next: NextFunction) {
  const session = await readCustomerSession(req);
  if (!session) return next(unauthenticated('Sign in to see your rentals.'));
  req.customer = session;
  next();
}

const sameEmail = (email: string) => sqlWhere(fn('lower', col('email')), email.toLowerCase());

/** The customer records of the session's company that carry its e-mail address. */
async function customersOf(session: { email: string; organizationId: string }) {
  return Customer.findAll({
    where: { [Op.and]: [sameEmail(session.email), { organizationId: session.organizationId }] },
    attributes: ['id', 'organizationId', 'name', 'email'],
    order: [['createdAt', 'ASC']],
  });
}

/** A booking of this customer with this company, or a 404 (never a 403: another customer's booking does not exist for them). */
async function ownBooking(session: { email: string; organizationId: string }, bookingId: string) {
  const booking = await Booking.findByPk(bookingId, { include: [{ model: Customer, as: 'customer' }, { model: BookingLine, as: 'lines' }] });
  if (
    !booking || booking.organizationId !== session.organizationId || !booking.customer?.email ||
    booking.customer.email.toLowerCase() !== session.email.toLowerCase() || !(await shownToCustomer(booking))
  ) {
    throw notFound('That booking');
  }
  return booking as Booking & { customer: Customer; lines: BookingLine[] };
}

/** A draft is the office's work in progress: the customer sees it once something was sent (a document issued). */
async function shownToCustomer(booking: Booking) {
  return booking.status !== 'draft' || (await Document.count({ where: { bookingId: booking.id } })) > 0;
}

function companyOf(o: Organization): PortalCompany {
  const address = [o.addressLine1, o.addressLine2, [o.city, o.region].filter(Boolean).join(', '), o.postalCode].filter(Boolean).join(', ');
  return { id: o.id, name: o.name, email: o.email, phone: o.phone, address };
}

const siteAddress = (b: Booking) => [b.siteLine1, b.siteLine2, [b.siteCity, b.siteRegion].filter(Boolean).join(', '), b.sitePostalCode].filter(Boolean).join(', ');

function portalInvoice(i: Invoice, today: string): PortalInvoice {
  const balance = i.status === 'void' ? 0 : i.totalCents - i.paidCents - i.creditedCents;
  const open = ['open', 'partly_paid'].includes(i.status);
  return {
    id: i.id, number: i.number ?? '', kind: i.kind, status: i.status, issueDate: i.issueDate ?? '', dueDate: i.dueDate ?? null,
    overdue: open && !!i.dueDate && i.dueDate < today, totalCents: i.totalCents, paidCents: i.paidCents, creditedCents: i.creditedCents,
    balanceCents: balance, documentId: i.documentId ?? null, canPay: open && balance >= 50 && cardPaymentsEnabled(),
  };
}

/** Issued invoices only: drafts are the office's work in progress. Credit notes are listed with them. */
const issuedInvoicesOf = (bookingId: string) =>
  Invoice.findAll({ where: { bookingId, status: { [Op.ne]: 'draft' } }, order: [['issueDate', 'ASC'], ['createdAt', 'ASC']] });

function summary(b: Booking, o: Organization, invoices: Invoice[], awaitingSignature: boolean): PortalBookingSummary {
  const balance = invoices.filter((i) => i.kind !== 'credit_note' && ['open', 'partly_paid'].includes(i.status)).reduce((s, i) => s + i.totalCents - i.paidCents - i.creditedCents, 0);
  return {
    id: b.id, reference: b.reference, status: b.status, eventStart: b.eventStart.toISOString(), eventEnd: b.eventEnd.toISOString(), siteAddress: siteAddress(b),
    company: companyOf(o), balanceCents: balance, currency: o.currency, timeZone: o.timeZone, needsAction: awaitingSignature || balance > 0,
  };
}

/** The current version's state: a signature on an earlier version does not count for a changed booking. */
async function agreementOf(bookingId: string): Promise<PortalBooking['agreement']> {
  const a = await agreementStateOf(bookingId);
  if (a.state === 'none') return { state: 'none' };
  if (a.state === 'signed') return { state: 'signed', documentId: a.signed.id, documentNumber: a.signed.number, signedAt: (a.signed.issuedAt ?? a.signed.createdAt).toISOString() };
  return {
    state: 'awaiting', signUrl: `/api/portal/bookings/${bookingId}/sign`, documentNumber: a.current.number,
    changedSinceSigned: a.state === 'changed_since_signed' ? { documentId: a.lastSigned.id, documentNumber: a.lastSigned.number } : null,
  };
}

// --- signing in ------------------------------------------------------------------------------

portalRouter.post('/portal/sign-in', validate(PortalSignInRequest), async (req, res) => {
  const { email, next } = parsed<z.output<typeof PortalSignInRequest>>(res);
  await consumePortalLink(req, email);
  // The job looks the address up and mails one link per company that has this customer
  // (mailPortalSignInLinks): the same work, answer and time whether or not the address is known,
  // so nobody learns who rents from whom.
  await queueJob('account-request', { kind: 'portal-sign-in', email, next: next ?? null } satisfies AccountRequest);
  res.status(202).json({ ok: true });
});

portalRouter.post('/portal/sessions', validate(PortalSessionRequest), async (req, res) => {
  const { token } = parsed<{ token: string }>(res);
  const row = await withTransaction(async (t) => {
    const found = await CustomerSignInToken.findOne({ where: { tokenHash: hashToken(token) }, transaction: t, lock: t.LOCK.UPDATE });
    if (!found) return 'unknown' as const;
    if (found.usedAt) return 'used' as const;
    if (found.expiresAt < new Date()) return 'expired' as const;
    found.usedAt = new Date();
    await found.save({ transaction: t });
    return found;
  });
  if (row === 'unknown') throw new HttpError(404, 'link_unknown', 'This sign-in link is not one of ours. Ask for a new one: it takes a minute.');
  if (row === 'used') throw new HttpError(410, 'link_used', 'This sign-in link was already used: each link works once. Ask for a new one: it takes a minute.');
  if (row === 'expired') throw new HttpError(410, 'link_expired', 'This sign-in link has expired: links work for 15 minutes. Ask for a new one: it takes a minute.');
  await startCustomerSession(req, res, row.email, row.organizationId);
  res.json(await portalMe(row, row.next ?? null));
});

/** Who is signed in, and with which company: the pages say so. */
async function portalMe(session: { email: string; organizationId: string }, next: string | null): Promise<PortalMe> {
  const [first] = await customersOf(session);
  const organization = (await Organization.findByPk(session.organizationId))!;
  return { email: session.email, name: first?.name ?? '', next, company: companyOf(organization) };
}

portalRouter.get('/portal/me', customerOnly, async (req, res) => {
  res.json(await portalMe(req.customer!, null));
});

portalRouter.post('/portal/sign-out', async (req, res) => {
  const session = await readCustomerSession(req);
  if (session) await session.update({ revokedAt: new Date() });
  clearCustomerSessionCookie(res);
  res.status(204).end();
});

// --- the customer's bookings -----------------------------------------------------------------

portalRouter.get('/portal/bookings', customerOnly, async (req, res) => {
  const customers = await customersOf(req.customer!);
  const all = await Booking.findAll({ where: { customerId: { [Op.in]: customers.map((c) => c.id) } }, order: [['eventStart', 'DESC']], limit: 200 });
  const bookings: Booking[] = [];
  for (const b of all) if (await shownToCustomer(b)) bookings.push(b);
  const organizations = new Map((await Organization.findAll({ where: { id: { [Op.in]: [...new Set(bookings.map((b) => b.organizationId))] } } })).map((o) => [o.id, o]));
  const data: PortalBookingSummary[] = [];
  for (const b of bookings) {
    const invoices = await issuedInvoicesOf(b.id);
    const agreement = await agreementOf(b.id);
    data.push(summary(b, organizations.get(b.organizationId)!, invoices, agreement.state === 'awaiting'));
  }
  res.json({ data, total: data.length });
});

portalRouter.get('/portal/bookings/:id', customerOnly, validate(IdParams, 'params'), async (req, res) => {
  const booking = await ownBooking(req.customer!, parsed<{ id: string }>(res, 'params').id);
  const organization = (await Organization.findByPk(booking.organizationId))!;
  const invoices = await issuedInvoicesOf(booking.id);
  const today = dateInZone(new Date(), organization.timeZone);
  const agreement = await agreementOf(booking.id);
  const receipts = await Document.findAll({ where: { bookingId: booking.id, kind: 'receipt', status: 'issued' }, order: [['createdAt', 'ASC']] });
  const rows = invoices.map((i) => portalInvoice(i, today));
  const body: PortalBooking = {
    ...summary(booking, organization, invoices, agreement.state === 'awaiting'),
    deliveryWindow: { start: booking.deliveryStart.toISOString(), end: booking.deliveryEnd.toISOString() },
    pickupWindow: { start: booking.pickupStart.toISOString(), end: booking.pickupEnd.toISOString() },
    guestCount: booking.guestCount,
    lines: [...booking.lines].sort((a, b) => a.position - b.position).map((l) => ({ description: l.description, quantity: l.quantity })),
    agreement,
    invoices: rows,
    receipts: receipts.map((d) => ({ documentId: d.id, number: d.number, issuedAt: (d.issuedAt ?? d.createdAt).toISOString() })),
    dueNowCents: rows.filter((i) => i.kind !== 'credit_note' && ['open', 'partly_paid'].includes(i.status)).reduce((s, i) => s + i.balanceCents, 0),
    securityDepositHeldCents: await securityDepositHeldCents(booking.id),
  };
  res.json(body);
});

/**
 * "Read and sign": opens a fresh signing link for the current agreement and answers the signing
 * page's address. A POST behind the CSRF check, since it makes a link (a GET must change nothing).
 */
portalRouter.post('/portal/bookings/:id/sign', customerOnly, validate(IdParams, 'params'), async (req, res) => {
  const booking = await ownBooking(req.customer!, parsed<{ id: string }>(res, 'params').id);
  const a = await agreementStateOf(booking.id);
  if (a.state === 'none') throw new HttpError(404, 'not_found', 'There is no agreement to sign yet.');
  let url = `/portal/bookings/${booking.id}`;
  if (a.state !== 'signed') {
    const token = await withTransaction(async (t) => (await openSigningLink(systemActor(booking.organizationId), a.current, req.customer!.email, req, t)).token);
    url = `/sign/${token}`;
  }
  const body: PortalSignStart = { url };
  res.json(body);
});

/** A document of the customer's own booking: receipts, invoices, credit notes and the agreements. */
async function sendPdf(res: Response, doc: Document) {
  const file = await readFile(doc.organizationId, doc.fileId);
  if (!file) throw notFound('That document');
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', contentDisposition(`${doc.number}.pdf`));
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Cache-Control', 'private, no-store');
  res.send(file.data);
}

portalRouter.get('/portal/documents/:id/pdf', customerOnly, validate(IdParams, 'params'), async (req, res) => {
  const doc = await Document.findByPk(parsed<{ id: string }>(res, 'params').id);
  if (!doc || doc.status === 'void') throw notFound('That document');
  await ownBooking(req.customer!, doc.bookingId);
  await sendPdf(res, doc);
});

// --- card checkouts --------------------------------------------------------------------------

/**
 * POST /api/invoices/:id/checkout: the office (to hand a customer the payment page) or the
 * invoice's own customer, signed in to their pages.
 */
portalRouter.post('/invoices/:id/checkout', validate(IdParams, 'params'), validate(CheckoutRequest), async (req, res) => {
  const id = parsed<{ id: string }>(res, 'params').id;
  const { amountCents } = parsed<{ amountCents?: number }>(res);
  const customer = await readCustomerSession(req);
  let checkout: CardCheckout;
  if (customer) {
    const invoice = await Invoice.findByPk(id);
    if (!invoice) throw notFound('That invoice');
    const booking = await ownBooking(customer, invoice.bookingId);
    checkout = await startCheckout({ invoiceId: invoice.id, organizationId: booking.organizationId, amountCents, startedBy: 'customer', returnBase: `${env.APP_URL}/portal/checkouts` });
  } else {
    await new Promise<void>((resolve, reject) => authenticate(req, res, (err?: unknown) => (err ? reject(err) : resolve())));
    const { user } = auth(req);
    const invoice = sameOrganization(user, await Invoice.findByPk(id), 'That invoice');
    authorize(user, 'invoice', 'recordPayment', invoice);
    checkout = await startCheckout({ invoiceId: invoice.id, organizationId: user.organizationId, amountCents, startedBy: 'staff', returnBase: `${env.APP_URL}/pay/${payLinkToken(invoice.id, invoice.payLinkGeneration)}/checkouts` });
  }
  const body: CheckoutResponse = { url: checkout.url!, checkoutId: checkout.id };
  res.status(201).json(body);
});

async function checkoutState(checkout: CardCheckout): Promise<CheckoutState> {
  const invoice = (await Invoice.findByPk(checkout.invoiceId))!;
  const payment = checkout.paymentId ? await Payment.findByPk(checkout.paymentId) : null;
  return {
    id: checkout.id, status: checkout.status, amountCents: checkout.amountCents, currency: checkout.currency, invoiceId: invoice.id, invoiceNumber: invoice.number ?? '',
    bookingId: checkout.bookingId, message: checkout.message ?? null, receiptDocumentId: payment?.receiptDocumentId ?? null,
  };
}

portalRouter.get('/portal/checkouts/:id', customerOnly, validate(IdParams, 'params'), async (req, res) => {
  const checkout = await CardCheckout.findByPk(parsed<{ id: string }>(res, 'params').id);
  if (!checkout) throw notFound('That payment');
  await ownBooking(req.customer!, checkout.bookingId);
  res.json(await checkoutState(checkout));
});

// --- pay links (from invoice e-mails; no sign-in) ----------------------------------------------

const PayParams = z.object({ token: z.string().min(10).max(120) });
const PayCheckoutParams = PayParams.extend({ checkoutId: z.uuid() });
const PayDocumentParams = PayParams.extend({ documentId: z.uuid() });

async function payLinkInvoice(token: string) {
  const claim = readPayLink(token);
  const invoice = claim ? await Invoice.findByPk(claim.invoiceId) : null;
  if (!claim || !invoice || invoice.status === 'draft' || invoice.kind === 'credit_note') throw new HttpError(404, 'not_found', 'This payment link is not valid. Sign in to see your rentals instead.');
  // A genuine link past its end, or withdrawn by the office: 410, and the company sends a new one.
  const ended = payLinkEnded(claim, invoice);
  if (ended) throw payLinkGone(ended, (await Organization.findByPk(invoice.organizationId))!);
  return invoice;
}

portalRouter.get('/pay/:token', validate(PayParams, 'params'), async (_req, res) => {
  const invoice = await payLinkInvoice(parsed<{ token: string }>(res, 'params').token);
  const booking = (await Booking.findByPk(invoice.bookingId, { include: [{ model: Customer, as: 'customer' }] })) as Booking & { customer: Customer };
  const organization = (await Organization.findByPk(invoice.organizationId))!;
  const body: PayLink = {
    invoice: portalInvoice(invoice, dateInZone(new Date(), organization.timeZone)),
    bookingReference: booking.reference, eventStart: booking.eventStart.toISOString(), customerName: booking.customer.name,
    company: companyOf(organization), currency: organization.currency, timeZone: organization.timeZone,
  };
  res.json(body);
});

portalRouter.post('/pay/:token/checkout', validate(PayParams, 'params'), validate(CheckoutRequest), async (_req, res) => {
  const { token } = parsed<{ token: string }>(res, 'params');
  const invoice = await payLinkInvoice(token);
  const checkout = await startCheckout({
    invoiceId: invoice.id, organizationId: invoice.organizationId, amountCents: parsed<{ amountCents?: number }>(res).amountCents, startedBy: 'link', returnBase: `${env.APP_URL}/pay/${token}/checkouts`,
  });
  const body: CheckoutResponse = { url: checkout.url!, checkoutId: checkout.id };
  res.status(201).json(body);
});

portalRouter.get('/pay/:token/checkouts/:checkoutId', validate(PayCheckoutParams, 'params'), async (_req, res) => {
  const { token, checkoutId } = parsed<{ token: string; checkoutId: string }>(res, 'params');
  const invoice = await payLinkInvoice(token);
  const checkout = await CardCheckout.findOne({ where: { id: checkoutId, invoiceId: invoice.id } });
  if (!checkout) throw notFound('That payment');
  res.json(await checkoutState(checkout));
});

/** The invoice's own PDF and the receipts of payments on it. */
portalRouter.get('/pay/:token/documents/:documentId/pdf', validate(PayDocumentParams, 'params'), async (_req, res) => {
  const { token, documentId } = parsed<{ token: string; documentId: string }>(res, 'params');
  const invoice = await payLinkInvoice(token);
  const allocations = await PaymentAllocation.findAll({ where: { invoiceId: invoice.id }, attributes: ['paymentId'] });
  const payments = await Payment.findAll({ where: { id: { [Op.in]: allocations.map((a) => a.paymentId) } }, attributes: ['receiptDocumentId'] });
  const allowed = new Set([invoice.documentId, ...payments.map((p) => p.receiptDocumentId)].filter(Boolean));
  if (!allowed.has(documentId)) throw notFound('That document');
  await sendPdf(res, (await Document.findByPk(documentId))!);
});
