import type { Request } from 'express';
import { Op } from 'sequelize';
import type { DocumentKind } from '../../shared/schemas/documents';
import { bookingDocumentValues, renderDocument } from '../documents';
import type { Transaction } from '../db';
import { conflict } from '../errors';
import { Booking, Document, DocumentSend, Organization, SigningEvent, SigningRequest, type User } from '../models';
import { presentBooking } from '../presenters/booking';
import { activeClauses, occupancyOf, templateNameFor, templateSource } from '../services/documents';
import { queueJob } from '../services/jobs';
import { rulesOf } from '../services/rules';
import { documentLogo } from '../services/images';
import { storeFile } from '../services/storage';
import { findPricedBooking, invoiceRecordDocumentIds } from '../services/bookingRecords';
import { audit } from './audit';

const PREFIX: Record<DocumentKind, string> = { rental_agreement: 'RA', invoice: 'INV', receipt: 'RCT', credit_note: 'CN' };

/** Agreements and invoices have versions (a new one replaces the last); receipts and credit notes are each their own. */
const VERSIONED: Record<DocumentKind, boolean> = { rental_agreement: true, invoice: true, receipt: false, credit_note: false };

export interface PaymentDetails {
  amountCents: number;
  method: string;
  receivedAt: Date;
  reference: string;
}

/**
 * Issues a document for a booking: renders it from the company's template and clauses, stores
 * the PDF bytes, the values and the hash, and marks the previous version of the same kind replaced.
 */
export async function issueDocument(
  actor: User,
  bookingId: string,
  kind: DocumentKind,
  /** The request behind it; null when the company itself acts (a card payment reported by webhook). */
  req: Request | null,
  transaction: Transaction,
  extra: {
    payment?: PaymentDetails;
    credit?: { amountCents: number; reason: string };
    /** An invoice record's own number and amount due (its PDF is its own document, never a version of another). */
    invoice?: {
      number: string;
      schedule: { label: string; dueDate: string; amount: string }[];
      /** The invoice's own lines and totals, printed instead of the booking's whole charges table. */
      lines?: { description: string; amount: string }[];
      summary?: { label: string; amount: string; strong: boolean }[];
      /** The invoice's (or credit note's) own total: what its e-mail and PDF call "the total". */
      total?: string;
    };
    /** When it is dated (demo data loaded after the fact); now by default. */
    issuedAt?: Date;
  } = {},
) {
  // Locking the booking serializes two people issuing at once: versions stay 1, 2, 3...
  const booking = await findPricedBooking(actor.organizationId, bookingId, transaction);
  if (!booking) throw conflict('That booking was not found.', 'not_found');
  await Booking.findByPk(booking.id, { transaction, lock: transaction.LOCK.UPDATE });
  if (booking.lines.length === 0) throw conflict('Add lines to the booking before issuing documents.', 'empty_booking');
  // NO KEY UPDATE, not UPDATE: numbering still takes turns, but the lock does not wait on the KEY
  // SHARE locks that rows inserted earlier in other transactions (a payment, a journal entry that
  // refer to the company) hold on the company row. With UPDATE, two card payments recorded at once
  // each inserted first and then waited here for the other: a deadlock.
  const organization = (await Organization.findByPk(actor.organizationId, { transaction, lock: transaction.LOCK.NO_KEY_UPDATE }))!;

  const versioned = VERSIONED[kind] && !extra.invoice;
  // The PDFs of invoice records are their own documents: never replaced by a new version of the booking's invoice.
  const invoiceRecordDocs = await invoiceRecordDocumentIds(booking.id, transaction);
  const previous = versioned
    ? await Document.findOne({
        where: { bookingId: booking.id, kind, status: 'issued', ...(invoiceRecordDocs.length ? { id: { [Op.notIn]: invoiceRecordDocs } } : {}) },
        order: [['version', 'DESC']],
        transaction,
      })
    : null;
  const lastVersion = ((await Document.max('version', { where: { bookingId: booking.id, kind }, transaction })) as number | null) ?? 0;
  const version = lastVersion + 1;
  let base: string;
  if (extra.invoice) {
    base = extra.invoice.number;
  } else if (kind === 'invoice') {
    const first = await Document.findOne({ where: { bookingId: booking.id, kind, version: 1 }, transaction });
    if (first) base = first.number;
    else {
      base = `${PREFIX.invoice}-${String(organization.nextInvoiceNumber).padStart(5, '0')}`;
      organization.nextInvoiceNumber += 1;
      await organization.save({ transaction });
    }
  } else {
    base = `${PREFIX[kind]}-${booking.reference}`;
  }
  // Receipts and credit notes are numbered in sequence on the booking: RCT-B-1001-1, -2...
  const number = extra.invoice ? base : !VERSIONED[kind] ? `${base}-${version}` : version === 1 ? base : `${base}-${version}`;
  const issuedAt = extra.issuedAt ?? new Date();
  // Only roles that see prices may issue documents, so the actor's view of the booking is the priced one.
  const row = presentBooking(booking, actor, organization);
  const values = bookingDocumentValues({
    booking: row,
    organization,
    rules: rulesOf(organization),
    document: { kind, number, version, issuedAt },
    occupancy: await occupancyOf(actor.organizationId, booking.lines, booking.seating, transaction),
    payment: extra.payment,
    credit: extra.credit,
  });
  if (extra.invoice) {
    values.schedule = extra.invoice.schedule;
    if (extra.invoice.lines) values.lines = extra.invoice.lines.map((l) => ({ description: l.description, quantity: '', unitPrice: '', extraDays: '', total: l.amount }));
    if (extra.invoice.summary) values.summary = extra.invoice.summary;
    if (extra.invoice.total) values.totals = { ...values.totals, total: extra.invoice.total };
  }
  const { source } = await templateSource(actor.organizationId, templateNameFor(kind), transaction);
  const rendered = await renderDocument({
    template: source,
    clauses: kind === 'rental_agreement' ? await activeClauses(actor.organizationId, transaction) : [],
    values,
    company: { name: organization.name, logo: await documentLogo(organization) },
    issuedAt,
  });
  const file = await storeFile(
    { organizationId: actor.organizationId, filename: `${number}.pdf`, contentType: 'application/pdf', data: rendered.pdf, purpose: `document:${kind}` },
    transaction,
  );
  const document = await Document.create(
    {
      organizationId: actor.organizationId, bookingId: booking.id, kind, number, version, fileId: file.id, sha256: rendered.sha256,
      values: values as unknown as Record<string, unknown>, markdown: rendered.markdown, issuedById: actor.id, issuedAt,
    },
    { transaction },
  );
  if (previous) {
    previous.status = 'replaced';
    previous.replacedById = document.id;
    await previous.save({ transaction });
    // A signing link for the old version must not sign it any more.
    const pending = await SigningRequest.findAll({ where: { documentId: previous.id, status: 'pending' }, transaction, lock: transaction.LOCK.UPDATE });
    for (const r of pending) {
      r.status = 'replaced';
      await r.save({ transaction });
      await SigningEvent.create({ organizationId: r.organizationId, signingRequestId: r.id, event: 'replaced', ip: req?.ip ?? null, userAgent: (req?.get('user-agent') ?? '').slice(0, 400) || null, detail: `by ${number}` }, { transaction });
    }
  }
  await audit(
    { organizationId: actor.organizationId, actorUserId: actor.id, action: 'document.issued', subjectType: 'booking', subjectId: booking.id, data: { documentId: document.id, kind, number, version, sha256: rendered.sha256, replaced: previous?.number ?? null } },
    req,
    transaction,
  );
  return document;
}

