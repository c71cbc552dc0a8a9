import { Router } from 'express';
import { Op, QueryTypes, type WhereOptions } from 'sequelize';
import { z } from 'zod';
import { dateInZone } from '../../../shared/dates';
import { IdParams } from '../../../shared/schemas/common';
import {
  AccountInput, ApplyCreditRequest, CreateInvoiceRequest, CreditNoteRequest, CreditRefundRequest, type CreditRefundResponse, type CustomerCredit, InvoiceListQuery, type AccountRow, type CustomerStatement, RecordPaymentRequest, RefundRequest, SecurityDepositRequest, VoidInvoiceRequest, type BookingLedger, type LedgerEntryRow,
} from '../../../shared/schemas/invoices';
import {
  applyCredit, createAdditionalInvoice, createCreditNote, createInvoice, issueInvoice, moveSecurityDeposit, recordPayment, refundCredit, refundPayment, voidInvoice,
} from '../../commands/invoices';
import { badRequest, forbidden } from '../../errors';
import { sequelize, withTransaction } from '../../db';
import { bookingBalance, customerCreditCents, customerStatement, paidCents, securityDepositHeldCents, trialBalance } from '../../ledger/balances';
import { ensureChart } from '../../ledger/chart';
import { audit } from '../../commands/audit';
import { revokePayLinks } from '../../commands/payLinks';
import { conflict } from '../../errors';
import { auth, authenticate } from '../../middlewares/authenticate';
import { parsed, validate } from '../../middlewares/validate';
import { Account, Booking, Customer, Invoice, Payment, PaymentAllocation, Refund, User, type Organization } from '../../models';
import { authorize, sameOrganization } from '../../policies';
import { presentInvoice, presentPayment } from '../../presenters/invoice';

export const invoicesRouter = Router();

async function presentMany(invoices: Invoice[], actor: User, organization: Organization) {
  const bookings = new Map((await Booking.findAll({ where: { id: { [Op.in]: [...new Set(invoices.map((i) => i.bookingId))] } }, attributes: ['id', 'reference'] })).map((b) => [b.id, b]));
  const customers = new Map((await Customer.findAll({ where: { id: { [Op.in]: [...new Set(invoices.map((i) => i.customerId))] } }, attributes: ['id', 'name', 'email'] })).map((c) => [c.id, c]));
  const creditedIds = [...new Set(invoices.map((i) => i.creditsInvoiceId).filter((id): id is string => !!id))];
  const credited = new Map(
    creditedIds.length ? (await Invoice.findAll({ where: { id: { [Op.in]: creditedIds } }, attributes: ['id', 'number'] })).map((i) => [i.id, i.number ?? null]) : [],
  );
  const today = dateInZone(new Date(), organization.timeZone);
  return invoices.map((i) =>
    presentInvoice(i, actor, {
      booking: bookings.get(i.bookingId)!, customer: customers.get(i.customerId)!, currency: organization.currency, today,
      creditsInvoiceNumber: i.creditsInvoiceId ? credited.get(i.creditsInvoiceId) : null,
    }),
  );
}

invoicesRouter.get('/invoices', authenticate, validate(InvoiceListQuery, 'query'), async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'invoice', 'read');
  const q = parsed<InvoiceListQuery>(res, 'query');
  const where: WhereOptions = { organizationId: user.organizationId };
  const today = dateInZone(new Date(), organization.timeZone);
  if (q.status?.length) {
    const plain = q.status.filter((s) => s !== 'overdue');
    const anyOf: WhereOptions[] = [];
    if (plain.length) anyOf.push({ status: { [Op.in]: plain } });
    if (q.status.includes('overdue')) anyOf.push({ status: { [Op.in]: ['open', 'partly_paid'] }, dueDate: { [Op.lt]: today } });
    Object.assign(where, { [Op.or]: anyOf });
  }
  if (q.bookingId) Object.assign(where, { bookingId: q.bookingId });
  if (q.q) {
    const like = `%${q.q}%`;
    const bookingIds = (await Booking.findAll({ where: { organizationId: user.organizationId, reference: { [Op.iLike]: like } }, attributes: ['id'] })).map((b) => b.id);
    const customerIds = (await Customer.findAll({ where: { organizationId: user.organizationId, name: { [Op.iLike]: like } }, attributes: ['id'] })).map((c) => c.id);
    Object.assign(where, { [Op.and]: [{ [Op.or]: [{ number: { [Op.iLike]: like } }, { bookingId: { [Op.in]: bookingIds } }, { customerId: { [Op.in]: customerIds } }] }] });
  }
  const { rows, count } = await Invoice.findAndCountAll({ where, order: [['createdAt', 'DESC'], ['id', 'ASC']], limit: q.pageSize, offset: (q.page - 1) * q.pageSize });
  res.json({ data: await presentMany(rows, user, organization), total: count });
});

