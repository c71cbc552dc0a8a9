/**
 * From the pickup check-in to the customer's bill: missing units proposed at their replacement
 * value, damaged ones at replacement value until the office enters the repair amount; the office
 * reviews the amounts and makes one draft additional-charges invoice (damage recovery), which the
 * security-deposit settlement can then pay. The crew never reaches any of this.
 */
import type { Request } from 'express';
import { Op } from 'sequelize';
import type { z } from 'zod';
import type { ChargesInput, ProposedChargeLine, ProposedCharges } from '../../shared/schemas/field';
import type { Transaction } from '../db';
import { badRequest, conflict } from '../errors';
import { securityDepositHeldCents } from '../ledger/balances';
import { BookingLine, Invoice, Item, ReturnCheck, ReturnCheckLine, type Booking, type User } from '../models';
import { authorize, can } from '../policies';
import { lineKey } from '../presenters/field';
import { audit } from './audit';
import { lockBooking } from './field';
import { createAdditionalInvoice } from './invoices';

const plural = (n: number, word: string) => `${n} ${word}`;

async function chargeLines(organizationId: string, check: ReturnCheck | null, transaction?: Transaction): Promise<ProposedChargeLine[]> {
  if (!check) return [];
  const [saved, bookingLines] = await Promise.all([
    ReturnCheckLine.findAll({ where: { returnCheckId: check.id }, transaction }),
    BookingLine.findAll({ where: { bookingId: check.bookingId }, attributes: ['itemId', 'description', 'position'], transaction }),
  ]);
  // In the booking's own order.
  const position = new Map<string, number>();
  for (const l of bookingLines) if (!position.has(lineKey(l))) position.set(lineKey(l), l.position);
  const lines = saved.sort((a, b) => (position.get(a.lineKey) ?? 0) - (position.get(b.lineKey) ?? 0));
  const itemIds = lines.map((l) => l.itemId).filter((x): x is string => !!x);
  const items = itemIds.length ? await Item.findAll({ where: { id: { [Op.in]: itemIds }, organizationId }, attributes: ['id', 'replacementValueCents'], transaction }) : [];
  const value = new Map(items.map((i) => [i.id, i.replacementValueCents]));
  return lines
    .filter((l) => l.damaged > 0 || l.returned < l.sent)
    .map((l) => {
      const missing = l.sent - l.returned;
      const each = l.itemId ? (value.get(l.itemId) ?? 0) : 0;
      const proposed: ProposedChargeLine['proposed'] = [];
      if (missing > 0) proposed.push({ charge: 'missing', quantity: missing, description: `${l.description}: ${plural(missing, 'missing')}`, amountCents: missing * each });
      if (l.damaged > 0) {
        proposed.push({ charge: 'damage', quantity: l.damaged, description: `${l.description}: ${plural(l.damaged, 'damaged')}${l.notes ? ` (${l.notes})` : ''}`.slice(0, 200), amountCents: l.damaged * each });
      }
      return { key: l.lineKey, itemId: l.itemId, description: l.description, missing, damaged: l.damaged, notes: l.notes, replacementValueCents: each, proposed };
    });
}

export async function proposedCharges(actor: User, booking: Booking, transaction?: Transaction): Promise<ProposedCharges> {
  authorize(actor, 'field', 'reviewCharges', booking);
  const check = await ReturnCheck.findOne({ where: { bookingId: booking.id, organizationId: actor.organizationId }, transaction });
  const invoice = check?.chargesInvoiceId ? await Invoice.findOne({ where: { id: check.chargesInvoiceId, organizationId: actor.organizationId }, transaction }) : null;
  const live = invoice && invoice.status !== 'void' ? invoice : null;
  const lines = check?.submittedAt ? await chargeLines(actor.organizationId, check, transaction) : [];
  return {
    bookingId: booking.id,
    reference: booking.reference,
    currency: booking.currency,
    submittedAt: check?.submittedAt ? check.submittedAt.toISOString() : null,
    lines,
    invoice: live ? { id: live.id, number: live.number ?? null, status: live.status, totalCents: live.totalCents } : null,
    securityDepositHeldCents: await securityDepositHeldCents(booking.id, { transaction }),
    can: { createInvoice: can(actor, 'invoice', 'create') && !!check?.submittedAt && !live && lines.length > 0 },
  };
}

/** Makes the draft additional-charges invoice from the amounts the office settled on. */
export async function invoiceCharges(actor: User, bookingId: string, input: z.output<typeof ChargesInput>, req: Request, t: Transaction) {
  const booking = await lockBooking(actor, bookingId, t);
  authorize(actor, 'field', 'reviewCharges', booking);
  authorize(actor, 'invoice', 'create');
  const check = await ReturnCheck.findOne({ where: { bookingId: booking.id }, transaction: t, lock: t.LOCK.UPDATE });
  if (!check?.submittedAt) throw conflict('The pickup check-in is not finished yet: the crew finishes it on site.', 'not_checked_in');
  if (check.chargesInvoiceId) {
    const existing = await Invoice.findOne({ where: { id: check.chargesInvoiceId }, transaction: t });
    if (existing && existing.status !== 'void') throw conflict('The damage charges are already on an invoice; void it to make another.', 'already_invoiced');
  }
  const found = new Map((await chargeLines(actor.organizationId, check, t)).map((l) => [l.key, l]));
  const fields: Record<string, string> = {};
  input.lines.forEach((l, i) => {
    const line = found.get(l.key);
    if (!line) fields[`lines.${i}.key`] = 'Nothing of this line came back damaged or went missing.';
    else if (l.charge === 'missing' && line.missing === 0) fields[`lines.${i}.charge`] = 'Nothing of this line is missing.';
    else if (l.charge === 'damage' && line.damaged === 0) fields[`lines.${i}.charge`] = 'Nothing of this line came back damaged.';
  });
  if (Object.keys(fields).length) throw badRequest('Some charges do not match the check-in.', fields);
  const invoice = await createAdditionalInvoice(actor, booking.id, { lines: input.lines.map(({ charge, description, amountCents }) => ({ charge, description, amountCents })) }, req, t);
  check.chargesInvoiceId = invoice.id;
  await check.save({ transaction: t });
  await audit(
    { organizationId: actor.organizationId, actorUserId: actor.id, action: 'field.charges_invoiced', subjectType: 'booking', subjectId: booking.id, data: { invoiceId: invoice.id, lines: input.lines.length, totalCents: invoice.totalCents } },
    req,
    t,
  );
  return invoice;
}
