import { createHash, timingSafeEqual } from 'node:crypto';
import type { Request } from 'express';
import { renderSignedPdf, signingFields, SigningInputError } from '../documents/signing';
import type { Transaction } from '../db';
import { env } from '../env';
import { HttpError, badRequest, conflict } from '../errors';
import { Booking, Customer, Document, DocumentSend, Organization, SigningEvent, SigningRequest, User } from '../models';
import { queueJob } from '../services/jobs';
import { queueMail } from '../services/mailer';
import { companySigningKey, ensureCompanyCertificate } from '../services/companyCertificate';
import { deskEmails } from '../services/bookingRecords';
import { rulesOf } from '../services/rules';
import { documentLogo, keptImage } from '../services/images';
import { readFile, storeFile } from '../services/storage';
import { hashToken, newToken } from '../services/tokens';
import { audit } from './audit';
import { ShortfallError, changeBookingStatus } from './bookings';
import type { SigningEventKind } from '../../shared/schemas/signing';

const who = (req: Request) => ({ ip: req.ip ?? null, userAgent: (req.get('user-agent') ?? '').slice(0, 400) || null });

export async function recordEvent(request: SigningRequest, event: SigningEventKind, req: Request | null, transaction: Transaction, detail: string | null = null) {
  await SigningEvent.create(
    { organizationId: request.organizationId, signingRequestId: request.id, event, ...(req ? who(req) : { ip: null, userAgent: null }), detail },
    { transaction },
  );
}

async function mailLink(request: SigningRequest, token: string, document: Document, organization: Organization, transaction: Transaction) {
  const values = document.values as { customer?: { name?: string }; booking?: { reference?: string; eventDate?: string } };
  await queueMail(
    request.organizationId,
    request.sentTo,
    'signing-request',
    {
      customerName: values.customer?.name ?? 'there',
      companyName: organization.name,
      reference: values.booking?.reference ?? '',
      eventDate: values.booking?.eventDate ?? '',
      number: document.number,
      link: `${env.APP_URL}/sign/${token}`,
      expires: new Intl.DateTimeFormat('en-US', { timeZone: organization.timeZone, dateStyle: 'long' }).format(request.expiresAt),
      companyPhone: organization.phone || 'the number on the agreement',
    },
    transaction,
  );
}

/** Creates a signing link for a current rental agreement and e-mails it; any pending link of the booking is replaced. */
export async function createSigningRequest(actor: User, document: Document, to: string, req: Request, transaction: Transaction) {
  const { request, token, organization } = await openSigningLink(actor, document, to, req, transaction);
  await mailLink(request, token, document, organization, transaction);
  return request;
}

/**
 * A fresh signing link for the agreement without e-mailing it: the customer, signed in to their
 * own pages, is sent straight to it. Any pending link of the booking is replaced.
 */
export async function openSigningLink(actor: User, document: Document, to: string, req: Request | null, transaction: Transaction) {
  await Document.findByPk(document.id, { transaction, lock: transaction.LOCK.UPDATE });
  const organization = await ensureCompanyCertificate(actor.organizationId, transaction);
  const pending = await SigningRequest.findAll({ where: { bookingId: document.bookingId, status: 'pending' }, transaction, lock: transaction.LOCK.UPDATE });
  for (const p of pending) {
    p.status = 'replaced';
    await p.save({ transaction });
    await recordEvent(p, 'replaced', req, transaction);
  }
  const { token, hash } = newToken();
  const request = await SigningRequest.create(
    {
      organizationId: actor.organizationId, documentId: document.id, bookingId: document.bookingId, tokenHash: hash, sentTo: to,
      expiresAt: new Date(Date.now() + rulesOf(organization).signingLinkDays * 86_400_000), createdById: actor.id,
    },
    { transaction },
  );
  await recordEvent(request, 'sent', req, transaction, to);
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'signing.requested', subjectType: 'booking', subjectId: document.bookingId, data: { documentId: document.id, number: document.number, to } }, req, transaction);
  return { request, token, organization };
}

export async function voidSigningRequest(actor: User, request: SigningRequest, req: Request, transaction: Transaction) {
  if (request.status !== 'pending') throw conflict(`This link is already ${request.status}.`, 'not_pending');
  request.status = 'void';
  await request.save({ transaction });
  await recordEvent(request, 'voided', req, transaction);
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'signing.voided', subjectType: 'booking', subjectId: request.bookingId, data: { requestId: request.id } }, req, transaction);
  return request;
}

