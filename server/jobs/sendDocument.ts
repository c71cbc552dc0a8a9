import type PgBoss from 'pg-boss';
import { audit } from '../commands/audit';
import { renderDocumentEmail, type DocumentValues } from '../documents';
import { withTransaction } from '../db';
import { logger } from '../logger';
import { env } from '../env';
import { Document, DocumentSend, Invoice, Organization } from '../models';
import { payLinkUrl } from '../services/payLinks';
import { cardPaymentsEnabled } from '../services/stripe';
import { templateNameFor, templateSource } from '../services/documents';
import { deliverOnce, renderMail } from '../services/mailer';
import { WORKERS_PER_QUEUE } from './sendMail';
import { readFile } from '../services/storage';

async function markSend(send: DocumentSend, changes: Partial<Pick<DocumentSend, 'status' | 'error' | 'sentAt' | 'attempts'>>, action: string | null, document: Document) {
  await withTransaction(async (t) => {
    await send.update(changes, { transaction: t });
    if (action) {
      await audit(
        { organizationId: send.organizationId, actorUserId: null, action, subjectType: 'booking', subjectId: document.bookingId, data: { documentId: document.id, kind: document.kind, number: document.number, version: document.version, to: send.to, error: changes.error ?? null } },
        null,
        t,
      );
    }
  });
}

/**
 * The link an e-mail carries: an invoice with something to pay gets its pay link; receipts and
 * credit notes point to the customer's own pages for that booking.
 */
async function linkFor(document: Document): Promise<string> {
  if (document.kind === 'invoice') {
    const invoice = await Invoice.findOne({ where: { documentId: document.id } });
    const open = invoice && ['open', 'partly_paid'].includes(invoice.status) && invoice.totalCents - invoice.paidCents - invoice.creditedCents > 0;
    return open && cardPaymentsEnabled() ? payLinkUrl(invoice.id, invoice.payLinkGeneration) : '';
  }
  if (document.kind === 'receipt' || document.kind === 'credit_note') return `${env.APP_URL}/portal/sign-in?next=${encodeURIComponent(`/portal/bookings/${document.bookingId}`)}`;
  return '';
}

/** E-mails an issued document with its stored PDF attached; retried by pg-boss, its state kept on the send. */
export async function registerSendDocument(boss: PgBoss) {
  for (let i = 0; i < WORKERS_PER_QUEUE; i++) await boss.work<{ sendId: string }>('send-document', { pollingIntervalSeconds: 0.5, batchSize: 1, includeMetadata: true }, sendOne);
}

async function sendOne([job]: PgBoss.JobWithMetadata<{ sendId: string }>[]) {
  const send = await DocumentSend.findByPk(job.data.sendId);
  if (!send || send.status === 'sent') return;
  const document = (await Document.findByPk(send.documentId))!;
  try {
    const organization = (await Organization.findByPk(send.organizationId))!;
    const file = await readFile(send.organizationId, document.fileId);
    if (!file) throw new Error('the stored PDF is missing');
    const values = document.values as unknown as DocumentValues;
    const mail =
      document.kind === 'signed_agreement'
        ? renderMail('signed-agreement', { customerName: values.customer.name, companyName: organization.name, number: document.number, reference: values.booking.reference, sha256: document.sha256 })
        : renderDocumentEmail((await templateSource(send.organizationId, templateNameFor(document.kind, true))).source, values, { link: await linkFor(document) });
    // Once per send, even when a crash makes pg-boss run this job again (see deliverOnce).
    await deliverOnce(`send-document:${send.id}`, {
      organizationId: send.organizationId,
      to: send.to,
      ...mail,
      fromName: organization.name,
      replyTo: organization.email,
      // The exact stored bytes: the customer gets the document whose hash is on record.
      attachments: [{ filename: `${document.number}.pdf`, content: file.data, contentType: 'application/pdf' }],
    });
    await markSend(send, { status: 'sent', sentAt: new Date(), attempts: send.attempts + 1, error: null }, 'document.sent', document);
    logger.info({ sendId: send.id, to: send.to }, 'document sent');
  } catch (err) {
    const reason = (err as Error).message.slice(0, 500);
    const final = job.retryCount >= job.retryLimit;
    await markSend(send, { attempts: send.attempts + 1, error: reason, ...(final ? { status: 'failed' as const } : {}) }, final ? 'document.send_failed' : null, document);
    logger.warn({ sendId: send.id, err: reason, final }, 'document send failed');
    throw err;
  }
}