/**
 * Queues the e-mail that carries a document. A second request within a minute, or while one is
 * still queued, returns the same send: a double click sends once.
 */
export async function sendDocument(actor: User, document: Document, to: string, req: Request | null, transaction: Transaction) {
  await Document.findByPk(document.id, { transaction, lock: transaction.LOCK.UPDATE });
  const recent = await DocumentSend.findOne({
    where: {
      documentId: document.id,
      to,
      [Op.or]: [{ status: 'queued' }, { createdAt: { [Op.gt]: new Date(Date.now() - 60_000) } }],
    },
    order: [['createdAt', 'DESC']],
    transaction,
  });
  if (recent) return { send: recent, duplicate: true };
  const send = await DocumentSend.create({ organizationId: actor.organizationId, documentId: document.id, to, requestedById: actor.id }, { transaction });
  await queueJob('send-document', { sendId: send.id }, transaction);
  await audit(
    { organizationId: actor.organizationId, actorUserId: actor.id, action: 'document.send_queued', subjectType: 'booking', subjectId: document.bookingId, data: { documentId: document.id, kind: document.kind, number: document.number, version: document.version, to } },
    req,
    transaction,
  );
  return { send, duplicate: false };
}

/** JSON with keys in a fixed order: stored values come back from JSONB with their keys reordered. */
function stable(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(stable).join(',')}]`;
  if (value && typeof value === 'object') {
    return `{${Object.keys(value).sort().map((k) => `${JSON.stringify(k)}:${stable((value as Record<string, unknown>)[k])}`).join(',')}}`;
  }
  return JSON.stringify(value);
}

/**
 * What a document says, without its own number, version and date, nor the due dates counted from
 * the day it was issued: equal when nothing the customer reads about the booking changed.
 */
function substance(values: Record<string, unknown>) {
  const { document: _document, schedule, ...rest } = values;
  const amounts = Array.isArray(schedule) ? schedule.map((e) => ({ ...(e as object), dueDate: undefined })) : schedule;
  return stable({ ...rest, schedule: amounts });
}

/**
 * After a booking is edited: each current agreement or invoice whose content would now read
 * differently is issued again as a new version (the old one becomes replaced). Unchanged ones stay.
 */
export async function reissueChangedDocuments(actor: User, bookingId: string, req: Request, transaction: Transaction) {
  const invoiceRecordDocs = await invoiceRecordDocumentIds(bookingId, transaction);
  // An issued invoice record is never re-issued: it is corrected by a credit note.
  const current = (await Document.findAll({ where: { bookingId, status: 'issued', kind: ['rental_agreement', 'invoice'] }, transaction })).filter(
    (d) => !invoiceRecordDocs.includes(d.id),
  );
  if (current.length === 0) return [];
  const booking = await findPricedBooking(actor.organizationId, bookingId, transaction);
  if (!booking || booking.lines.length === 0) return [];
  const organization = (await Organization.findByPk(actor.organizationId, { transaction }))!;
  const reissued: Document[] = [];
  for (const doc of current) {
    const now = bookingDocumentValues({
      booking: presentBooking(booking, actor, organization),
      organization,
      rules: rulesOf(organization),
      document: { kind: doc.kind as DocumentKind, number: doc.number, version: doc.version, issuedAt: doc.issuedAt },
      occupancy: await occupancyOf(actor.organizationId, booking.lines, booking.seating, transaction),
    });
    if (substance(now as unknown as Record<string, unknown>) !== substance(doc.values)) {
      reissued.push(await issueDocument(actor, bookingId, doc.kind as DocumentKind, req, transaction));
    }
  }
  return reissued;
}
