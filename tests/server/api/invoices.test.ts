import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { Booking, Invoice, JournalEntry, type User } from '../../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient, uniqueEmail, waitForMail } from '../../support';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);

async function setup() {
  const c = await buildCompany();
  const email = uniqueEmail('payer');
  const customer = await buildCustomer(c.organization.id, { name: 'Marlow Hollin', email });
  const tent = await buildItem(c.organization.id, { name: '20x30 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 30, quantityOwned: 50, rentalPriceCents: 45_000 });
  const office = await as(c.office);
  const newBooking = async (date = '2027-08-21') =>
    (await office.post('/api/bookings', bookingBody(customer.id, date, [{ itemId: tent.id, quantity: 1, unitPriceCents: 45_000, description: '20x30 pole tent' }], { taxRateBp: 725, damageWaiver: false }))).body;
  return { ...c, customer, tent, office, email, newBooking };
}

describe('invoices from the quote', () => {
  it('401 -> 403 -> 404 -> 201; the deposit and the balance add up to the booking total; then nothing is left', async () => {
    const s = await setup();
    const booking = await s.newBooking();
    // 450.00 at 7.25% = 32.63 (450 x 0.0725 = 32.625, half up): total 482.63. Deposit 30% = 144.79 (482.63 x 0.3 = 144.789), above the $100 minimum.
    expect(booking.totals.totalCents).toBe(48_263);
    expect(booking.totals.depositCents).toBe(14_479);
    expect((await (await new ApiClient(app).init()).post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).status).toBe(401);
    expect((await (await as(s.bookkeeper)).post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).status).toBe(403);
    const other = await buildCompany();
    expect((await (await as(other.owner)).post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).status).toBe(404);
    expect((await s.office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'rent' })).status).toBe(400);
    const deposit = await s.office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' });
    expect(deposit.status).toBe(201);
    expect(deposit.body).toMatchObject({ kind: 'deposit', status: 'draft', number: null, totalCents: 14_479 });
    // The deposit's share of the tax: 144.79 x 32.63 / 482.63 = 9.789 -> 9.79 (largest remainder keeps the sum whole).
    expect(deposit.body.taxCents).toBe(979);
    const balance = await s.office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'balance' });
    expect(balance.body.totalCents).toBe(48_263 - 14_479);
    expect(deposit.body.taxCents + balance.body.taxCents).toBe(3_263);
    expect((await s.office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'balance' })).body.error.code).toBe('nothing_to_invoice');
  });

  it('issuing gives numbers, the ledger entry and the PDF; twenty issued at once get twenty consecutive numbers', async () => {
    const s = await setup();
    const drafts: string[] = [];
    for (let i = 0; i < 10; i++) {
      const b = await s.newBooking(`2027-08-${String(i + 10).padStart(2, '0')}`);
      drafts.push((await s.office.post(`/api/bookings/${b.id}/invoices`, { kind: 'deposit' })).body.id);
      drafts.push((await s.office.post(`/api/bookings/${b.id}/invoices`, { kind: 'balance' })).body.id);
    }
    const issued = await Promise.all(drafts.map((id) => s.office.post(`/api/invoices/${id}/issue`)));
    expect(issued.map((r) => r.status)).toEqual(Array(20).fill(200));
    const year = issued[0].body.issueDate.slice(0, 4);
    const numbers = issued.map((r) => r.body.number as string).sort();
    expect(numbers).toEqual(Array.from({ length: 20 }, (_, i) => `INV-${year}-${String(i + 1).padStart(4, '0')}`));
    expect(issued.every((r) => r.body.status === 'open' && r.body.documentId)).toBe(true);
    expect((await s.office.post(`/api/invoices/${drafts[0]}/issue`)).status).toBe(403);
    const tb = await s.office.get(`/api/ledger/trial-balance?at=${issued[0].body.issueDate}`);
    expect(tb.body.totalDebitCents).toBe(tb.body.totalCreditCents);
    expect(tb.body.totalDebitCents).toBeGreaterThan(0);
  });
});

