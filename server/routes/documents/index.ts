import { Router } from 'express';
import sanitizeHtml from 'sanitize-html';
import { Op } from 'sequelize';
import { z } from 'zod';
import { IdParams } from '../../../shared/schemas/common';
import {
  ClauseInput, SendDocumentRequest, TEMPLATE_NAMES, TemplatePreviewRequest, TemplateSource, type DocumentKind, type TemplateName,
  type BookingDocumentList,
} from '../../../shared/schemas/documents';
import { audit } from '../../commands/audit';
import { issueDocument, sendDocument } from '../../commands/documents';
import { createInvoice, issueInvoice } from '../../commands/invoices';
import { withTransaction } from '../../db';
import { bookingDocumentValues, markdownToHtml, renderDocumentMarkdown, TemplateError, type TemplateProblem } from '../../documents';
import { HttpError, conflict, notFound } from '../../errors';
import { auth, authenticate } from '../../middlewares/authenticate';
import { parsed, validate } from '../../middlewares/validate';
import { Booking, CompanyClause, Customer, Document, DocumentSend, DocumentTemplate, User } from '../../models';
import { authorize, can, sameOrganization } from '../../policies';
import { presentBooking } from '../../presenters/booking';
import { presentAgreementStatus, presentClause, presentDocument, presentTemplate } from '../../presenters/document';
import { agreementStateOf } from '../../services/agreementState';
import {
  activeClauses, checkClause, checkTemplate, ensureClauseLibrary, KIND_OF_TEMPLATE, occupancyOf, templateSource, variablesFor,
} from '../../services/documents';
import { rulesOf } from '../../services/rules';
import { contentDisposition } from '../../services/downloads';
import { readFile } from '../../services/storage';
import { findPricedBooking } from '../../services/bookingRecords';

export const documentsRouter = Router();

/** A 400 naming each problem with its line; nothing is saved. */
function templateInvalid(problems: TemplateProblem[], field = 'source') {
  const first = problems[0];
  const where = (p: TemplateProblem) => `line ${p.line}: ${p.message}`;
  return new HttpError(400, 'template_invalid', `The template has ${problems.length} problem${problems.length === 1 ? '' : 's'}: ${where(first)}.`, { [field]: where(first) }, { problems });
}

async function presentMany(docs: Document[], actor: User) {
  const ids = docs.map((d) => d.id);
  const sends = ids.length ? await DocumentSend.findAll({ where: { documentId: { [Op.in]: ids } }, order: [['createdAt', 'DESC']] }) : [];
  const issuerIds = docs.map((d) => d.issuedById).filter((x): x is string => !!x);
  const names = new Map((issuerIds.length ? await User.findAll({ where: { id: { [Op.in]: issuerIds } }, attributes: ['id', 'name'] }) : []).map((u) => [u.id, u.name]));
  return docs.map((d) =>
    presentDocument(d, actor, { issuedBy: d.issuedById ? (names.get(d.issuedById) ?? null) : null, sends: sends.filter((s) => s.documentId === d.id) }),
  );
}

async function loadBooking(actor: User, id: string) {
  return sameOrganization(actor, await Booking.findByPk(id), 'That booking');
}

// --- documents of a booking -------------------------------------------------------------------

const issue = (kind: DocumentKind) => async (req: import('express').Request, res: import('express').Response) => {
  const { user } = auth(req);
  const booking = await loadBooking(user, parsed<{ id: string }>(res, 'params').id);
  authorize(user, 'document', 'issue');
  const doc = await withTransaction((t) => issueDocument(user, booking.id, kind, req, t));
  res.status(201).json((await presentMany([doc], user))[0]);
};

documentsRouter.post('/bookings/:id/agreement', authenticate, validate(IdParams, 'params'), issue('rental_agreement'));
/**
 * One invoice series: the booking's invoice is an invoice record (#6) for everything not yet
 * invoiced, issued at once with its ledger entry and PDF; the answer is that PDF's document.
 */
documentsRouter.post('/bookings/:id/invoice', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  const booking = await loadBooking(user, parsed<{ id: string }>(res, 'params').id);
  authorize(user, 'invoice', 'create');
  const doc = await withTransaction(async (t) => {
    const draft = await createInvoice(user, booking.id, 'balance', req, t);
    const issued = await issueInvoice(user, draft.id, req, t);
    return (await Document.findByPk(issued.documentId!, { transaction: t }))!;
  });
  res.status(201).json((await presentMany([doc], user))[0]);
});

/**
 * Receipts and credit notes are no longer written free-hand: a receipt comes from a payment
 * recorded on an invoice, a credit note from a credit against one, so the ledger explains every
 * figure a customer is sent.
 */