export type LinkState = 'ok' | 'link_unknown' | 'link_expired' | 'link_void' | 'link_replaced' | 'link_used' | 'link_declined';

/** Finds a signing request by its token; the stored hash is compared in constant time. */
export async function findByToken(token: string, transaction?: Transaction) {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
  const hash = hashToken(token);
  const request = await SigningRequest.findOne({ where: { tokenHash: hash }, transaction, lock: transaction ? transaction.LOCK.UPDATE : undefined });
  if (!request || !timingSafeEqual(Buffer.from(request.tokenHash, 'hex'), Buffer.from(hash, 'hex'))) return null;
  return request;
}

export function linkState(request: SigningRequest | null, opts: { allowSigned?: boolean } = {}): LinkState {
  if (!request) return 'link_unknown';
  if (request.status === 'signed') return opts.allowSigned ? 'ok' : 'link_used';
  if (request.status === 'void') return 'link_void';
  if (request.status === 'replaced') return 'link_replaced';
  if (request.status === 'declined') return 'link_declined';
  if (request.expiresAt < new Date()) return 'link_expired';
  return 'ok';
}

const LINK_MESSAGES: Record<Exclude<LinkState, 'ok'>, string> = {
  link_unknown: 'This signing link is not valid. Check that the whole link was copied, or ask the company for a new one.',
  link_expired: 'This signing link has expired. Ask the company to send a new one.',
  link_void: 'The company has withdrawn this signing link. Ask them for a new one if you still need to sign.',
  link_replaced: 'A newer signing link was sent for this agreement. Use the link in the most recent e-mail, or ask the company to send it again.',
  link_used: 'This agreement has already been signed with this link.',
  link_declined: 'You chose not to use electronic records for this agreement. Contact the company to sign on paper.',
};

export async function linkError(state: Exclude<LinkState, 'ok'>, request: SigningRequest | null) {
  const org = request ? await Organization.findByPk(request.organizationId) : null;
  return new HttpError(state === 'link_unknown' ? 404 : 410, state, LINK_MESSAGES[state], undefined, org ? { company: { name: org.name, phone: org.phone, email: org.email } } : undefined);
}

/** The issued PDF's bytes, after checking they still hash to the stored SHA-256. */
export async function issuedBytes(document: Document) {
  const file = await readFile(document.organizationId, document.fileId);
  if (!file) throw new Error('The issued PDF is missing');
  const sha = createHash('sha256').update(file.data).digest('hex');
  if (sha !== document.sha256) throw new HttpError(409, 'document_changed', 'The stored agreement no longer matches what was issued. The company has to issue it again.');
  return file.data;
}

