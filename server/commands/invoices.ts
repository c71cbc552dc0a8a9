import type { Request } from 'express';
import { Op, QueryTypes } from 'sequelize';
import { addDays, dateInZone } from '../../shared/dates';
import { allocate, formatMoney, sum } from '../../shared/money';
import { INVOICE_KIND_LABELS, type InvoiceLineRow } from '../../shared/schemas/invoices';
import { sequelize, type Transaction } from '../db';
import { badRequest, conflict, HttpError } from '../errors';
import { ensureChart } from '../ledger/chart';
import { securityDepositHeldCents } from '../ledger/balances';
import {
  eventTiming, invoiceIssued, paymentReceived, postEntry, refundIssued, reverseEntry, securityDepositApplied, securityDepositHeld,
  securityDepositRefunded, type InvoiceBreakdown,
} from '../ledger/post';
import { Booking, BookingLine, Customer, Invoice, Organization, Payment, PaymentAllocation, Refund, SecurityDepositMove, type User } from '../models';
import { quoteBooking } from '../services/pricing';
import { rulesOf } from '../services/rules';
import { audit } from './audit';
import { issueDocument, sendDocument } from './documents';

type Full = Booking & { customer: Customer; lines: BookingLine[] };

async function loadBooking(organizationId: string, bookingId: string, transaction: Transaction) {
  await Booking.findOne({ where: { id: bookingId, organizationId }, transaction, lock: transaction.LOCK.UPDATE });
  return (await Booking.findOne({
    where: { id: bookingId, organizationId },
    include: [{ model: Customer, as: 'customer' }, { model: BookingLine, as: 'lines' }],
    transaction,
  })) as Full | null;
}

/** The booking's quote split by where the money belongs: rentals, delivery and labor, damage waiver, tax. */
export function bookingBreakdown(booking: Full, organization: Organization) {
  const q = quoteBooking(booking, booking.lines, booking.customer, organization);
  const rental = sum(q.lines.filter((l) => l.kind === 'rental').map((l) => l.netCents));
  const fees = sum(q.lines.filter((l) => l.kind === 'fee').map((l) => l.netCents));
  const breakdown: InvoiceBreakdown = {
    rentalCents: rental,
    deliveryLaborCents: fees + q.deliveryCents + q.setupLaborCents,
    damageWaiverCents: q.damageWaiverCents,
    taxCents: q.taxCents,
  };
  return { quote: q, breakdown };
}

const PARTS: (keyof InvoiceBreakdown)[] = ['rentalCents', 'deliveryLaborCents', 'damageWaiverCents', 'taxCents'];

function linesFor(b: InvoiceBreakdown, label: string, reference: string): InvoiceLineRow[] {
  const lines: InvoiceLineRow[] = [
    { description: `${label}: rentals, booking ${reference}`, category: 'rental', amountCents: b.rentalCents },
    { description: `${label}: delivery, set-up and fees, booking ${reference}`, category: 'delivery_labor', amountCents: b.deliveryLaborCents },
    { description: `${label}: damage waiver, booking ${reference}`, category: 'damage_waiver', amountCents: b.damageWaiverCents },
    { description: 'Sales tax', category: 'tax', amountCents: b.taxCents },
  ];
  return lines.filter((l) => l.amountCents > 0);
}

/**
 * A draft invoice from the booking's quote: the deposit (the share the quote asks at signing), or
 * the balance (everything not yet invoiced). Lines are copied, not linked: later edits to the
 * booking do not change an invoice.
 */