documentsRouter.post('/bookings/:id/receipt', authenticate, () => {
  throw new HttpError(410, 'moved', 'Receipts come from payments: record the payment on an invoice (POST /api/payments) and its receipt is made and e-mailed.');
});
documentsRouter.post('/bookings/:id/credit-note', authenticate, () => {
  throw new HttpError(410, 'moved', 'Credit notes are issued against an invoice: POST /api/invoices/:id/credit-notes.');
});

documentsRouter.get('/bookings/:id/documents', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  const booking = await loadBooking(user, parsed<{ id: string }>(res, 'params').id);
  authorize(user, 'booking', 'read', booking);
  authorize(user, 'document', 'readTemplates');
  const docs = await Document.findAll({ where: { bookingId: booking.id, organizationId: user.organizationId }, order: [['createdAt', 'DESC']] });
  const body: BookingDocumentList = { data: await presentMany(docs, user), total: docs.length, agreement: presentAgreementStatus(await agreementStateOf(booking.id)) };
  res.json(body);
});

async function loadDocument(actor: User, id: string) {
  const doc = sameOrganization(actor, await Document.findByPk(id), 'That document');
  // Crew may not read documents: to them they do not exist.
  if (actor.role === 'crew') throw notFound('That document');
  authorize(actor, 'document', 'read', doc);
  return doc;
}

documentsRouter.get('/documents/:id', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  const doc = await loadDocument(user, parsed<{ id: string }>(res, 'params').id);
  res.json((await presentMany([doc], user))[0]);
});

documentsRouter.get('/documents/:id/pdf', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  const doc = await loadDocument(user, parsed<{ id: string }>(res, 'params').id);
  const file = await readFile(user.organizationId, doc.fileId);
  if (!file) throw notFound('The stored PDF');
  const inline = req.query.inline === '1';
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', contentDisposition(`${doc.number}.pdf`, inline ? 'inline' : 'attachment'));
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Cache-Control', 'private, no-store');
  res.setHeader('ETag', `"${doc.sha256}"`);
  res.send(file.data);
});

documentsRouter.post('/documents/:id/send', authenticate, validate(IdParams, 'params'), validate(SendDocumentRequest), async (req, res) => {
  const { user } = auth(req);
  const doc = await loadDocument(user, parsed<{ id: string }>(res, 'params').id);
  if (doc.status !== 'issued') throw conflict(`This is a ${doc.status} version: send the current one.`, 'not_current');
  authorize(user, 'document', 'send', doc);
  const booking = (await Booking.findByPk(doc.bookingId, { include: [{ model: Customer, as: 'customer' }] })) as Booking & { customer: Customer };
  const to = parsed<{ to: string }>(res).to || booking.customer.email;
  if (!to) throw conflict('The customer has no e-mail address: add one, or type where to send it.', 'no_email', { to: 'Where should it go?' });
  const { send } = await withTransaction((t) => sendDocument(user, doc, to, req, t));
  res.status(202).json({ send: (await presentMany([doc], user))[0].sends.find((s) => s.id === send.id) });
});

// --- templates --------------------------------------------------------------------------------

const TemplateParams = z.object({ name: z.enum(TEMPLATE_NAMES, { error: 'Unknown template.' }) });

documentsRouter.get('/templates', authenticate, async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'document', 'readTemplates');
  const data = [];
  for (const name of TEMPLATE_NAMES) {
    const { source, own } = await templateSource(user.organizationId, name);
    data.push(presentTemplate(name, source, own, variablesFor(name)));
  }
  res.json({ data, total: data.length, can: { update: can(user, 'document', 'editTemplates') } });
});

documentsRouter.get('/templates/:name', authenticate, validate(TemplateParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'document', 'readTemplates');
  const { name } = parsed<{ name: TemplateName }>(res, 'params');
  const { source, own } = await templateSource(user.organizationId, name);
  res.json(presentTemplate(name, source, own, variablesFor(name)));
});

documentsRouter.put('/templates/:name', authenticate, validate(TemplateParams, 'params'), validate(TemplateSource), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'document', 'editTemplates');
  const { name } = parsed<{ name: TemplateName }>(res, 'params');
  const { source } = parsed<{ source: string }>(res);
  const check = checkTemplate(name, source);
  if (!check.ok) throw templateInvalid(check.errors);
  const own = await withTransaction(async (t) => {
    const [row] = await DocumentTemplate.upsert({ organizationId: user.organizationId, name, source, updatedById: user.id }, { transaction: t, conflictFields: ['organization_id', 'name'] as never });
    await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'template.updated', subjectType: 'template', subjectId: row.id, data: { name } }, req, t);
    return row;
  });
  res.json(presentTemplate(name, source, own, variablesFor(name)));
});

