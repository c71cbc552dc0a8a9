import type { Request } from 'express';
import { Op, QueryTypes } from 'sequelize';
import { addDays, dateInZone } from '../../shared/dates';
import { allocate, formatMoney, percentOf, subtract, sum } from '../../shared/money';
import {
  ADDITIONAL_CHARGE_CATEGORY, ADDITIONAL_CHARGE_LABELS, ADDITIONAL_CHARGE_TAXABLE, INVOICE_KIND_LABELS, latestIssueDate, receivedDateProblem, type AdditionalChargeLine,
  type InvoiceLineRow, type ReceiptMethod,
} from '../../shared/schemas/invoices';
import { sequelize, type Transaction } from '../db';
import { badRequest, conflict, HttpError } from '../errors';
import { ensureChart } from '../ledger/chart';
import { customerCreditCents, securityDepositHeldCents } from '../ledger/balances';
import { assertPeriodOpen } from '../ledger/periods';
import {
  creditNote, creditRefunded, eventTiming, invoiceIssued, paymentReceived, postEntry, refundIssued, reverseEntry, securityDepositApplied, securityDepositHeld,
  securityDepositRefunded, type InvoiceBreakdown,
} from '../ledger/post';
import { Booking, BookingLine, Customer, Invoice, Organization, Payment, PaymentAllocation, Refund, SecurityDepositMove, type User } from '../models';
import { quoteBooking } from '../services/pricing';
import { rulesOf } from '../services/rules';
import { agreementStateOf } from '../services/agreementState';
import { audit } from './audit';
import { issueDocument, sendDocument } from './documents';
import { queueJob } from '../services/jobs';

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
  const breakdown: Parts = {
    rentalCents: rental,
    deliveryLaborCents: fees + q.deliveryCents + q.setupLaborCents,
    damageWaiverCents: q.damageWaiverCents,
    damageCents: 0,
    taxCents: q.taxCents,
  };
  return { quote: q, breakdown };
}

type Parts = Required<InvoiceBreakdown>;
const PARTS: (keyof Parts)[] = ['rentalCents', 'deliveryLaborCents', 'damageWaiverCents', 'damageCents', 'taxCents'];
const partsOf = (i: Pick<Invoice, keyof Parts>): Parts => ({
  rentalCents: i.rentalCents, deliveryLaborCents: i.deliveryLaborCents, damageWaiverCents: i.damageWaiverCents, damageCents: i.damageCents, taxCents: i.taxCents,
});

function linesFor(b: Parts, label: string, what: string): InvoiceLineRow[] {
  const lines: InvoiceLineRow[] = [
    { description: `${label}: rentals, ${what}`, category: 'rental', amountCents: b.rentalCents },
    { description: `${label}: delivery, set-up and fees, ${what}`, category: 'delivery_labor', amountCents: b.deliveryLaborCents },
    { description: `${label}: damage waiver, ${what}`, category: 'damage_waiver', amountCents: b.damageWaiverCents },
    { description: `${label}: damage and missing stock, ${what}`, category: 'damage', amountCents: b.damageCents },
    { description: 'Sales tax', category: 'tax', amountCents: b.taxCents },
  ];
  return lines.filter((l) => l.amountCents > 0);
}

/**
 * A draft invoice from the booking's quote: the deposit (the share the quote asks at signing), or
 * the balance (everything not yet invoiced). Lines are copied, not linked: later edits to the
 * booking do not change an invoice.
 */