describe('payments', () => {
  it('records cash on an invoice, refuses an overpayment, e-mails a receipt, and the ledger explains the balance', async () => {
    const s = await setup();
    const booking = await s.newBooking();
    const deposit = (await s.office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).body;
    await s.office.post(`/api/invoices/${deposit.id}/issue`);
    expect((await s.office.post('/api/payments', { method: 'barter', invoiceId: deposit.id })).status).toBe(400);
    const over = await s.office.post('/api/payments', { method: 'cash', invoiceId: deposit.id, amountCents: 14_480 });
    expect(over.status).toBe(409);
    expect(over.body.error.code).toBe('overpayment');
    expect(over.body.error.fields.amountCents).toMatch(/\$144\.79/);
    const part = await s.office.post('/api/payments', { method: 'check', reference: 'Check 2201', invoiceId: deposit.id, amountCents: 10_000 });
    expect(part.status).toBe(201);
    expect((await s.office.get(`/api/invoices/${deposit.id}`)).body).toMatchObject({ status: 'partly_paid', paidCents: 10_000, balanceCents: 4_479 });
    const receipt = await waitForMail(s.email, { subject: /receipt/i });
    expect(receipt.attachments).toHaveLength(1);
    expect(receipt.attachments[0].sha256).toHaveLength(64);
    const rest = await s.office.post('/api/payments', { method: 'cash', allocations: [{ invoiceId: deposit.id, amountCents: 4_479 }] });
    expect(rest.status).toBe(201);
    expect((await s.office.get(`/api/invoices/${deposit.id}`)).body.status).toBe('paid');
    const ledger = await s.office.get(`/api/bookings/${booking.id}/ledger`);
    expect(ledger.body).toMatchObject({ invoicedCents: 14_479, paidCents: 14_479, balanceCents: 0 });
    for (const e of ledger.body.entries) {
      const d = e.lines.reduce((a: number, l: { debitCents: number }) => a + l.debitCents, 0);
      const c = e.lines.reduce((a: number, l: { creditCents: number }) => a + l.creditCents, 0);
      expect(d).toBe(c);
    }
    expect((await (await as(s.crew)).get(`/api/bookings/${booking.id}/ledger`)).status).toBe(403);
  });

  it('two payments that together exceed the balance cannot both succeed', async () => {
    const s = await setup();
    const booking = await s.newBooking();
    const inv = (await s.office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).body;
    await s.office.post(`/api/invoices/${inv.id}/issue`);
    const [a, b] = await Promise.all([
      s.office.post('/api/payments', { method: 'cash', invoiceId: inv.id, amountCents: 10_000 }),
      s.office.post('/api/payments', { method: 'transfer', invoiceId: inv.id, amountCents: 10_000 }),
    ]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    expect((await Invoice.findByPk(inv.id))!.paidCents).toBe(10_000);
  });

  it('voiding: refused once money came in, otherwise the entry is reversed and the balance returns to zero', async () => {
    const s = await setup();
    const booking = await s.newBooking();
    const inv = (await s.office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'balance' })).body;
    await s.office.post(`/api/invoices/${inv.id}/issue`);
    const owner = await as(s.owner);
    expect((await s.office.post(`/api/invoices/${inv.id}/void`, { reason: 'Wrong customer' })).status).toBe(403);
    expect((await owner.post(`/api/invoices/${inv.id}/void`, { reason: '' })).status).toBe(400);
    const voided = await owner.post(`/api/invoices/${inv.id}/void`, { reason: 'Booked under the wrong customer' });
    expect(voided.body).toMatchObject({ status: 'void', balanceCents: 0 });
    expect(await JournalEntry.count({ where: { bookingId: booking.id, kind: 'reversal' } })).toBe(1);
    expect((await owner.get(`/api/bookings/${booking.id}/ledger`)).body.balanceCents).toBe(0);
    const paidOne = (await s.office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).body;
    await s.office.post(`/api/invoices/${paidOne.id}/issue`);
    await s.office.post('/api/payments', { method: 'cash', invoiceId: paidOne.id, amountCents: 500 });
    expect((await owner.post(`/api/invoices/${paidOne.id}/void`, { reason: 'Changed mind' })).body.error.code).toBe('has_payments');
    expect((await Booking.findByPk(booking.id))!.status).toBe('draft');
  });
});

