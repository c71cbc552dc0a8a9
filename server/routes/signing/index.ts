import { Router, type Request, type Response, type NextFunction } from 'express';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { Op } from 'sequelize';
import { z } from 'zod';
import { IdParams } from '../../../shared/schemas/common';
import { DOCUMENT_KIND_LABELS } from '../../../shared/schemas/documents';
import { SignRequest, SignatureRequestInput, type SigningPage, type SigningRequestRow, type VerifyResult } from '../../../shared/schemas/signing';
import { audit } from '../../commands/audit';
import { ShortfallError } from '../../commands/bookings';
import {
  createSigningRequest, findByToken, issuedBytes, linkError, linkState, recordEvent, reportStockGone, signAgreement, voidSigningRequest,
} from '../../commands/signing';
import { sequelize, withTransaction } from '../../db';
import { markdownToHtml } from '../../documents';
import { signingFields, verifySignedPdf } from '../../documents/signing';
import { HttpError, conflict, notFound } from '../../errors';
import { auth, authenticate } from '../../middlewares/authenticate';
import { parsed, validate } from '../../middlewares/validate';
import { Booking, Customer, Document, Organization, SigningEvent, SigningRequest, User } from '../../models';
import { authorize, can, sameOrganization } from '../../policies';
import { disclosureFor } from '../../services/disclosure';
import { queueMail } from '../../services/mailer';
import { deskEmails } from '../../services/bookingRecords';
import { rulesOf } from '../../services/rules';
import { contentDisposition } from '../../services/downloads';
import { readFile } from '../../services/storage';
import { createHash } from 'node:crypto';
import { env } from '../../env';

export const signingRouter = Router();

// --- the office side ---------------------------------------------------------------------------

async function presentRequests(requests: SigningRequest[], actor: User): Promise<SigningRequestRow[]> {
  const events = requests.length
    ? await SigningEvent.findAll({ where: { signingRequestId: { [Op.in]: requests.map((r) => r.id) } }, order: [['at', 'ASC'], ['id', 'ASC']] })
    : [];
  const desk = can(actor, 'document', 'issue');
  return requests.map((r) => ({
    id: r.id,
    documentId: r.documentId,
    status: r.status === 'pending' && r.expiresAt < new Date() ? 'expired' : r.status,
    sentTo: r.sentTo,
    expiresAt: r.expiresAt.toISOString(),
    createdAt: r.createdAt.toISOString(),
    signedAt: r.signedAt ? r.signedAt.toISOString() : null,
    signedDocumentId: r.signedDocumentId ?? null,
    events: events.filter((e) => e.signingRequestId === r.id).map((e) => ({ event: e.event, at: e.at.toISOString(), ip: e.ip, userAgent: e.userAgent, detail: e.detail })),
    can: { resend: desk && ['pending', 'void', 'replaced'].includes(r.status), void: desk && r.status === 'pending' },
  }));
}

async function loadOwnDocument(actor: User, id: string) {
  const doc = sameOrganization(actor, await Document.findByPk(id), 'That document');
  if (actor.role === 'crew') throw notFound('That document');
  return doc;
}

signingRouter.post('/documents/:id/signature-request', authenticate, validate(IdParams, 'params'), validate(SignatureRequestInput), async (req, res) => {
  const { user } = auth(req);
  const doc = await loadOwnDocument(user, parsed<{ id: string }>(res, 'params').id);
  authorize(user, 'document', 'issue');
  if (doc.kind !== 'rental_agreement') throw conflict('Only a rental agreement is sent for signature.', 'not_agreement');
  if (doc.status !== 'issued') throw conflict('This version was replaced: send the current agreement.', 'not_current');
  const booking = (await Booking.findByPk(doc.bookingId, { include: [{ model: Customer, as: 'customer' }] })) as Booking & { customer: Customer };
  const to = parsed<{ to: string }>(res).to || booking.customer.email;
  if (!to) throw conflict('The customer has no e-mail address: add one, or type where to send the link.', 'no_email', { to: 'Where should the link go?' });
  const request = await withTransaction((t) => createSigningRequest(user, doc, to, req, t));
  res.status(201).json((await presentRequests([request], user))[0]);
});

signingRouter.get('/documents/:id/signature-requests', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  const doc = await loadOwnDocument(user, parsed<{ id: string }>(res, 'params').id);
  const requests = await SigningRequest.findAll({ where: { documentId: doc.id, organizationId: user.organizationId }, order: [['createdAt', 'DESC']] });
  res.json({ data: await presentRequests(requests, user), total: requests.length });
});

async function loadRequest(actor: User, id: string) {
  return sameOrganization(actor, await SigningRequest.findByPk(id), 'That signing link');
}