invoicesRouter.get('/invoices/:id', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user, organization } = auth(req);
  const invoice = sameOrganization(user, await Invoice.findByPk(parsed<{ id: string }>(res, 'params').id), 'That invoice');
  authorize(user, 'invoice', 'read', invoice);
  res.json((await presentMany([invoice], user, organization))[0]);
});

invoicesRouter.post('/bookings/:id/invoices', authenticate, validate(IdParams, 'params'), validate(CreateInvoiceRequest), async (req, res) => {
  const { user, organization } = auth(req);
  const booking = sameOrganization(user, await Booking.findByPk(parsed<{ id: string }>(res, 'params').id), 'That booking');
  authorize(user, 'invoice', 'create');
  const input = parsed<z.output<typeof CreateInvoiceRequest>>(res);
  const invoice = await withTransaction((t) =>
    input.kind === 'additional' ? createAdditionalInvoice(user, booking.id, { lines: input.lines ?? [] }, req, t) : createInvoice(user, booking.id, input.kind, req, t),
  );
  res.status(201).json((await presentMany([invoice], user, organization))[0]);
});

invoicesRouter.post('/invoices/:id/issue', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user, organization } = auth(req);
  const found = sameOrganization(user, await Invoice.findByPk(parsed<{ id: string }>(res, 'params').id), 'That invoice');
  authorize(user, 'invoice', 'issue', found);
  const invoice = await withTransaction((t) => issueInvoice(user, found.id, req, t));
  res.json((await presentMany([invoice], user, organization))[0]);
});

invoicesRouter.post('/invoices/:id/void', authenticate, validate(IdParams, 'params'), validate(VoidInvoiceRequest), async (req, res) => {
  const { user, organization } = auth(req);
  const found = sameOrganization(user, await Invoice.findByPk(parsed<{ id: string }>(res, 'params').id), 'That invoice');
  // Only the owner voids; an invoice with money on it gets the command's 409 (use a credit note), not a 403.
  if (user.role !== 'owner') authorize(user, 'invoice', 'void', found);
  const invoice = await withTransaction((t) => voidInvoice(user, found.id, parsed<{ reason: string }>(res).reason, req, t));
  res.json((await presentMany([invoice], user, organization))[0]);
});

/** Every pay link of the invoice made so far stops working (410 for the customer); the answer carries a fresh one. */
invoicesRouter.post('/invoices/:id/pay-links/revoke', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user, organization } = auth(req);
  const found = sameOrganization(user, await Invoice.findByPk(parsed<{ id: string }>(res, 'params').id), 'That invoice');
  authorize(user, 'invoice', 'revokePayLink', found);
  const invoice = await withTransaction((t) => revokePayLinks(user, found.id, req, t));
  res.json((await presentMany([invoice], user, organization))[0]);
});

invoicesRouter.post('/invoices/:id/credit-notes', authenticate, validate(IdParams, 'params'), validate(CreditNoteRequest), async (req, res) => {
  const { user, organization } = auth(req);
  const found = sameOrganization(user, await Invoice.findByPk(parsed<{ id: string }>(res, 'params').id), 'That invoice');
  authorize(user, 'invoice', 'create');
  const note = await withTransaction((t) => createCreditNote(user, found.id, parsed<{ amountCents: number; reason: string }>(res), req, t));
  res.status(201).json((await presentMany([note], user, organization))[0]);
});