export async function createInvoice(actor: User, bookingId: string, kind: 'deposit' | 'balance', req: Request | null, t: Transaction) {
  const booking = await loadBooking(actor.organizationId, bookingId, t);
  if (!booking) throw new HttpError(404, 'not_found', 'That booking was not found.');
  if (booking.status === 'cancelled') throw conflict('A cancelled booking is not invoiced.', 'cancelled');
  const organization = (await Organization.findByPk(actor.organizationId, { transaction: t }))!;
  const { quote, breakdown } = bookingBreakdown(booking, organization);
  const earlier = await Invoice.findAll({ where: { bookingId, kind: { [Op.in]: ['deposit', 'balance'] }, status: { [Op.ne]: 'void' } }, transaction: t });
  const invoiced = Object.fromEntries(PARTS.map((k) => [k, sum(earlier.map((i) => i[k]))])) as unknown as Parts;
  const remaining = Object.fromEntries(PARTS.map((k) => [k, Math.max(0, breakdown[k] - invoiced[k])])) as unknown as Parts;
  const remainingTotal = sum(PARTS.map((k) => remaining[k]));
  let amounts: Parts;
  if (kind === 'deposit') {
    const depositLeft = Math.min(quote.depositCents - sum(earlier.map((i) => i.totalCents)), remainingTotal);
    if (depositLeft <= 0) throw conflict('The deposit is already invoiced.', 'nothing_to_invoice');
    // The deposit is a share of every part of the total, split so no cent is lost.
    const parts = allocate(depositLeft, PARTS.map((k) => remaining[k]));
    amounts = Object.fromEntries(PARTS.map((k, i) => [k, parts[i]])) as unknown as Parts;
  } else {
    if (remainingTotal <= 0) throw conflict('Everything on this booking is already invoiced.', 'nothing_to_invoice');
    amounts = remaining;
  }
  const total = sum(PARTS.map((k) => amounts[k]));
  const invoice = await Invoice.create(
    {
      organizationId: actor.organizationId, bookingId, customerId: booking.customerId, kind,
      lines: linesFor(amounts, INVOICE_KIND_LABELS[kind], `booking ${booking.reference}`),
      ...amounts, totalCents: total, createdById: actor.id,
    },
    { transaction: t },
  );
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'invoice.created', subjectType: 'booking', subjectId: bookingId, data: { invoiceId: invoice.id, kind, totalCents: total } }, req, t);
  return invoice;
}

/**
 * A draft additional-charges invoice, line by line: damage and missing stock (damage recovery),
 * a late return (more rental), cleaning (a service). Tax is worked out once for the invoice on the
 * taxable lines at the booking's rate, none for an exempt customer. The office reviews and issues it.
 */
export async function createAdditionalInvoice(
  actor: User,
  bookingId: string,
  input: { lines: { charge: AdditionalChargeLine['charge']; description: string; amountCents: number; taxable?: boolean }[] },
  req: Request,
  t: Transaction,
) {
  const booking = await loadBooking(actor.organizationId, bookingId, t);
  if (!booking) throw new HttpError(404, 'not_found', 'That booking was not found.');
  if (booking.status === 'cancelled') throw conflict('A cancelled booking is not invoiced.', 'cancelled');
  if (input.lines.length === 0) throw badRequest('Add at least one charge.', { lines: 'Add at least one charge.' });
  const byCategory = (category: InvoiceLineRow['category']) =>
    sum(input.lines.filter((l) => ADDITIONAL_CHARGE_CATEGORY[l.charge] === category).map((l) => l.amountCents));
  const taxableCents = sum(input.lines.filter((l) => l.taxable ?? ADDITIONAL_CHARGE_TAXABLE[l.charge]).map((l) => l.amountCents));
  const taxCents = booking.customer.taxExempt ? 0 : percentOf(taxableCents, booking.taxRateBp);
  const amounts: Parts = {
    rentalCents: byCategory('rental'), deliveryLaborCents: byCategory('delivery_labor'), damageWaiverCents: 0, damageCents: byCategory('damage'), taxCents,
  };
  const lines: InvoiceLineRow[] = [
    ...input.lines.map((l) => ({ description: `${ADDITIONAL_CHARGE_LABELS[l.charge]}: ${l.description}`, category: ADDITIONAL_CHARGE_CATEGORY[l.charge], amountCents: l.amountCents })),
    ...(taxCents > 0 ? [{ description: 'Sales tax', category: 'tax' as const, amountCents: taxCents }] : []),
  ];
  const total = sum(PARTS.map((k) => amounts[k]));
  const invoice = await Invoice.create(
    { organizationId: actor.organizationId, bookingId, customerId: booking.customerId, kind: 'additional', lines, ...amounts, totalCents: total, createdById: actor.id },
    { transaction: t },
  );
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'invoice.created', subjectType: 'booking', subjectId: bookingId, data: { invoiceId: invoice.id, kind: 'additional', totalCents: total } }, req, t);
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