export async function createInvoice(actor: User, bookingId: string, kind: 'deposit' | 'balance', req: Request, t: Transaction) {
  const booking = await loadBooking(actor.organizationId, bookingId, t);
  if (!booking) throw new HttpError(404, 'not_found', 'That booking was not found.');
  if (booking.status === 'cancelled') throw conflict('A cancelled booking is not invoiced.', 'cancelled');
  const organization = (await Organization.findByPk(actor.organizationId, { transaction: t }))!;
  const { quote, breakdown } = bookingBreakdown(booking, organization);
  const earlier = await Invoice.findAll({ where: { bookingId, kind: { [Op.in]: ['deposit', 'balance'] }, status: { [Op.ne]: 'void' } }, transaction: t });
  const invoiced: InvoiceBreakdown = {
    rentalCents: sum(earlier.map((i) => i.rentalCents)),
    deliveryLaborCents: sum(earlier.map((i) => i.deliveryLaborCents)),
    damageWaiverCents: sum(earlier.map((i) => i.damageWaiverCents)),
    taxCents: sum(earlier.map((i) => i.taxCents)),
  };
  const remaining = Object.fromEntries(PARTS.map((k) => [k, Math.max(0, breakdown[k] - invoiced[k])])) as unknown as InvoiceBreakdown;
  const remainingTotal = sum(PARTS.map((k) => remaining[k]));
  let amounts: InvoiceBreakdown;
  if (kind === 'deposit') {
    const depositLeft = Math.min(quote.depositCents - sum(earlier.map((i) => i.totalCents)), remainingTotal);
    if (depositLeft <= 0) throw conflict('The deposit is already invoiced.', 'nothing_to_invoice');
    // The deposit is a share of every part of the total, split so no cent is lost.
    const parts = allocate(depositLeft, PARTS.map((k) => remaining[k]));
    amounts = Object.fromEntries(PARTS.map((k, i) => [k, parts[i]])) as unknown as InvoiceBreakdown;
  } else {
    if (remainingTotal <= 0) throw conflict('Everything on this booking is already invoiced.', 'nothing_to_invoice');
    amounts = remaining;
  }
  const total = sum(PARTS.map((k) => amounts[k]));
  const invoice = await Invoice.create(
    {
      organizationId: actor.organizationId, bookingId, customerId: booking.customerId, kind,
      lines: linesFor(amounts, INVOICE_KIND_LABELS[kind], booking.reference),
      ...amounts, totalCents: total, createdById: actor.id,
    },
    { transaction: t },
  );
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'invoice.created', subjectType: 'booking', subjectId: bookingId, data: { invoiceId: invoice.id, kind, totalCents: total } }, req, t);
  return invoice;
}

/** The next number of a series: one locked counter row per company and year, so there are no gaps and no repeats. */
async function nextNumber(organizationId: string, year: number, series: string, t: Transaction) {
  await sequelize.query(
    `INSERT INTO invoice_counters (organization_id, year, series, next_number) VALUES (:org, :year, :series, 1) ON CONFLICT DO NOTHING`,
    { replacements: { org: organizationId, year, series }, transaction: t },
  );
  const [row] = await sequelize.query<{ next_number: number }>(
    `UPDATE invoice_counters SET next_number = next_number + 1 WHERE organization_id = :org AND year = :year AND series = :series RETURNING next_number - 1 AS next_number`,
    { replacements: { org: organizationId, year, series }, type: QueryTypes.SELECT, transaction: t },
  );
  return Number(row.next_number);
}

