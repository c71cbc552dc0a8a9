import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { Document, Invoice, JournalEntry, JournalLine, Account, type User } from '../../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient, uniqueEmail, waitForMail } from '../../support';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);

async function setup(opts: { taxExempt?: boolean } = {}) {
  const c = await buildCompany();
  const email = uniqueEmail('renter');
  const customer = await buildCustomer(c.organization.id, { name: 'Ilse Varga', email, taxExempt: opts.taxExempt ?? false });
  const tent = await buildItem(c.organization.id, { name: '20x30 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 30, quantityOwned: 50, rentalPriceCents: 45_000 });
  const office = await as(c.office);
  const owner = await as(c.owner);
  const newBooking = async (date = '2027-09-18') =>
    (await office.post('/api/bookings', bookingBody(customer.id, date, [{ itemId: tent.id, quantity: 1, unitPriceCents: 45_000, description: '20x30 pole tent' }], { taxRateBp: 725, damageWaiver: false }))).body;
  const issued = async (bookingId: string, body: Record<string, unknown>) => {
    const draft = await office.post(`/api/bookings/${bookingId}/invoices`, body);
    expect(draft.status).toBe(201);
    const done = await office.post(`/api/invoices/${draft.body.id}/issue`);
    expect(done.status).toBe(200);
    return done.body;
  };
  return { ...c, customer, tent, office, owner, email, newBooking, issued };
}

/** Sum of an account's credits minus debits over one booking's entries, by the account's role. */
async function accountOnBooking(bookingId: string, systemKey: string) {
  const entries = await JournalEntry.findAll({ where: { bookingId }, attributes: ['id'] });
  const lines = await JournalLine.findAll({ where: { entryId: entries.map((e) => e.id) }, include: [{ model: Account, as: 'account', where: { systemKey } }] });
  return lines.reduce((a, l) => a + l.creditCents - l.debitCents, 0);
}

describe('additional charges', () => {
  it('bills damage and cleaning line by line, taxes only the taxable lines once, posts damage to damage recovery and prints only its own lines', async () => {
    const s = await setup();
    const booking = await s.newBooking();
    const bad = await s.office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'additional', lines: [] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.lines).toMatch(/at least one/i);
    const noAmount = await s.office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'additional', lines: [{ charge: 'damage', description: 'Torn sidewall', amountCents: 0 }] });
    expect(noAmount.body.error.fields['lines.0.amountCents']).toBeTruthy();
    expect((await (await as(s.crew)).post(`/api/bookings/${booking.id}/invoices`, { kind: 'additional', lines: [{ charge: 'cleaning', description: 'Mud', amountCents: 100 }] })).status).toBe(403);

    const invoice = await s.issued(booking.id, {
      kind: 'additional',
      lines: [
        { charge: 'damage', description: '20 ft sidewall, torn panel', amountCents: 8_500 },
        { charge: 'cleaning', description: 'Tent top washed of tree sap', amountCents: 15_000 },
      ],
    });
    // Arithmetic: 150.00 x 7.25% = 10.875 -> 10.88, rounded half up once per invoice (SSUTA §324); the damage line is
    // untaxed by default (ADDITIONAL_CHARGE_TAXABLE: common practice, no published source).
    expect(invoice).toMatchObject({ kind: 'additional', status: 'open', taxCents: 1_088, totalCents: 8_500 + 15_000 + 1_088 });
    expect(invoice.lines.map((l: { category: string }) => l.category)).toEqual(['damage', 'delivery_labor', 'tax']);
    // Damage is income when billed, whatever the event date; the cleaning (a service) waits for the event as a deposit.
    expect(await accountOnBooking(booking.id, 'damage_recovery')).toBe(8_500);
    expect(await accountOnBooking(booking.id, 'customer_deposits')).toBe(15_000);
    expect(await accountOnBooking(booking.id, 'sales_tax_payable')).toBe(1_088);
    const doc = (await Document.findByPk(invoice.documentId))!;
    expect(doc.markdown).toContain('20 ft sidewall, torn panel');
    expect(doc.markdown).toContain('$245.88');
    // Its own table, not the booking's: the tent rented is not on the damage invoice.
    expect(doc.markdown).not.toContain('20x30 pole tent');
    // Issuing e-mails the invoice's own PDF to the customer.
    const mail = await waitForMail(s.email, { subject: new RegExp(invoice.number) });
    expect(mail.attachments.map((a: { sha256: string }) => a.sha256)).toEqual([doc.sha256]);
    expect(mail.text).toContain('The total is $245.88');
  });

  it('a tax-exempt customer pays no tax on additional charges, even on lines marked taxable', async () => {
    const s = await setup({ taxExempt: true });
    const booking = await s.newBooking();
    const draft = await s.office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'additional', lines: [{ charge: 'late_return', description: 'Returned a day late', amountCents: 9_000, taxable: true }] });
    expect(draft.body).toMatchObject({ taxCents: 0, totalCents: 9_000 });
    expect(draft.body.lines[0].category).toBe('rental');
  });

  it('the held security deposit pays the damage invoice: never more than held or than owed', async () => {
    const s = await setup();
    const booking = await s.newBooking();
    await s.office.post(`/api/bookings/${booking.id}/security-deposit`, { action: 'collect', amountCents: 10_000, method: 'check' });
    const damage = await s.issued(booking.id, { kind: 'additional', lines: [{ charge: 'missing', description: 'Two stakes not returned', amountCents: 6_000 }] });
    const more = await s.office.post(`/api/bookings/${booking.id}/security-deposit`, { action: 'apply', amountCents: 6_001, invoiceId: damage.id });
    expect(more.status).toBe(409);
    expect(more.body.error.fields.amountCents).toMatch(/\$60\.00/);
    expect((await s.office.post(`/api/bookings/${booking.id}/security-deposit`, { action: 'apply', amountCents: 10_001, invoiceId: damage.id })).body.error.code).toBe('more_than_held');
    const applied = await s.office.post(`/api/bookings/${booking.id}/security-deposit`, { action: 'apply', amountCents: 6_000, invoiceId: damage.id });
    expect(applied.status).toBe(201);
    expect(applied.body).toMatchObject({ kind: 'applied', heldCents: 4_000 });
    expect((await s.office.get(`/api/invoices/${damage.id}`)).body).toMatchObject({ status: 'paid', balanceCents: 0 });
    const payments = (await s.office.get(`/api/bookings/${booking.id}/payments`)).body.data;
    expect(payments[0]).toMatchObject({ method: 'security_deposit', amountCents: 6_000 });
    expect((await s.office.get(`/api/bookings/${booking.id}/ledger`)).body).toMatchObject({ balanceCents: 0, securityDepositHeldCents: 4_000 });
  });
});