/**
 * Once the customer has signed, a booking whose agreement changed since (a new version replaced
 * the signed one) is billed again only after the new version is signed: the signature must cover
 * what the invoice bills.
 */
async function assertSignatureCoversBooking(bookingId: string, t: Transaction) {
  const a = await agreementStateOf(bookingId, t);
  if (a.state !== 'changed_since_signed') return;
  throw conflict(
    `The booking changed after the customer signed ${a.lastSigned.number}. Send the new version, ${a.current.number}, for signature: the next invoice waits until it is signed.`,
    'changed_since_signed',
  );
}

/** Issues a draft: its number, due date, ledger entry and PDF, all in one transaction. */
export async function issueInvoice(actor: User, invoiceId: string, req: Request | null, t: Transaction, opts: { at?: Date; email?: boolean } = {}) {
  const invoice = (await Invoice.findOne({ where: { id: invoiceId, organizationId: actor.organizationId }, transaction: t, lock: t.LOCK.UPDATE }))!;
  if (invoice.status !== 'draft') throw conflict('Only a draft is issued.', 'not_draft');
  const organization = (await Organization.findByPk(actor.organizationId, { transaction: t }))!;
  const booking = (await loadBooking(actor.organizationId, invoice.bookingId, t))!;
  await assertSignatureCoversBooking(booking.id, t);
  const rules = rulesOf(organization);
  const now = opts.at ?? new Date();
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
      ...invoiceIssued(partsOf(invoice), eventTiming(booking.eventStart, now, organization.timeZone)),
    },
    t,
  );
  invoice.ledgerEntryId = entry.id;
  const due = new Intl.DateTimeFormat('en-US', { timeZone: 'UTC', dateStyle: 'long' }).format(new Date(`${invoice.dueDate}T12:00:00Z`));
  const money = (c: number) => formatMoney(c, organization.currency);
  const doc = await issueDocument(actor, booking.id, 'invoice', req, t, {
    issuedAt: opts.at,
    invoice: {
      number,
      schedule: [{ label: `${INVOICE_KIND_LABELS[invoice.kind]} ${number}`, dueDate: due, amount: money(invoice.totalCents) }],
      ...invoiceTable(invoice, money),
    },
  });
  invoice.documentId = doc.id;
  await invoice.save({ transaction: t });
  // Issued means sent: the customer gets the PDF by e-mail, queued in this transaction.
  if (booking.customer.email && opts.email !== false) await sendDocument(actor, doc, booking.customer.email, req, t);
  await audit({ organizationId: organization.id, actorUserId: actor.id, action: 'invoice.issued', subjectType: 'booking', subjectId: booking.id, data: { invoiceId: invoice.id, number, totalCents: invoice.totalCents } }, req, t);
  return invoice;
}

/** The invoice's own lines and totals for its PDF (not the booking's whole charges table). */
function invoiceTable(invoice: Invoice, money: (c: number) => string) {
  return {
    lines: invoice.lines.filter((l) => l.category !== 'tax').map((l) => ({ description: l.description, amount: money(l.amountCents) })),
    summary: [
      { label: 'Subtotal', amount: money(invoice.totalCents - invoice.taxCents), strong: false },
      ...(invoice.taxCents > 0 ? [{ label: 'Sales tax', amount: money(invoice.taxCents), strong: false }] : []),
      { label: invoice.kind === 'credit_note' ? 'Total credited' : 'Total', amount: money(invoice.totalCents), strong: true },
    ],
    total: money(invoice.totalCents),
  };
}