/** Issues a draft: its number, due date, ledger entry and PDF, all in one transaction. */
export async function issueInvoice(actor: User, invoiceId: string, req: Request, t: Transaction) {
  const invoice = (await Invoice.findOne({ where: { id: invoiceId, organizationId: actor.organizationId }, transaction: t, lock: t.LOCK.UPDATE }))!;
  if (invoice.status !== 'draft') throw conflict('Only a draft is issued.', 'not_draft');
  const organization = (await Organization.findByPk(actor.organizationId, { transaction: t }))!;
  const booking = (await loadBooking(actor.organizationId, invoice.bookingId, t))!;
  const rules = rulesOf(organization);
  const now = new Date();
  const today = dateInZone(now, organization.timeZone);
  const year = Number(today.slice(0, 4));
  const number = `${rules.invoicePrefix}-${year}-${String(await nextNumber(organization.id, year, rules.invoicePrefix, t)).padStart(4, '0')}`;
  const eventDay = dateInZone(booking.eventStart, organization.timeZone);
  const balanceDue = addDays(eventDay, -rules.balanceDueDays);
  invoice.number = number;
  invoice.issueDate = today;
  invoice.dueDate = invoice.kind === 'deposit' || balanceDue < today ? today : balanceDue;
  invoice.status = 'open';

  await ensureChart(organization.id, t);
  const entry = await postEntry(
    {
      organizationId: organization.id, bookingId: booking.id, customerId: booking.customerId, memo: `${INVOICE_KIND_LABELS[invoice.kind]} ${number}`,
      occurredAt: now, source: { type: 'invoice', id: invoice.id }, createdById: actor.id,
      ...invoiceIssued(
        { rentalCents: invoice.rentalCents, deliveryLaborCents: invoice.deliveryLaborCents, damageWaiverCents: invoice.damageWaiverCents, taxCents: invoice.taxCents },
        eventTiming(booking.eventStart, now, organization.timeZone),
      ),
    },
    t,
  );
  invoice.ledgerEntryId = entry.id;
  const due = new Intl.DateTimeFormat('en-US', { timeZone: 'UTC', dateStyle: 'long' }).format(new Date(`${invoice.dueDate}T12:00:00Z`));
  const doc = await issueDocument(actor, booking.id, 'invoice', req, t, {
    invoice: { number, schedule: [{ label: `${INVOICE_KIND_LABELS[invoice.kind]} ${number}`, dueDate: due, amount: formatMoney(invoice.totalCents, organization.currency) }] },
  });
  invoice.documentId = doc.id;
  await invoice.save({ transaction: t });
  await audit({ organizationId: organization.id, actorUserId: actor.id, action: 'invoice.issued', subjectType: 'booking', subjectId: booking.id, data: { invoiceId: invoice.id, number, totalCents: invoice.totalCents } }, req, t);
  return invoice;
}

/** Voids an issued invoice that nothing was paid on: its ledger entry is reversed, never deleted. */
export async function voidInvoice(actor: User, invoiceId: string, reason: string, req: Request, t: Transaction) {
  const invoice = (await Invoice.findOne({ where: { id: invoiceId, organizationId: actor.organizationId }, transaction: t, lock: t.LOCK.UPDATE }))!;
  if (invoice.status === 'void') throw conflict('This invoice is already void.', 'already_void');
  if (invoice.paidCents > 0) throw conflict('Money was received on this invoice: correct it with a credit note instead.', 'has_payments');
  if (invoice.ledgerEntryId) await reverseEntry(invoice.ledgerEntryId, `Invoice ${invoice.number} void: ${reason}`, actor.id, t);
  invoice.status = 'void';
  invoice.voidReason = reason;
  await invoice.save({ transaction: t });
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'invoice.voided', subjectType: 'booking', subjectId: invoice.bookingId, data: { invoiceId: invoice.id, number: invoice.number, reason } }, req, t);
  return invoice;
}

export function statusFor(invoice: Pick<Invoice, 'paidCents' | 'totalCents'>) {
  return invoice.paidCents >= invoice.totalCents ? 'paid' : invoice.paidCents > 0 ? 'partly_paid' : 'open';
}

/**
 * Records a cash, check or transfer payment on one or more invoices of one booking: one ledger
 * entry, the invoices' paid amounts, and a receipt e-mailed to the customer. A part larger than
 * an invoice's balance is refused (409), whatever else the payment covers.
 */