describe('credit notes', () => {
  it('lower an open invoice, numbered in their own series, never more than the invoice; a credited invoice is not voided', async () => {
    const s = await setup();
    const booking = await s.newBooking();
    const deposit = await s.issued(booking.id, { kind: 'deposit' });
    expect((await (await as(s.bookkeeper)).post(`/api/invoices/${deposit.id}/credit-notes`, { amountCents: 100, reason: 'Goodwill' })).status).toBe(403);
    const tooMuch = await s.office.post(`/api/invoices/${deposit.id}/credit-notes`, { amountCents: 14_480, reason: 'Too much' });
    expect(tooMuch.status).toBe(409);
    expect(tooMuch.body.error.fields.amountCents).toMatch(/\$144\.79/);
    expect((await s.office.post(`/api/invoices/${deposit.id}/credit-notes`, { amountCents: 100, reason: '' })).status).toBe(400);
    const note = await s.office.post(`/api/invoices/${deposit.id}/credit-notes`, { amountCents: 4_479, reason: 'Smaller tent agreed on the phone' });
    expect(note.status).toBe(201);
    const year = note.body.issueDate.slice(0, 4);
    expect(note.body).toMatchObject({ kind: 'credit_note', number: `INV-CR-${year}-0001`, totalCents: 4_479, creditsInvoice: { id: deposit.id, number: deposit.number }, reason: 'Smaller tent agreed on the phone' });
    // Split over the invoice's parts in proportion: its tax share is 4,479 x 979 / 14,479 = 302.8 -> 303 (largest remainder).
    expect(note.body.taxCents).toBe(303);
    expect((await s.office.get(`/api/invoices/${deposit.id}`)).body).toMatchObject({ creditedCents: 4_479, balanceCents: 10_000, status: 'partly_paid' });
    expect((await s.owner.post(`/api/invoices/${deposit.id}/void`, { reason: 'Start again' })).body.error.code).toBe('has_credit_notes');
    expect((await s.owner.post(`/api/invoices/${note.body.id}/void`, { reason: 'Oops' })).body.error.code).toBe('credit_note');
    expect((await s.office.post('/api/payments', { method: 'cash', invoiceId: note.body.id, amountCents: 100 })).status).toBe(400);
    await waitForMail(s.email, { subject: /credit note/i });
    // invoiced - credited - paid + refunded: 144.79 - 44.79 = 100.00.
    expect((await s.office.get(`/api/bookings/${booking.id}/ledger`)).body).toMatchObject({ invoicedCents: 14_479, creditedCents: 4_479, balanceCents: 10_000 });
    const second = await s.issued(booking.id, { kind: 'balance' });
    const note2 = await s.office.post(`/api/invoices/${second.id}/credit-notes`, { amountCents: 100, reason: 'Rounding' });
    expect(note2.body.number).toBe(`INV-CR-${year}-0002`);
  });

  it('on a paid invoice the credit becomes the customer’s account credit, which pays another invoice or goes back (owner only)', async () => {
    const s = await setup();
    const booking = await s.newBooking();
    const deposit = await s.issued(booking.id, { kind: 'deposit' });
    await s.office.post('/api/payments', { method: 'check', reference: 'Check 88', invoiceId: deposit.id, amountCents: 14_479 });
    const note = await s.office.post(`/api/invoices/${deposit.id}/credit-notes`, { amountCents: 5_000, reason: 'Chairs not delivered' });
    expect(note.status).toBe(201);
    expect((await s.office.get(`/api/invoices/${deposit.id}`)).body).toMatchObject({ status: 'paid', creditedCents: 0, balanceCents: 0 });
    expect((await s.office.get(`/api/customers/${s.customer.id}/credit`)).body).toMatchObject({ creditCents: 5_000 });
    // AR on the booking stays at zero: the customer owes nothing and is owed 50.00 as credit.
    expect((await s.office.get(`/api/bookings/${booking.id}/ledger`)).body).toMatchObject({ balanceCents: 0, creditedCents: 0, customerCreditCents: 5_000 });
    // Credit notes on one invoice never add up to more than its total, whatever part became account credit.
    expect((await s.office.get(`/api/invoices/${deposit.id}`)).body).toMatchObject({ creditNotesCents: 5_000, can: { creditNote: true } });
    const again = await s.office.post(`/api/invoices/${deposit.id}/credit-notes`, { amountCents: 14_479 - 5_000 + 1, reason: 'Again' });
    expect(again.status).toBe(409);
    expect(again.body.error.fields.amountCents).toMatch(/\$94\.79/);

    const balance = await s.issued(booking.id, { kind: 'balance' });
    expect((await s.office.post(`/api/invoices/${balance.id}/apply-credit`, { amountCents: 5_001 })).body.error.code).toBe('more_than_credit');
    const applied = await s.office.post(`/api/invoices/${balance.id}/apply-credit`, { amountCents: 3_000 });
    expect(applied.status).toBe(200);
    expect(applied.body).toMatchObject({ paidCents: 3_000, balanceCents: balance.totalCents - 3_000 });
    expect((await s.office.get(`/api/customers/${s.customer.id}/credit`)).body.creditCents).toBe(2_000);

    expect((await s.office.post(`/api/customers/${s.customer.id}/credit/refunds`, { amountCents: 2_000, method: 'check', reason: 'Paid back' })).status).toBe(403);
    expect((await s.owner.post(`/api/customers/${s.customer.id}/credit/refunds`, { amountCents: 2_001, method: 'check', reason: 'Paid back' })).body.error.code).toBe('more_than_credit');
    const back = await s.owner.post(`/api/customers/${s.customer.id}/credit/refunds`, { amountCents: 2_000, method: 'check', reason: 'Paid back by check 1043' });
    expect(back.status).toBe(201);
    const credit = (await s.owner.get(`/api/customers/${s.customer.id}/credit`)).body;
    expect(credit.creditCents).toBe(0);
    expect(credit.moves.map((m: { kind: string }) => m.kind).sort()).toEqual(['credit_note', 'credit_refunded', 'payment_received']);
    const today = new Date().toISOString().slice(0, 10);
    const tb = (await s.owner.get(`/api/ledger/trial-balance?at=${today}`)).body;
    expect(tb.totalDebitCents).toBe(tb.totalCreditCents);
  });
});