/** Voids an issued invoice that nothing was paid on: its ledger entry is reversed, never deleted. */
export async function voidInvoice(actor: User, invoiceId: string, reason: string, req: Request, t: Transaction) {
  const invoice = (await Invoice.findOne({ where: { id: invoiceId, organizationId: actor.organizationId }, transaction: t, lock: t.LOCK.UPDATE }))!;
  if (invoice.status === 'void') throw conflict('This invoice is already void.', 'already_void');
  if (invoice.kind === 'credit_note') throw conflict('A credit note is not voided: issue a new invoice for the amount instead.', 'credit_note');
  if (invoice.creditNotesCents > 0) throw conflict('Credit notes were issued against this invoice: credit the rest instead of voiding it.', 'has_credit_notes');
  if (invoice.paidCents > 0) throw conflict('Money was received on this invoice: correct it with a credit note instead.', 'has_payments');
  if (invoice.ledgerEntryId) await reverseEntry(invoice.ledgerEntryId, `Invoice ${invoice.number} void: ${reason}`, actor.id, t);
  invoice.status = 'void';
  invoice.voidReason = reason;
  await invoice.save({ transaction: t });
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'invoice.voided', subjectType: 'booking', subjectId: invoice.bookingId, data: { invoiceId: invoice.id, number: invoice.number, reason } }, req, t);
  return invoice;
}

/** Paid once money and credit notes cover the total; partly paid once anything was paid or credited. */
export function statusFor(invoice: Pick<Invoice, 'paidCents' | 'totalCents' | 'creditedCents'>) {
  const settled = invoice.paidCents + (invoice.creditedCents ?? 0);
  return settled >= invoice.totalCents ? 'paid' : settled > 0 ? 'partly_paid' : 'open';
}

const openOf = (i: Pick<Invoice, 'paidCents' | 'totalCents' | 'creditedCents'>) => i.totalCents - i.paidCents - (i.creditedCents ?? 0);

/**
 * A credit note against an issued invoice (office or owner): numbered in its own series, split
 * over the invoice's parts in their proportions (to the cent), posted as the mirror of the
 * invoice's entry. It lowers the invoice's open balance; what the invoice has no balance left
 * for (it was paid) becomes the customer's account credit, to use or pay back.
 */