invoicesRouter.post('/invoices/:id/apply-credit', authenticate, validate(IdParams, 'params'), validate(ApplyCreditRequest), async (req, res) => {
  const { user, organization } = auth(req);
  const found = sameOrganization(user, await Invoice.findByPk(parsed<{ id: string }>(res, 'params').id), 'That invoice');
  authorize(user, 'invoice', 'create');
  const invoice = await withTransaction((t) => applyCredit(user, found.id, parsed<{ amountCents: number }>(res).amountCents, req, t));
  res.json((await presentMany([invoice], user, organization))[0]);
});

invoicesRouter.get('/customers/:id/credit', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user, organization } = auth(req);
  const customer = sameOrganization(user, await Customer.findByPk(parsed<{ id: string }>(res, 'params').id), 'That customer');
  authorize(user, 'invoice', 'read');
  const rows = await sequelize.query<{ id: string; occurred_at: Date; kind: string; memo: string; reference: string | null; in_cents: number; out_cents: number }>(
    `SELECT e.id, e.occurred_at, e.kind, e.memo, b.reference, sum(l.credit_cents)::bigint AS in_cents, sum(l.debit_cents)::bigint AS out_cents
       FROM journal_entries e JOIN journal_lines l ON l.entry_id = e.id JOIN accounts a ON a.id = l.account_id LEFT JOIN bookings b ON b.id = e.booking_id
      WHERE e.customer_id = :id AND e.organization_id = :org AND a.system_key = 'customer_credit'
      GROUP BY e.id, b.reference ORDER BY e.occurred_at DESC, e.created_at DESC, e.id`,
    { replacements: { id: customer.id, org: user.organizationId }, type: QueryTypes.SELECT },
  );
  const body: CustomerCredit = {
    creditCents: await customerCreditCents(customer.id),
    currency: organization.currency,
    moves: rows.map((r) => ({
      entryId: r.id, occurredAt: new Date(r.occurred_at).toISOString(), kind: r.kind, memo: r.memo, bookingReference: r.reference, inCents: Number(r.in_cents), outCents: Number(r.out_cents),
    })),
  };
  res.json(body);
});

invoicesRouter.post('/customers/:id/credit/refunds', authenticate, validate(IdParams, 'params'), validate(CreditRefundRequest), async (req, res) => {
  const { user } = auth(req);
  const customer = sameOrganization(user, await Customer.findByPk(parsed<{ id: string }>(res, 'params').id), 'That customer');
  if (user.role !== 'owner') throw forbidden('Only the owner gives money back.');
  const result: CreditRefundResponse = await withTransaction((t) => refundCredit(user, customer.id, parsed<z.output<typeof CreditRefundRequest>>(res), req, t));
  res.status(201).json(result);
});

invoicesRouter.post('/payments', authenticate, validate(RecordPaymentRequest), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'invoice', 'create');
  const input = parsed<z.output<typeof RecordPaymentRequest>>(res);
  const split = !!input.allocations?.length;
  const allocations = split ? input.allocations! : [{ invoiceId: input.invoiceId!, amountCents: input.amountCents! }];
  const payment = await withTransaction((t) =>
    recordPayment(
      user,
      {
        method: input.method, reference: input.reference, receivedAt: input.receivedAt ? new Date(input.receivedAt) : new Date(), allocations,
        fieldFor: (i) => (split ? `allocations.${i}.amountCents` : 'amountCents'), keepExcessAsCredit: !split && input.keepExcessAsCredit,
      },
      req,
      t,
    ),
  );
  res.status(201).json(await paymentRow(payment));
});