export async function recordPayment(
  actor: User,
  input: { method: 'cash' | 'check' | 'transfer'; reference: string; receivedAt: Date; allocations: { invoiceId: string; amountCents: number }[]; fieldFor: (i: number) => string },
  req: Request,
  t: Transaction,
) {
  const ids = [...new Set(input.allocations.map((a) => a.invoiceId))].sort();
  if (ids.length !== input.allocations.length) throw badRequest('Each invoice appears once in a split.', { allocations: 'Each invoice appears once.' });
  // Locked in id order: two payments on the same invoices take turns, so together they cannot overpay.
  const invoices = await Invoice.findAll({ where: { id: { [Op.in]: ids }, organizationId: actor.organizationId }, order: [['id', 'ASC']], transaction: t, lock: t.LOCK.UPDATE });
  const byId = new Map(invoices.map((i) => [i.id, i]));
  const fields: Record<string, string> = {};
  input.allocations.forEach((a, i) => {
    const inv = byId.get(a.invoiceId);
    if (!inv) fields[input.fieldFor(i).replace('amountCents', 'invoiceId')] = 'Unknown invoice.';
    else if (!['open', 'partly_paid'].includes(inv.status)) fields[input.fieldFor(i)] = `Invoice ${inv.number ?? '(draft)'} is ${inv.status.replace('_', ' ')}: it takes no payment.`;
  });
  if (Object.keys(fields).length) throw badRequest('Some invoices cannot take this payment.', fields);
  const bookingIds = new Set(invoices.map((i) => i.bookingId));
  if (bookingIds.size !== 1) throw badRequest('A payment covers invoices of one booking.', { allocations: 'Pick invoices of one booking.' });
  const { currency } = (await Organization.findByPk(actor.organizationId, { transaction: t }))!;
  const over: Record<string, string> = {};
  input.allocations.forEach((a, i) => {
    const inv = byId.get(a.invoiceId)!;
    const open = inv.totalCents - inv.paidCents;
    if (a.amountCents > open) over[input.fieldFor(i)] = `More than the ${formatMoney(open, currency)} left on ${inv.number}.`;
  });
  if (Object.keys(over).length) throw conflict('The payment is more than what is owed on the invoice.', 'overpayment', over);

  const bookingId = invoices[0].bookingId;
  const booking = (await Booking.findByPk(bookingId, { transaction: t, lock: t.LOCK.UPDATE }))!;
  const total = sum(input.allocations.map((a) => a.amountCents));
  await ensureChart(actor.organizationId, t);
  const payment = await Payment.create(
    { organizationId: actor.organizationId, bookingId, customerId: booking.customerId, method: input.method, amountCents: total, reference: input.reference, receivedAt: input.receivedAt, recordedById: actor.id },
    { transaction: t },
  );
  const entry = await postEntry(
    {
      organizationId: actor.organizationId, bookingId, customerId: booking.customerId, memo: `Payment by ${input.method}${input.reference ? ` (${input.reference})` : ''}`,
      occurredAt: input.receivedAt, source: { type: 'payment', id: payment.id }, createdById: actor.id, ...paymentReceived(total, input.method),
    },
    t,
  );
  for (const a of input.allocations) {
    const inv = byId.get(a.invoiceId)!;
    await PaymentAllocation.create({ organizationId: actor.organizationId, paymentId: payment.id, invoiceId: inv.id, amountCents: a.amountCents }, { transaction: t });
    inv.paidCents += a.amountCents;
    inv.status = statusFor(inv);
    await inv.save({ transaction: t });
  }
  const receipt = await issueDocument(actor, bookingId, 'receipt', req, t, {
    payment: { amountCents: total, method: input.method, receivedAt: input.receivedAt, reference: input.reference || invoices.map((i) => i.number).join(', ') },
  });
  payment.ledgerEntryId = entry.id;
  payment.receiptDocumentId = receipt.id;
  await payment.save({ transaction: t });
  const customer = (await Customer.findByPk(booking.customerId, { transaction: t }))!;
  if (customer.email) await sendDocument(actor, receipt, customer.email, req, t);
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'payment.recorded', subjectType: 'booking', subjectId: bookingId, data: { paymentId: payment.id, amountCents: total, method: input.method } }, req, t);
  return payment;
}

/**
 * Gives money back on a payment (owner): never more than the payment less its earlier refunds.
 * The invoices it paid owe again, latest first; one reversing-style ledger entry (refundIssued).
 */