export async function createCreditNote(actor: User, invoiceId: string, input: { amountCents: number; reason: string }, req: Request, t: Transaction) {
  const invoice = (await Invoice.findOne({ where: { id: invoiceId, organizationId: actor.organizationId }, transaction: t, lock: t.LOCK.UPDATE }))!;
  if (invoice.kind === 'credit_note') throw conflict('A credit note is not credited again.', 'credit_note');
  if (!['open', 'partly_paid', 'paid'].includes(invoice.status)) throw conflict(`Only an issued invoice is credited; this one is ${invoice.status}.`, 'not_issued');
  const organization = (await Organization.findByPk(actor.organizationId, { transaction: t }))!;
  const money = (c: number) => formatMoney(c, organization.currency);
  const creditable = invoice.totalCents - invoice.creditNotesCents;
  if (input.amountCents > creditable) {
    throw conflict(`At most ${money(creditable)} of ${invoice.number} can still be credited.`, 'credit_too_large', { amountCents: `At most ${money(creditable)}.` });
  }
  const booking = (await loadBooking(actor.organizationId, invoice.bookingId, t))!;
  const shares = allocate(input.amountCents, PARTS.map((k) => invoice[k]));
  const amounts = Object.fromEntries(PARTS.map((k, i) => [k, shares[i]])) as unknown as Parts;
  const offInvoice = Math.min(input.amountCents, openOf(invoice));
  const toCredit = subtract(input.amountCents, offInvoice);
  const now = new Date();
  const today = dateInZone(now, organization.timeZone);
  const year = Number(today.slice(0, 4));
  const series = `${rulesOf(organization).invoicePrefix}-CR`;
  const number = `${series}-${year}-${String(await nextNumber(organization.id, year, series, t)).padStart(4, '0')}`;
  const note = await Invoice.create(
    {
      organizationId: organization.id, bookingId: invoice.bookingId, customerId: invoice.customerId, kind: 'credit_note', number, status: 'paid',
      issueDate: today, dueDate: null, lines: linesFor(amounts, 'Credit', `invoice ${invoice.number}`), ...amounts, totalCents: input.amountCents,
      creditsInvoiceId: invoice.id, reason: input.reason, createdById: actor.id,
    },
    { transaction: t },
  );
  await ensureChart(organization.id, t);
  const entry = await postEntry(
    {
      organizationId: organization.id, bookingId: invoice.bookingId, customerId: invoice.customerId, memo: `Credit note ${number} on ${invoice.number}: ${input.reason}`,
      occurredAt: now, source: { type: 'invoice', id: note.id }, createdById: actor.id,
      ...creditNote(amounts, eventTiming(booking.eventStart, now, organization.timeZone), toCredit),
    },
    t,
  );
  invoice.creditedCents += offInvoice;
  invoice.creditNotesCents += input.amountCents;
  invoice.status = statusFor(invoice);
  await invoice.save({ transaction: t });
  const doc = await issueDocument(actor, booking.id, 'credit_note', req, t, {
    credit: { amountCents: input.amountCents, reason: input.reason },
    invoice: {
      number,
      schedule: [
        { label: `Taken off invoice ${invoice.number}`, dueDate: '', amount: money(offInvoice) },
        ...(toCredit > 0 ? [{ label: 'Kept as your account credit, for a later invoice or paid back to you', dueDate: '', amount: money(toCredit) }] : []),
      ],
      ...invoiceTable(note, money),
    },
  });
  note.ledgerEntryId = entry.id;
  note.documentId = doc.id;
  await note.save({ transaction: t });
  if (booking.customer.email) await sendDocument(actor, doc, booking.customer.email, req, t);
  await audit(
    { organizationId: organization.id, actorUserId: actor.id, action: 'invoice.credited', subjectType: 'booking', subjectId: booking.id, data: { invoiceId: invoice.id, creditNoteId: note.id, number, amountCents: input.amountCents, toCreditCents: toCredit, reason: input.reason } },
    req,
    t,
  );
  return note;
}

const METHOD_WORDS: Record<ReceiptMethod, string> = {
  cash: 'cash', check: 'check', transfer: 'bank transfer', card: 'card', security_deposit: 'security deposit', credit: 'account credit',
};

/**
 * Records a payment on one or more invoices of one booking: one ledger entry, the invoices' paid
 * amounts, and a receipt e-mailed to the customer. Money (cash, check, transfer, card) or what
 * the customer already has with us (the held security deposit, their account credit): callers
 * check those sources first. A part larger than an invoice's balance is refused (409), unless the
 * payment is on one invoice and `keepExcessAsCredit` keeps the rest as the customer's credit.
 * The received day is on or after the invoices' issue date and no later than tomorrow (400
 * naming `receivedAt`), and not in a closed period (409 `period_closed`).
 */