signingRouter.post('/signature-requests/:id/resend', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  const old = await loadRequest(user, parsed<{ id: string }>(res, 'params').id);
  authorize(user, 'document', 'issue');
  if (old.status === 'signed') throw conflict('This agreement is already signed.', 'already_signed');
  const doc = (await Document.findByPk(old.documentId))!;
  if (doc.status !== 'issued') throw conflict('This version was replaced: send the current agreement.', 'not_current');
  const request = await withTransaction((t) => createSigningRequest(user, doc, old.sentTo, req, t));
  res.status(201).json((await presentRequests([request], user))[0]);
});

signingRouter.post('/signature-requests/:id/void', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  const id = parsed<{ id: string }>(res, 'params').id;
  await loadRequest(user, id);
  authorize(user, 'document', 'issue');
  const request = await withTransaction(async (t) => {
    const r = (await SigningRequest.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE }))!;
    return voidSigningRequest(user, r, req, t);
  });
  res.json((await presentRequests([request], user))[0]);
});

signingRouter.get('/documents/:id/verify', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user, organization } = auth(req);
  const doc = await loadOwnDocument(user, parsed<{ id: string }>(res, 'params').id);
  const file = await readFile(user.organizationId, doc.fileId);
  if (!file) throw notFound('The stored PDF');
  const sha = createHash('sha256').update(file.data).digest('hex');
  let signature: VerifyResult['signature'] = null;
  if (doc.kind === 'signed_agreement') {
    const check = verifySignedPdf(file.data, { expectedFingerprintSha256: organization.certificateFingerprint ?? undefined });
    signature = { signed: check.signed, intact: check.intact, coversWholeDocument: check.coversWholeDocument, signerCommonName: check.signerCommonName ?? null, problem: check.problem ?? null };
  }
  const body: VerifyResult = { documentId: doc.id, hashMatches: sha === doc.sha256, sha256: doc.sha256, signature };
  res.json(body);
});

// --- the customer's side: no account, the token is the key -----------------------------------

const publicLimiter = new RateLimiterPostgres({
  storeClient: sequelize, storeType: 'sequelize', tableName: 'rate_limits', tableCreated: true, keyPrefix: 'sign_ip', points: 120, duration: 60,
});

async function rateLimited(req: Request, _res: Response, next: NextFunction) {
  try {
    await publicLimiter.consume(req.ip ?? 'unknown');
    next();
  } catch (r) {
    if (r instanceof RateLimiterRes) return next(new HttpError(429, 'rate_limited', 'Too many requests. Wait a minute and try again.'));
    next(r);
  }
}

const TokenParams = z.object({ token: z.string().max(200) });

async function pageFor(request: SigningRequest): Promise<SigningPage> {
  const [doc, org, booking] = await Promise.all([
    Document.findByPk(request.documentId),
    Organization.findByPk(request.organizationId),
    Booking.findByPk(request.bookingId, { include: [{ model: Customer, as: 'customer' }] }) as Promise<Booking & { customer: Customer }>,
  ]);
  const fields = signingFields(doc!.markdown);
  const rules = rulesOf(org!);
  const base = `/api/sign/${encodeURIComponent((request as SigningRequest & { token?: string }).token ?? '')}`;
  return {
    status: request.status === 'pending' && request.expiresAt < new Date() ? 'expired' : request.status,
    company: { name: org!.name, phone: org!.phone, email: org!.email },
    customerName: booking.customer.name,
    document: {
      id: doc!.id, number: doc!.number, version: doc!.version, sha256: doc!.sha256,
      title: DOCUMENT_KIND_LABELS[doc!.kind], html: markdownToHtml(doc!.markdown), pdfUrl: `${base}/document.pdf`,
    },
    disclosure: disclosureFor(org!),
    clauses: fields.initials.map((f) => ({ key: f.key, title: f.heading ?? f.label, requiresInitials: true })),
    consentedAt: request.consentedAt ? request.consentedAt.toISOString() : null,
    signedAt: request.signedAt ? request.signedAt.toISOString() : null,
    signedPdfUrl:
      request.status === 'signed' && request.signedAt && request.signedAt.getTime() + rules.signedCopyDays * 86_400_000 > Date.now()
        ? `${base}/signed.pdf`
        : null,
    expiresAt: request.expiresAt.toISOString(),
  };
}

/** Loads the request of a token, refusing unknown/void/replaced/expired/used links with a page-worthy error. */
async function openRequest(token: string, opts: { allowSigned?: boolean } = {}) {
  const request = await findByToken(token);
  const state = linkState(request, opts);
  if (state !== 'ok') throw await linkError(state, request);
  (request as SigningRequest & { token?: string }).token = token;
  return request!;
}