async function paymentRow(payment: Payment) {
  const allocations = await PaymentAllocation.findAll({ where: { paymentId: payment.id } });
  const numbers = new Map((await Invoice.findAll({ where: { id: { [Op.in]: allocations.map((a) => a.invoiceId) } }, attributes: ['id', 'number'] })).map((i) => [i.id, i.number ?? null]));
  const by = payment.recordedById ? await User.findByPk(payment.recordedById, { attributes: ['name'] }) : null;
  const refunded = Number((await Refund.sum('amountCents', { where: { paymentId: payment.id, status: 'succeeded' } })) ?? 0);
  const pending = Number((await Refund.sum('amountCents', { where: { paymentId: payment.id, status: 'pending' } })) ?? 0);
  return presentPayment(payment, allocations.map((a) => Object.assign(a, { number: numbers.get(a.invoiceId) ?? null })), by?.name ?? null, refunded, pending);
}

invoicesRouter.get('/bookings/:id/payments', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  const booking = sameOrganization(user, await Booking.findByPk(parsed<{ id: string }>(res, 'params').id), 'That booking');
  authorize(user, 'invoice', 'read');
  const payments = await Payment.findAll({ where: { bookingId: booking.id }, order: [['receivedAt', 'DESC']] });
  res.json({ data: await Promise.all(payments.map(paymentRow)), total: payments.length });
});

invoicesRouter.get('/bookings/:id/ledger', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  const booking = sameOrganization(user, await Booking.findByPk(parsed<{ id: string }>(res, 'params').id), 'That booking');
  authorize(user, 'invoice', 'read');
  const rows = await sequelize.query<{ id: string; occurred_at: Date; kind: string; memo: string; code: string; name: string; debit_cents: number; credit_cents: number }>(
    `SELECT e.id, e.occurred_at, e.kind, e.memo, a.code, a.name, l.debit_cents::bigint AS debit_cents, l.credit_cents::bigint AS credit_cents
       FROM journal_entries e JOIN journal_lines l ON l.entry_id = e.id JOIN accounts a ON a.id = l.account_id
      WHERE e.booking_id = :id AND e.organization_id = :org
      ORDER BY e.occurred_at, e.created_at, e.id, l.debit_cents DESC, a.code`,
    { replacements: { id: booking.id, org: user.organizationId }, type: QueryTypes.SELECT },
  );
  const entries: LedgerEntryRow[] = [];
  for (const r of rows) {
    let e = entries[entries.length - 1];
    if (!e || e.id !== r.id) entries.push((e = { id: r.id, occurredAt: new Date(r.occurred_at).toISOString(), kind: r.kind, memo: r.memo, lines: [] }));
    e.lines.push({ accountCode: r.code, accountName: r.name, debitCents: Number(r.debit_cents), creditCents: Number(r.credit_cents) });
  }
  const issued = { bookingId: booking.id, status: { [Op.notIn]: ['void', 'draft'] } };
  const invoiced = await Invoice.sum('totalCents', { where: { ...issued, kind: { [Op.ne]: 'credit_note' } } });
  // What credit notes took off balances; the rest of a credit note became account credit.
  const credited = await Invoice.sum('creditedCents', { where: { ...issued, kind: { [Op.ne]: 'credit_note' } } });
  const body: BookingLedger = {
    entries,
    balanceCents: await bookingBalance(booking.id),
    invoicedCents: Number(invoiced ?? 0),
    creditedCents: Number(credited ?? 0),
    customerCreditCents: await customerCreditCents(booking.customerId),
    paidCents: await paidCents(booking.id),
    securityDepositHeldCents: await securityDepositHeldCents(booking.id),
  };
  res.json(body);
});

invoicesRouter.post('/payments/:id/refunds', authenticate, validate(IdParams, 'params'), validate(RefundRequest), async (req, res) => {
  const { user } = auth(req);
  const payment = sameOrganization(user, await Payment.findByPk(parsed<{ id: string }>(res, 'params').id), 'That payment');
  // Refunds are the owner's call.
  if (user.role !== 'owner') throw forbidden('Only the owner gives refunds.');
  const refund = await withTransaction((t) => refundPayment(user, payment.id, parsed<{ amountCents: number; reason: string }>(res), req, t));
  res.status(201).json({ id: refund.id, paymentId: refund.paymentId, amountCents: refund.amountCents, reason: refund.reason, status: refund.status ?? 'succeeded', createdAt: refund.createdAt.toISOString() });
});