export async function recordPayment(
  actor: User,
  input: {
    method: ReceiptMethod; reference: string; receivedAt: Date; allocations: { invoiceId: string; amountCents: number }[]; fieldFor: (i: number) => string;
    keepExcessAsCredit?: boolean;
    /**
     * The money is already taken (a card payment the processor reports): nothing is refused. What
     * the invoice no longer owes (paid or voided meanwhile) becomes the customer's account credit.
     */
    moneyAlreadyTaken?: boolean;
    /** False: no receipt e-mail (demo data loaded after the fact). */
    email?: boolean;
  },
  req: Request | null,
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
    else if (inv.kind === 'credit_note') fields[input.fieldFor(i)] = `${inv.number} is a credit note: it takes no payment.`;
    else if (!['open', 'partly_paid'].includes(inv.status) && !input.moneyAlreadyTaken) fields[input.fieldFor(i)] = `Invoice ${inv.number ?? '(draft)'} is ${inv.status.replace('_', ' ')}: it takes no payment.`;
  });
  if (Object.keys(fields).length) throw badRequest('Some invoices cannot take this payment.', fields);
  const bookingIds = new Set(invoices.map((i) => i.bookingId));
  if (bookingIds.size !== 1) throw badRequest('A payment covers invoices of one booking.', { allocations: 'Pick invoices of one booking.' });
  const { currency, timeZone } = (await Organization.findByPk(actor.organizationId, { transaction: t }))!;
  // Money the processor already took is recorded when it reports it, whatever the invoice's dates.
  if (!input.moneyAlreadyTaken) {
    const problem = receivedDateProblem(dateInZone(input.receivedAt, timeZone), {
      issueDate: latestIssueDate(invoices.map((i) => i.issueDate)),
      today: dateInZone(new Date(), timeZone),
    });
    if (problem) throw badRequest(problem, { receivedAt: problem });
  }
  await assertPeriodOpen(actor.organizationId, input.receivedAt, t, { field: 'receivedAt' });
  const keepExcess =
    !!input.moneyAlreadyTaken || (!!input.keepExcessAsCredit && input.allocations.length === 1 && input.method !== 'credit' && input.method !== 'security_deposit');
  const over: Record<string, string> = {};
  const applied = input.allocations.map((a, i) => {
    const inv = byId.get(a.invoiceId)!;
    const open = ['open', 'partly_paid'].includes(inv.status) ? Math.max(0, openOf(inv)) : 0;
    if (a.amountCents <= open) return a.amountCents;
    if (keepExcess) return open;
    over[input.fieldFor(i)] = `More than the ${formatMoney(open, currency)} left on ${inv.number}.`;
    return 0;
  });
  if (Object.keys(over).length) throw conflict('The payment is more than what is owed on the invoice.', 'overpayment', over);

  const bookingId = invoices[0].bookingId;
  const booking = (await Booking.findByPk(bookingId, { transaction: t, lock: t.LOCK.UPDATE }))!;
  const total = sum(input.allocations.map((a) => a.amountCents));
  const toCredit = subtract(total, sum(applied));
  await ensureChart(actor.organizationId, t);
  const payment = await Payment.create(
    {
      organizationId: actor.organizationId, bookingId, customerId: booking.customerId, method: input.method, amountCents: total, creditCents: toCredit,
      reference: input.reference, receivedAt: input.receivedAt, recordedById: actor.id,
    },
    { transaction: t },
  );
  const words = METHOD_WORDS[input.method];
  const entry = await postEntry(
    {
      organizationId: actor.organizationId, bookingId, customerId: booking.customerId,
      memo: `Payment from ${words}${input.reference ? ` (${input.reference})` : ''}${toCredit > 0 ? `, ${formatMoney(toCredit, currency)} kept as credit` : ''}`,
      occurredAt: input.receivedAt, source: { type: 'payment', id: payment.id }, createdById: actor.id, ...paymentReceived(total, input.method, toCredit),
    },
    t,
  );
  for (const [i, a] of input.allocations.entries()) {
    const inv = byId.get(a.invoiceId)!;
    if (applied[i] === 0) continue;
    await PaymentAllocation.create({ organizationId: actor.organizationId, paymentId: payment.id, invoiceId: inv.id, amountCents: applied[i] }, { transaction: t });
    inv.paidCents += applied[i];
    inv.status = statusFor(inv);
    await inv.save({ transaction: t });
  }
  const receipt = await issueDocument(actor, bookingId, 'receipt', req, t, {
    issuedAt: input.email === false ? input.receivedAt : undefined,
    payment: { amountCents: total, method: words, receivedAt: input.receivedAt, reference: input.reference || invoices.map((i) => i.number).join(', ') },
  });
  payment.ledgerEntryId = entry.id;
  payment.receiptDocumentId = receipt.id;
  await payment.save({ transaction: t });
  const customer = (await Customer.findByPk(booking.customerId, { transaction: t }))!;
  if (customer.email && input.email !== false) await sendDocument(actor, receipt, customer.email, req, t);
  await audit(
    { organizationId: actor.organizationId, actorUserId: actor.id, action: 'payment.recorded', subjectType: 'booking', subjectId: bookingId, data: { paymentId: payment.id, amountCents: total, method: input.method, creditCents: toCredit } },
    req,
    t,
  );
  return payment;
}