describe('overpayments', () => {
  it('are refused unless kept as customer credit; the kept part is not refundable through the payment', async () => {
    const s = await setup();
    const booking = await s.newBooking();
    const deposit = await s.issued(booking.id, { kind: 'deposit' });
    expect((await s.office.post('/api/payments', { method: 'cash', invoiceId: deposit.id, amountCents: 20_000 })).body.error.code).toBe('overpayment');
    const paid = await s.office.post('/api/payments', { method: 'cash', invoiceId: deposit.id, amountCents: 20_000, keepExcessAsCredit: true });
    expect(paid.status).toBe(201);
    expect(paid.body).toMatchObject({ amountCents: 20_000, creditCents: 20_000 - 14_479 });
    expect((await s.office.get(`/api/invoices/${deposit.id}`)).body).toMatchObject({ status: 'paid', paidCents: 14_479 });
    expect((await s.office.get(`/api/customers/${s.customer.id}/credit`)).body.creditCents).toBe(5_521);
    const refund = await s.owner.post(`/api/payments/${paid.body.id}/refunds`, { amountCents: 14_480, reason: 'All of it' });
    expect(refund.status).toBe(409);
    expect(refund.body.error.fields.amountCents).toMatch(/\$144\.79/);
    // The booking owes nothing; the extra is a liability (customer credit), not a negative receivable.
    expect((await s.office.get(`/api/bookings/${booking.id}/ledger`)).body).toMatchObject({ balanceCents: 0, paidCents: 14_479, customerCreditCents: 5_521 });
    expect(await Invoice.count({ where: { bookingId: booking.id, kind: 'credit_note' } })).toBe(0);
  });
});