/** The signature: checks, reserves the booking, renders and stores the signed copy, all or nothing. */
export async function signAgreement(
  request: SigningRequest,
  input: { typedName: string; signatureImage?: string; initials: Record<string, string> },
  req: Request,
  transaction: Transaction,
) {
  if (!request.consentedAt) throw conflict('Agree to use electronic records first.', 'consent_required');
  const document = (await Document.findByPk(request.documentId, { transaction }))!;
  if (document.status !== 'issued') throw await linkError('link_replaced', request);
  await issuedBytes(document);

  const fields = signingFields(document.markdown);
  const problems: Record<string, string> = {};
  for (const f of fields.initials) if (!input.initials[f.key]?.trim()) problems[`initials.${f.key}`] = `Initial "${f.heading ?? f.label}".`;
  for (const key of Object.keys(input.initials)) if (!fields.initials.some((f) => f.key === key)) problems[`initials.${key}`] = 'This agreement has no such clause.';
  if (Object.keys(problems).length) throw badRequest('Some initials are missing.', problems);
  // The drawing: refused by its header when too large, redrawn at the size the signature box prints.
  const drawn = input.signatureImage ? (await keptImage(Buffer.from(input.signatureImage.split(',')[1], 'base64'), 'signature', 'signatureImage')).data : null;

  const now = new Date();
  for (const f of fields.initials) await recordEvent(request, 'initialed', req, transaction, f.key);

  // Reserve the booking with the same availability check as the office; a shortfall rolls all back.
  const booking = (await Booking.findByPk(request.bookingId, { transaction, lock: transaction.LOCK.UPDATE }))!;
  const system = { id: null, organizationId: request.organizationId, role: 'owner', name: 'Customer signature' } as unknown as User;
  if (booking.status === 'draft' || booking.status === 'quoted') {
    await changeBookingStatus(system, booking, 'reserved', `Signed by ${input.typedName}`, req, transaction);
  }

  await recordEvent(request, 'signed', req, transaction, input.typedName);
  const organization = (await Organization.findByPk(request.organizationId, { transaction }))!;
  const events = await SigningEvent.findAll({ where: { signingRequestId: request.id }, order: [['at', 'ASC'], ['id', 'ASC']], transaction });
  const values = document.values as { document: { title: string; number: string; label: string } };
  let signed: Buffer;
  try {
    signed = await renderSignedPdf({
      markdown: document.markdown,
      title: `${values.document.title} ${values.document.number}`,
      company: { name: organization.name, logo: await documentLogo(organization) },
      documentLabel: values.document.label,
      issuedAt: document.issuedAt,
      signature: { typedName: input.typedName, imagePng: drawn, signedAt: now },
      initials: input.initials,
      trail: events.map((e) => ({ at: e.at, event: e.event, ip: e.ip ?? '', userAgent: e.userAgent ?? '', detail: e.detail ?? undefined })),
      issuedSha256: document.sha256,
      certificate: companySigningKey(organization),
      timeZone: organization.timeZone,
    });
  } catch (err) {
    if (err instanceof SigningInputError) throw badRequest(err.message, { signatureImage: err.message });
    // pdfkit's own PNG reader refuses a damaged image: the drawing, not the server, is at fault.
    if (/PNG/i.test((err as Error).message)) throw badRequest('The signature drawing could not be read. Clear it and draw again.', { signatureImage: 'Could not be read.' });
    throw err;
  }
  const sha256 = createHash('sha256').update(signed).digest('hex');
  const file = await storeFile({ organizationId: organization.id, filename: `${document.number}-signed.pdf`, contentType: 'application/pdf', data: signed, purpose: 'document:signed_agreement' }, transaction);
  const signedDoc = await Document.create(
    {
      organizationId: organization.id, bookingId: document.bookingId, kind: 'signed_agreement', number: `${document.number}-S`,
      version: document.version, fileId: file.id, sha256, values: document.values, markdown: document.markdown, issuedById: null, issuedAt: now,
    },
    { transaction },
  );
  request.status = 'signed';
  request.signedAt = now;
  request.typedName = input.typedName;
  request.signedDocumentId = signedDoc.id;
  await request.save({ transaction });
  await audit({ organizationId: organization.id, actorUserId: null, action: 'signing.signed', subjectType: 'booking', subjectId: document.bookingId, data: { documentId: signedDoc.id, number: signedDoc.number, typedName: input.typedName, sha256 } }, req, transaction);

  // The signed copy to the customer and to the company (its own address, or else its owners and office).
  const customer = (await Customer.findByPk(booking.customerId, { transaction }))!;
  const office = organization.email
    ? [organization.email]
    : await deskEmails(organization.id, transaction);
  for (const to of new Set([request.sentTo, customer.email, ...office].filter(Boolean))) {
    const send = await DocumentSend.create({ organizationId: organization.id, documentId: signedDoc.id, to, requestedById: null }, { transaction });
    await queueJob('send-document', { sendId: send.id }, transaction);
  }
  return signedDoc;
}

/** After a signature failed for want of stock: the trail and the office are told. */
export async function reportStockGone(requestId: string, err: ShortfallError, req: Request, transaction: Transaction) {
  const request = (await SigningRequest.findByPk(requestId, { transaction }))!;
  await recordEvent(request, 'refused_stock', req, transaction, err.shortfalls.map((s) => `${s.name} short ${s.shortfall}`).join('; ').slice(0, 200));
  const organization = (await Organization.findByPk(request.organizationId, { transaction }))!;
  const booking = (await Booking.findByPk(request.bookingId, { transaction }))!;
  for (const to of new Set([organization.email, ...(await deskEmails(organization.id, transaction))].filter(Boolean))) {
    await queueMail(organization.id, to, 'signing-stock-gone', { reference: booking.reference, message: err.message, companyName: organization.name, link: `${env.APP_URL}/app/bookings/${booking.id}` }, transaction);
  }
}