/** Pays an invoice from the customer's account credit; never more than the credit or the invoice's balance. */
export async function applyCredit(actor: User, invoiceId: string, amountCents: number, req: Request, t: Transaction) {
  const invoice = (await Invoice.findOne({ where: { id: invoiceId, organizationId: actor.organizationId }, transaction: t }))!;
  // The customer row is the lock that keeps two uses of the same credit from both passing.
  await Customer.findByPk(invoice.customerId, { transaction: t, lock: t.LOCK.UPDATE });
  const available = await customerCreditCents(invoice.customerId, { transaction: t });
  const { currency } = (await Organization.findByPk(actor.organizationId, { transaction: t }))!;
  if (amountCents > available) {
    throw conflict(`The customer has ${formatMoney(available, currency)} of credit.`, 'more_than_credit', { amountCents: `At most ${formatMoney(available, currency)}.` });
  }
  await recordPayment(actor, { method: 'credit', reference: '', receivedAt: new Date(), allocations: [{ invoiceId, amountCents }], fieldFor: () => 'amountCents' }, req, t);
  return (await Invoice.findByPk(invoiceId, { transaction: t }))!;
}

/** Pays the customer's account credit back to them (owner); never more than the credit. */
export async function refundCredit(
  actor: User,
  customerId: string,
  input: { amountCents: number; method: 'cash' | 'check' | 'transfer' | 'card'; reason: string },
  req: Request,
  t: Transaction,
) {
  await Customer.findOne({ where: { id: customerId, organizationId: actor.organizationId }, transaction: t, lock: t.LOCK.UPDATE });
  const available = await customerCreditCents(customerId, { transaction: t });
  const { currency } = (await Organization.findByPk(actor.organizationId, { transaction: t }))!;
  if (input.amountCents > available) {
    throw conflict(`The customer has ${formatMoney(available, currency)} of credit.`, 'more_than_credit', { amountCents: `At most ${formatMoney(available, currency)}.` });
  }
  await ensureChart(actor.organizationId, t);
  const entry = await postEntry(
    {
      organizationId: actor.organizationId, customerId, memo: `Credit paid back by ${METHOD_WORDS[input.method]}: ${input.reason}`.slice(0, 400),
      occurredAt: new Date(), source: { type: 'customer', id: customerId }, createdById: actor.id, ...creditRefunded(input.amountCents, input.method),
    },
    t,
  );
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'credit.refunded', subjectType: 'customer', subjectId: customerId, data: { amountCents: input.amountCents, method: input.method, reason: input.reason } }, req, t);
  return { entryId: entry.id, creditCents: available - input.amountCents };
}

/**
 * Gives money back on a payment (owner): never more than the payment less its earlier refunds.
 * The invoices it paid owe again, latest first; one reversing-style ledger entry (refundIssued).
 */
export async function refundPayment(actor: User, paymentId: string, input: { amountCents: number; reason: string }, req: Request, t: Transaction) {
  const payment = (await Payment.findOne({ where: { id: paymentId, organizationId: actor.organizationId }, transaction: t, lock: t.LOCK.UPDATE }))!;
  await Booking.findByPk(payment.bookingId, { transaction: t, lock: t.LOCK.UPDATE });
  // Pending card refunds count: they are on their way.
  const already = Number((await Refund.sum('amountCents', { where: { paymentId: payment.id, status: { [Op.ne]: 'failed' } }, transaction: t })) ?? 0);
  // The part kept as account credit goes back through the credit (refundCredit), not the payment.
  const refundable = payment.amountCents - payment.creditCents - already;
  const { currency } = (await Organization.findByPk(actor.organizationId, { transaction: t }))!;
  if (input.amountCents > refundable) {
    throw conflict(`At most ${formatMoney(refundable, currency)} of this payment can be refunded.`, 'refund_too_large', { amountCents: `At most ${formatMoney(refundable, currency)}.` });
  }
  const byCard = payment.method === 'card' && !!payment.stripePaymentIntentId;
  if (byCard) {
    // The processor returns the money; its confirmation (webhook) posts the entry and reopens the invoices.
    const refund = await Refund.create(
      { organizationId: actor.organizationId, paymentId: payment.id, bookingId: payment.bookingId, amountCents: input.amountCents, reason: input.reason, status: 'pending', createdById: actor.id },
      { transaction: t },
    );
    await queueJob('card-refund', { refundId: refund.id }, t);
    await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'payment.refund_requested', subjectType: 'booking', subjectId: payment.bookingId, data: { paymentId: payment.id, refundId: refund.id, amountCents: input.amountCents, reason: input.reason } }, req, t);
    return refund;
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
  await reopenInvoices(payment, input.amountCents, t);
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'payment.refunded', subjectType: 'booking', subjectId: payment.bookingId, data: { paymentId: payment.id, amountCents: input.amountCents, reason: input.reason } }, req, t);
  return refund;
}