export async function refundPayment(actor: User, paymentId: string, input: { amountCents: number; reason: string }, req: Request, t: Transaction) {
  const payment = (await Payment.findOne({ where: { id: paymentId, organizationId: actor.organizationId }, transaction: t, lock: t.LOCK.UPDATE }))!;
  await Booking.findByPk(payment.bookingId, { transaction: t, lock: t.LOCK.UPDATE });
  const already = Number((await Refund.sum('amountCents', { where: { paymentId: payment.id }, transaction: t })) ?? 0);
  const refundable = payment.amountCents - already;
  const { currency } = (await Organization.findByPk(actor.organizationId, { transaction: t }))!;
  if (input.amountCents > refundable) {
    throw conflict(`At most ${formatMoney(refundable, currency)} of this payment can be refunded.`, 'refund_too_large', { amountCents: `At most ${formatMoney(refundable, currency)}.` });
  }
  const entry = await postEntry(
    {
      organizationId: actor.organizationId, bookingId: payment.bookingId, customerId: payment.customerId, memo: `Refund: ${input.reason}`.slice(0, 400),
      occurredAt: new Date(), source: { type: 'payment', id: payment.id }, createdById: actor.id, ...refundIssued(input.amountCents, payment.method),
    },
    t,
  );
  const refund = await Refund.create(
    { organizationId: actor.organizationId, paymentId: payment.id, bookingId: payment.bookingId, amountCents: input.amountCents, reason: input.reason, ledgerEntryId: entry.id, createdById: actor.id },
    { transaction: t },
  );
  // The invoices this payment paid are owed again, the most recently paid first.
  let left = input.amountCents;
  const allocations = await PaymentAllocation.findAll({ where: { paymentId: payment.id }, order: [['id', 'DESC']], transaction: t });
  for (const a of allocations) {
    if (left === 0) break;
    const inv = (await Invoice.findByPk(a.invoiceId, { transaction: t, lock: t.LOCK.UPDATE }))!;
    const back = Math.min(left, inv.paidCents, a.amountCents);
    if (back <= 0) continue;
    inv.paidCents -= back;
    inv.status = inv.status === 'void' ? 'void' : statusFor(inv);
    await inv.save({ transaction: t });
    left -= back;
  }
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'payment.refunded', subjectType: 'booking', subjectId: payment.bookingId, data: { paymentId: payment.id, amountCents: input.amountCents, reason: input.reason } }, req, t);
  return refund;
}

/** Takes, returns or keeps (for damage) a booking's refundable security deposit; never returns or keeps more than is held. */
export async function moveSecurityDeposit(
  actor: User,
  bookingId: string,
  input: { action: 'collect' | 'refund' | 'keep'; amountCents: number; method?: 'cash' | 'check' | 'transfer' | 'card'; reason: string },
  req: Request,
  t: Transaction,
) {
  const booking = (await Booking.findOne({ where: { id: bookingId, organizationId: actor.organizationId }, transaction: t, lock: t.LOCK.UPDATE }))!;
  await ensureChart(actor.organizationId, t);
  const { currency } = (await Organization.findByPk(actor.organizationId, { transaction: t }))!;
  if (input.action !== 'collect') {
    const held = await securityDepositHeldCents(bookingId, { transaction: t });
    if (input.amountCents > held) {
      throw conflict(`Only ${formatMoney(held, currency)} of security deposit is held on this booking.`, 'more_than_held', { amountCents: `At most ${formatMoney(held, currency)}.` });
    }
  }
  const draft =
    input.action === 'collect'
      ? securityDepositHeld(input.amountCents, input.method!)
      : input.action === 'refund'
        ? securityDepositRefunded(input.amountCents, input.method!)
        : securityDepositApplied(input.amountCents, 'damage');
  const memo = { collect: 'Security deposit received', refund: 'Security deposit returned', keep: `Security deposit kept: ${input.reason}` }[input.action];
  const entry = await postEntry(
    { organizationId: actor.organizationId, bookingId, customerId: booking.customerId, memo: memo.slice(0, 400), occurredAt: new Date(), source: { type: 'booking', id: bookingId }, createdById: actor.id, ...draft },
    t,
  );
  const move = await SecurityDepositMove.create(
    {
      organizationId: actor.organizationId, bookingId, kind: ({ collect: 'held', refund: 'refunded', keep: 'kept' } as const)[input.action],
      amountCents: input.amountCents, method: input.method ?? null, reason: input.reason, ledgerEntryId: entry.id, createdById: actor.id,
    },
    { transaction: t },
  );
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: `security_deposit.${move.kind}`, subjectType: 'booking', subjectId: bookingId, data: { amountCents: input.amountCents, reason: input.reason } }, req, t);
  return move;
}
