import type { Request } from 'express';
import type { Transaction } from '../db';
import { notFound } from '../errors';
import { Invoice, type User } from '../models';
import { audit } from './audit';

/**
 * Withdraws every pay link of an invoice made so far (e-mailed, copied from the invoice page): the
 * invoice's pay-link generation goes up, and the links carry the old one (services/payLinks.ts).
 * A link made afterwards, by e-mailing the invoice again or from the invoice page, works.
 */
export async function revokePayLinks(actor: User, invoiceId: string, req: Request, t: Transaction) {
  // Locked: two withdrawals at once each raise the generation, and neither is lost.
  const invoice = await Invoice.findOne({ where: { id: invoiceId, organizationId: actor.organizationId }, transaction: t, lock: t.LOCK.UPDATE });
  if (!invoice) throw notFound('That invoice');
  invoice.payLinkGeneration += 1;
  await invoice.save({ transaction: t });
  await audit(
    {
      organizationId: actor.organizationId, actorUserId: actor.id, action: 'invoice.pay_links_revoked', subjectType: 'booking', subjectId: invoice.bookingId,
      data: { invoiceId: invoice.id, number: invoice.number, generation: invoice.payLinkGeneration },
    },
    req,
    t,
  );
  return invoice;
}