/** The invoices a payment paid owe again by the refunded amount, the most recently paid first. */
export async function reopenInvoices(payment: Payment, amountCents: number, t: Transaction) {
  let left = amountCents;
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
}

/**
 * Takes, returns or keeps (for damage) a booking's refundable security deposit, or applies it as
 * payment of one of the booking's invoices (an additional-charges invoice for damage); never
 * returns, keeps or applies more than is held.
 */
export async function moveSecurityDeposit(
  actor: User,
  bookingId: string,
  input: { action: 'collect' | 'refund' | 'keep' | 'apply'; amountCents: number; method?: 'cash' | 'check' | 'transfer' | 'card'; reason: string; invoiceId?: string },
  req: Request | null,
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
  if (input.action === 'apply') {
    const invoice = await Invoice.findOne({ where: { id: input.invoiceId!, organizationId: actor.organizationId, bookingId }, transaction: t });
    if (!invoice) throw badRequest('Choose an invoice of this booking.', { invoiceId: 'Choose an invoice of this booking.' });
    const payment = await recordPayment(
      actor,
      { method: 'security_deposit', reference: input.reason, receivedAt: new Date(), allocations: [{ invoiceId: invoice.id, amountCents: input.amountCents }], fieldFor: () => 'amountCents' },
      req,
      t,
    );
    return SecurityDepositMove.create(
      {
        organizationId: actor.organizationId, bookingId, kind: 'applied', amountCents: input.amountCents, method: null,
        reason: input.reason || `Applied to ${invoice.number}`, ledgerEntryId: payment.ledgerEntryId, createdById: actor.id,
      },
      { transaction: t },
    );
  }
  const draft =
    input.action === 'collect'
      ? securityDepositHeld(input.amountCents, input.method!)
      : input.action === 'refund'
        ? securityDepositRefunded(input.amountCents, input.method!)
        : securityDepositApplied(input.amountCents, 'damage');
  const memo = { collect: 'Security deposit received', refund: 'Security deposit returned', keep: `Security deposit kept: ${input.reason}` }[input.action as 'collect' | 'refund' | 'keep'];
  const entry = await postEntry(
    { organizationId: actor.organizationId, bookingId, customerId: booking.customerId, memo: memo.slice(0, 400), occurredAt: new Date(), source: { type: 'booking', id: bookingId }, createdById: actor.id, ...draft },
    t,
  );
  const move = await SecurityDepositMove.create(
    {
      organizationId: actor.organizationId, bookingId, kind: ({ collect: 'held', refund: 'refunded', keep: 'kept' } as const)[input.action as 'collect' | 'refund' | 'keep'],
      amountCents: input.amountCents, method: input.method ?? null, reason: input.reason, ledgerEntryId: entry.id, createdById: actor.id,
    },
    { transaction: t },
  );
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: `security_deposit.${move.kind}`, subjectType: 'booking', subjectId: bookingId, data: { amountCents: input.amountCents, reason: input.reason } }, req, t);
  return move;
}