invoicesRouter.post('/bookings/:id/security-deposit', authenticate, validate(IdParams, 'params'), validate(SecurityDepositRequest), async (req, res) => {
  const { user } = auth(req);
  const booking = sameOrganization(user, await Booking.findByPk(parsed<{ id: string }>(res, 'params').id), 'That booking');
  const input = parsed<z.output<typeof SecurityDepositRequest>>(res);
  authorize(user, 'invoice', 'create');
  // Giving money back is the owner's call, as with refunds.
  if (input.action === 'refund' && user.role !== 'owner') throw forbidden('Only the owner returns money.');
  if (input.action === 'apply') {
    const invoice = sameOrganization(user, await Invoice.findByPk(input.invoiceId!), 'That invoice');
    if (invoice.bookingId !== booking.id) throw badRequest('Choose an invoice of this booking.', { invoiceId: 'Choose an invoice of this booking.' });
  }
  const move = await withTransaction((t) => moveSecurityDeposit(user, booking.id, input, req, t));
  res.status(201).json({ id: move.id, kind: move.kind, amountCents: move.amountCents, heldCents: await securityDepositHeldCents(booking.id) });
});

invoicesRouter.get('/ledger/accounts', authenticate, async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'invoice', 'read');
  await withTransaction((t) => ensureChart(user.organizationId, t));
  const rows = await Account.findAll({ where: { organizationId: user.organizationId }, order: [['code', 'ASC']] });
  const data: AccountRow[] = rows.map((a) => ({ id: a.id, code: a.code, name: a.name, type: a.type, systemKey: a.systemKey }));
  res.json({ data, total: data.length, can: { update: user.role === 'owner' } });
});

invoicesRouter.put('/ledger/accounts/:id', authenticate, validate(IdParams, 'params'), validate(AccountInput), async (req, res) => {
  const { user } = auth(req);
  const account = sameOrganization(user, await Account.findByPk(parsed<{ id: string }>(res, 'params').id), 'That account');
  if (user.role !== 'owner') throw forbidden('Only the owner changes the chart of accounts.');
  const input = parsed<{ code: string; name: string }>(res);
  try {
    await withTransaction(async (t) => {
      const before = { code: account.code, name: account.name };
      await account.update(input, { transaction: t });
      await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'account.updated', subjectType: 'account', subjectId: account.id, data: { before, after: input } }, req, t);
    });
  } catch (err) {
    if ((err as { name?: string }).name === 'SequelizeUniqueConstraintError') throw conflict('Another account has that code.', 'code_taken', { code: 'Another account has that code.' });
    throw err;
  }
  res.json({ id: account.id, code: account.code, name: account.name, type: account.type, systemKey: account.systemKey });
});

invoicesRouter.get('/customers/:id/statement', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user, organization } = auth(req);
  const customer = sameOrganization(user, await Customer.findByPk(parsed<{ id: string }>(res, 'params').id), 'That customer');
  authorize(user, 'invoice', 'read');
  const statement = await customerStatement(customer.id);
  const body: CustomerStatement = {
    customer: { id: customer.id, name: customer.name },
    lines: statement.lines.map((l) => ({
      entryId: l.entryId, occurredAt: new Date(l.occurredAt).toISOString(), kind: l.kind, memo: l.memo, bookingId: l.bookingId,
      bookingReference: l.bookingReference, debitCents: l.debitCents, creditCents: l.creditCents, balanceCents: l.balanceCents,
    })),
    balanceCents: statement.balanceCents,
    currency: organization.currency,
  };
  res.json(body);
});

const TrialBalanceQuery = z.object({ at: z.iso.date({ error: 'Give the date as YYYY-MM-DD.' }) });

invoicesRouter.get('/ledger/trial-balance', authenticate, validate(TrialBalanceQuery, 'query'), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'invoice', 'read');
  res.json(await trialBalance(user.organizationId, parsed<{ at: string }>(res, 'query').at));
});