documentsRouter.delete('/templates/:name', authenticate, validate(TemplateParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'document', 'editTemplates');
  const { name } = parsed<{ name: TemplateName }>(res, 'params');
  await withTransaction(async (t) => {
    await DocumentTemplate.destroy({ where: { organizationId: user.organizationId, name }, transaction: t });
    await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'template.reset', subjectType: 'template', subjectId: null, data: { name } }, req, t);
  });
  const { source } = await templateSource(user.organizationId, name);
  res.json(presentTemplate(name, source, null, variablesFor(name)));
});

documentsRouter.post('/templates/:name/preview', authenticate, validate(TemplateParams, 'params'), validate(TemplatePreviewRequest), async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'document', 'readTemplates');
  const { name } = parsed<{ name: TemplateName }>(res, 'params');
  const { source, bookingId } = parsed<{ source: string; bookingId: string }>(res);
  const check = checkTemplate(name, source);
  if (!check.ok) throw templateInvalid(check.errors);
  const booking = await findPricedBooking(user.organizationId, bookingId);
  if (!booking) throw notFound('That booking');
  const { kind, email } = KIND_OF_TEMPLATE[name];
  const values = bookingDocumentValues({
    booking: presentBooking(booking, user, organization),
    organization,
    rules: rulesOf(organization),
    document: { kind, number: 'PREVIEW', version: 1, issuedAt: new Date() },
    occupancy: await occupancyOf(user.organizationId, booking.lines, booking.seating),
  });
  try {
    if (email) {
      const { renderDocumentEmail } = await import('../../documents');
      const mail = renderDocumentEmail(source, values);
      const body = mail.html.replace(/^.*<body[^>]*>|<\/body>.*$/gs, '');
      res.json({ html: sanitizeHtml(`<p><strong>Subject:</strong> ${mail.subject.replace(/&/g, '&amp;').replace(/</g, '&lt;')}</p>${body}`) });
      return;
    }
    const markdown = renderDocumentMarkdown(source, values, await activeClauses(user.organizationId));
    res.json({ html: markdownToHtml(markdown) });
  } catch (err) {
    if (err instanceof TemplateError) throw templateInvalid(err.errors);
    throw err;
  }
});

// --- clause library ---------------------------------------------------------------------------

documentsRouter.get('/clauses', authenticate, async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'document', 'readTemplates');
  await ensureClauseLibrary(user.organizationId);
  const rows = await CompanyClause.findAll({ where: { organizationId: user.organizationId }, order: [['position', 'ASC'], ['key', 'ASC']] });
  res.json({ data: rows.map(presentClause), total: rows.length, can: { update: can(user, 'document', 'editTemplates') } });
});

function keyTaken(err: unknown) {
  return (err as { name?: string })?.name === 'SequelizeUniqueConstraintError';
}

documentsRouter.post('/clauses', authenticate, validate(ClauseInput), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'document', 'editTemplates');
  const input = parsed<z.output<typeof ClauseInput>>(res);
  const check = checkClause(input.body);
  if (!check.ok) throw templateInvalid(check.errors, 'body');
  await ensureClauseLibrary(user.organizationId);
  const row = await withTransaction(async (t) => {
    const c = await CompanyClause.create({ ...input, organizationId: user.organizationId }, { transaction: t });
    await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'clause.created', subjectType: 'clause', subjectId: c.id, data: { key: c.key } }, req, t);
    return c;
  }).catch((err) => {
    throw keyTaken(err) ? conflict('Another clause has that key.', 'key_taken', { key: 'Another clause has that key.' }) : err;
  });
  res.status(201).json(presentClause(row));
});

documentsRouter.put('/clauses/:id', authenticate, validate(IdParams, 'params'), validate(ClauseInput), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'document', 'editTemplates');
  const input = parsed<z.output<typeof ClauseInput>>(res);
  const check = checkClause(input.body);
  if (!check.ok) throw templateInvalid(check.errors, 'body');
  const row = await withTransaction(async (t) => {
    const c = sameOrganization(user, await CompanyClause.findByPk(parsed<{ id: string }>(res, 'params').id, { transaction: t, lock: t.LOCK.UPDATE }), 'That clause');
    c.set(input);
    await c.save({ transaction: t });
    await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'clause.updated', subjectType: 'clause', subjectId: c.id, data: { key: c.key } }, req, t);
    return c;
  }).catch((err) => {
    throw keyTaken(err) ? conflict('Another clause has that key.', 'key_taken', { key: 'Another clause has that key.' }) : err;
  });
  res.json(presentClause(row));
});

documentsRouter.delete('/clauses/:id', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'document', 'editTemplates');
  await withTransaction(async (t) => {
    const c = sameOrganization(user, await CompanyClause.findByPk(parsed<{ id: string }>(res, 'params').id, { transaction: t }), 'That clause');
    await c.destroy({ transaction: t });
    await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'clause.deleted', subjectType: 'clause', subjectId: c.id, data: { key: c.key } }, req, t);
  });
  res.status(204).end();
});