signingRouter.get('/sign/:token', rateLimited, validate(TokenParams, 'params'), async (req, res) => {
  const { token } = parsed<{ token: string }>(res, 'params');
  const request = await openRequest(token, { allowSigned: true });
  if (request.status === 'pending') {
    const opened = await SigningEvent.count({ where: { signingRequestId: request.id, event: 'opened' } });
    if (!opened) await withTransaction((t) => recordEvent(request, 'opened', req, t));
  }
  res.json(await pageFor(request));
});

signingRouter.get('/sign/:token/document.pdf', rateLimited, validate(TokenParams, 'params'), async (req, res) => {
  const request = await openRequest(parsed<{ token: string }>(res, 'params').token, { allowSigned: true });
  const doc = (await Document.findByPk(request.documentId))!;
  const bytes = await issuedBytes(doc);
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', contentDisposition(`${doc.number}.pdf`, 'inline'));
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Cache-Control', 'private, no-store');
  res.send(bytes);
});

signingRouter.post('/sign/:token/consent', rateLimited, validate(TokenParams, 'params'), async (req, res) => {
  const token = parsed<{ token: string }>(res, 'params').token;
  await openRequest(token);
  const request = await withTransaction(async (t) => {
    const r = (await findByToken(token, t))!;
    if (linkState(r) !== 'ok') throw await linkError(linkState(r) as never, r);
    if (!r.consentedAt) {
      r.consentedAt = new Date();
      await r.save({ transaction: t });
      await recordEvent(r, 'consented', req, t);
    }
    return r;
  });
  (request as SigningRequest & { token?: string }).token = token;
  res.json(await pageFor(request));
});

signingRouter.post('/sign/:token/withdraw-consent', rateLimited, validate(TokenParams, 'params'), async (req, res) => {
  const token = parsed<{ token: string }>(res, 'params').token;
  await openRequest(token);
  const request = await withTransaction(async (t) => {
    const r = (await findByToken(token, t))!;
    if (linkState(r) !== 'ok') throw await linkError(linkState(r) as never, r);
    r.status = 'declined';
    r.consentedAt = null;
    await r.save({ transaction: t });
    await recordEvent(r, 'consent_withdrawn', req, t);
    const org = (await Organization.findByPk(r.organizationId, { transaction: t }))!;
    const booking = (await Booking.findByPk(r.bookingId, { include: [{ model: Customer, as: 'customer' }], transaction: t })) as Booking & { customer: Customer };
    for (const to of new Set([org.email, ...(await deskEmails(org.id, t))].filter(Boolean))) {
      await queueMail(org.id, to, 'signing-declined', { reference: booking.reference, customerName: booking.customer.name, link: `${env.APP_URL}/app/bookings/${booking.id}` }, t);
    }
    await audit({ organizationId: org.id, actorUserId: null, action: 'signing.consent_withdrawn', subjectType: 'booking', subjectId: booking.id, data: { requestId: r.id } }, req, t);
    return r;
  });
  (request as SigningRequest & { token?: string }).token = token;
  res.json(await pageFor(request));
});

signingRouter.post('/sign/:token', rateLimited, validate(TokenParams, 'params'), validate(SignRequest), async (req, res) => {
  const token = parsed<{ token: string }>(res, 'params').token;
  const input = parsed<z.output<typeof SignRequest>>(res);
  await openRequest(token, { allowSigned: true });
  let requestId: string | null = null;
  try {
    const signed = await withTransaction(async (t) => {
      // Locked: two submissions at once sign once; the second finds the link used.
      const r = await findByToken(token, t);
      const state = linkState(r);
      if (state !== 'ok') throw state === 'link_used' ? conflict('This agreement has already been signed.', 'already_signed') : await linkError(state, r);
      requestId = r!.id;
      return signAgreement(r!, input, req, t);
    });
    res.status(201).json({ signedDocumentId: signed.id, signedPdfUrl: `/api/sign/${encodeURIComponent(token)}/signed.pdf` });
  } catch (err) {
    if (err instanceof ShortfallError && requestId) {
      const id = requestId;
      await withTransaction((t) => reportStockGone(id, err as ShortfallError, req, t));
      throw new HttpError(409, 'stock_gone', 'Some of the items are no longer free on your dates, so the agreement could not be signed. The company has been told and will contact you.');
    }
    throw err;
  }
});

signingRouter.get('/sign/:token/signed.pdf', rateLimited, validate(TokenParams, 'params'), async (req, res) => {
  const request = await openRequest(parsed<{ token: string }>(res, 'params').token, { allowSigned: true });
  const page = await pageFor(Object.assign(request, { token: parsed<{ token: string }>(res, 'params').token }));
  if (request.status !== 'signed' || !request.signedDocumentId || !page.signedPdfUrl) throw notFound('The signed copy');
  const doc = (await Document.findByPk(request.signedDocumentId))!;
  const file = (await readFile(doc.organizationId, doc.fileId))!;
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', contentDisposition(`${doc.number}.pdf`));
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Cache-Control', 'private, no-store');
  res.send(file.data);
});