describe('refunds and security deposits', () => {
  it('only the owner refunds, never more than was paid; the invoice owes again and the ledger balance follows', async () => {
    const s = await setup();
    const booking = await s.newBooking();
    const inv = (await s.office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).body;
    await s.office.post(`/api/invoices/${inv.id}/issue`);
    const pay = (await s.office.post('/api/payments', { method: 'check', invoiceId: inv.id, amountCents: 14_479 })).body;
    expect((await s.office.post(`/api/payments/${pay.id}/refunds`, { amountCents: 1_000, reason: 'Goodwill' })).status).toBe(403);
    const owner = await as(s.owner);
    const tooMuch = await owner.post(`/api/payments/${pay.id}/refunds`, { amountCents: 14_480, reason: 'Too much' });
    expect(tooMuch.status).toBe(409);
    expect(tooMuch.body.error.fields.amountCents).toMatch(/\$144\.79/);
    expect((await owner.post(`/api/payments/${pay.id}/refunds`, { amountCents: 4_479, reason: 'Smaller tent after all' })).status).toBe(201);
    expect((await owner.get(`/api/invoices/${inv.id}`)).body).toMatchObject({ status: 'partly_paid', paidCents: 10_000, balanceCents: 4_479 });
    // invoiced - paid + refunded = 144.79 - 144.79 + 44.79 (the balance definition of issue 6).
    expect((await owner.get(`/api/bookings/${booking.id}/ledger`)).body).toMatchObject({ balanceCents: 4_479, paidCents: 10_000 });
    expect((await owner.post(`/api/payments/${pay.id}/refunds`, { amountCents: 10_001, reason: 'Again' })).status).toBe(409);
    const payments = (await owner.get(`/api/bookings/${booking.id}/payments`)).body.data;
    expect(payments[0]).toMatchObject({ amountCents: 14_479, refundedCents: 4_479 });
  });

  it('a security deposit is held as a liability, then returned in part and kept in part for damage, never more than held', async () => {
    const s = await setup();
    const booking = await s.newBooking();
    const owner = await as(s.owner);
    expect((await s.office.post(`/api/bookings/${booking.id}/security-deposit`, { action: 'collect', amountCents: 20_000 })).status).toBe(400);
    const held = await s.office.post(`/api/bookings/${booking.id}/security-deposit`, { action: 'collect', amountCents: 20_000, method: 'cash' });
    expect(held.body.heldCents).toBe(20_000);
    expect((await s.office.post(`/api/bookings/${booking.id}/security-deposit`, { action: 'refund', amountCents: 5_000, method: 'cash' })).status).toBe(403);
    expect((await owner.post(`/api/bookings/${booking.id}/security-deposit`, { action: 'keep', amountCents: 5_000 })).status).toBe(400);
    expect((await owner.post(`/api/bookings/${booking.id}/security-deposit`, { action: 'keep', amountCents: 4_500, reason: 'Torn sidewall panel' })).body.heldCents).toBe(15_500);
    expect((await owner.post(`/api/bookings/${booking.id}/security-deposit`, { action: 'refund', amountCents: 15_501, method: 'cash' })).body.error.code).toBe('more_than_held');
    expect((await owner.post(`/api/bookings/${booking.id}/security-deposit`, { action: 'refund', amountCents: 15_500, method: 'cash' })).body.heldCents).toBe(0);
    const today = new Date().toISOString().slice(0, 10);
    const tb = (await owner.get(`/api/ledger/trial-balance?at=${today}`)).body;
    expect(tb.totalDebitCents).toBe(tb.totalCreditCents);
    const recovery = tb.accounts.find((a: { name: string }) => /damage recovery/i.test(a.name));
    expect(recovery.creditCents).toBe(4_500);
    // Never revenue while held, and none left once settled.
    const deposits = tb.accounts.find((a: { name: string }) => /security deposits/i.test(a.name));
    expect(deposits.creditCents).toBe(0);
  });
});

describe('the chart of accounts and the customer statement', () => {
  it('the owner renames an account; every role but the crew reads; the statement runs a balance entry by entry', async () => {
    const s = await setup();
    const owner = await as(s.owner);
    const accounts = await owner.get('/api/ledger/accounts');
    expect(accounts.body.data.map((a: { code: string }) => a.code)).toEqual(expect.arrayContaining(['1200', '2100', '4000']));
    const ar = accounts.body.data.find((a: { systemKey: string }) => a.systemKey === 'accounts_receivable');
    const put = (c: ApiClient, body: object) => c.agent.put(`/api/ledger/accounts/${ar.id}`).set('X-CSRF-Token', c.csrf).set('X-Forwarded-For', c.ip).send(body);
    expect((await put(s.office, { code: '1210', name: 'Customers owe us' })).status).toBe(403);
    expect((await put(owner, { code: '', name: 'x' })).status).toBe(400);
    expect((await put(owner, { code: '2100', name: 'Clash' })).status).toBe(409);
    expect((await put(owner, { code: '1210', name: 'Customers owe us' })).body).toMatchObject({ code: '1210', systemKey: 'accounts_receivable' });
    expect((await (await as(s.crew)).get('/api/ledger/accounts')).status).toBe(403);

    const booking = await s.newBooking();
    const inv = (await s.office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).body;
    await s.office.post(`/api/invoices/${inv.id}/issue`);
    await s.office.post('/api/payments', { method: 'cash', invoiceId: inv.id, amountCents: 5_000 });
    const statement = await (await as(s.bookkeeper)).get(`/api/customers/${s.customer.id}/statement`);
    expect(statement.status).toBe(200);
    expect(statement.body.lines.map((l: { balanceCents: number }) => l.balanceCents)).toEqual([14_479, 9_479]);
    expect(statement.body.balanceCents).toBe(9_479);
  });
});
