import { beforeAll, describe, expect, it } from 'vitest';
import { addDays, dateInZone, zonedTimeToInstant } from '../../../shared/dates';
import type {
  AgingReport, DepositsReport, EntriesTrace, RevenueReport, SalesTaxReport, ShortfallsReport, StockReport, TracedEntries,
} from '../../../shared/schemas/reports';
import type { InvoiceRow } from '../../../shared/schemas/invoices';
import { createApp } from '../../../server/app';
import { accountBalances } from '../../../server/ledger/balances';
import { Account, Invoice, JournalEntry, JournalLine, type User } from '../../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient } from '../../support';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);

/** The query string of a figure's trace, as the screen sends it. */
const traceQuery = (t: EntriesTrace) =>
  new URLSearchParams(Object.entries({ ...t, accountIds: t.accountIds.join(',') }).map(([k, v]) => [k, String(v)])).toString();

async function company() {
  const c = await buildCompany();
  const tz = c.organization.timeZone;
  const today = dateInZone(new Date(), tz);
  return { ...c, tz, today, office: await as(c.office), owner: await as(c.owner), books: await as(c.bookkeeper), crew: await as(c.crew) };
}
type Company = Awaited<ReturnType<typeof company>>;

async function issue(s: Company, bookingId: string, body: Record<string, unknown>): Promise<InvoiceRow> {
  const draft = await s.office.post(`/api/bookings/${bookingId}/invoices`, body);
  expect(draft.status).toBe(201);
  const done = await s.office.post(`/api/invoices/${draft.body.id}/issue`);
  expect(done.status).toBe(200);
  return done.body;
}

/** Moves an issued invoice's dates back: the clock is moved through the data (journal entries cannot be rewritten). */
async function dueDaysAgo(s: Company, invoiceId: string, days: number) {
  await Invoice.update({ issueDate: addDays(s.today, -days - 7), dueDate: addDays(s.today, -days) }, { where: { id: invoiceId } });
}

/**
 * Each account's net balance by code from GET /api/ledger/trial-balance (debits positive). Codes of
 * the default chart (server/ledger/chart.ts): 1200 accounts receivable, 2100 customer deposits,
 * 2120 customer credit, 2150 security deposits held, 2200 sales tax payable.
 */
async function trialBalance(s: Company, at: string) {
  const res = await s.owner.get(`/api/ledger/trial-balance?at=${at}`);
  expect(res.status).toBe(200);
  expect(res.body.totalDebitCents).toBe(res.body.totalCreditCents);
  const net = new Map<string, number>(res.body.accounts.map((a: { code: string; debitCents: number; creditCents: number }) => [a.code, a.debitCents - a.creditCents]));
  return (code: string) => net.get(code) ?? 0;
}

async function entriesBehind(s: Company, t: EntriesTrace): Promise<TracedEntries> {
  const res = await s.books.get(`/api/reports/entries?${traceQuery(t)}&pageSize=200`);
  expect(res.status).toBe(200);
  return res.body;
}

/** Credits less debits on one account over one booking's entries (an independent sum of the journal). */
async function creditsOnBooking(bookingId: string, systemKey: string) {
  const entries = await JournalEntry.findAll({ where: { bookingId }, attributes: ['id'] });
  const lines = await JournalLine.findAll({ where: { entryId: entries.map((e) => e.id) }, include: [{ model: Account, as: 'account', where: { systemKey } }] });
  return lines.reduce((a, l) => a + l.creditCents - l.debitCents, 0);
}

describe('the reports: who may read them', () => {
  let s: Company;
  let other: Company;
  let bookingId: string;
  let tentId: string;
  beforeAll(async () => {
    s = await company();
    other = await company();
    const customer = await buildCustomer(s.organization.id, { name: 'Marlow Street Block Party' });
    const tent = await buildItem(s.organization.id, { name: '20x20 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 20, quantityOwned: 3, rentalPriceCents: 30_000 });
    const booking = (await s.office.post('/api/bookings', bookingBody(customer.id, addDays(s.today, 40), [{ itemId: tent.id, quantity: 1, unitPriceCents: 30_000 }], { damageWaiver: false, taxRateBp: 500 }))).body;
    bookingId = booking.id;
    tentId = tent.id;
    await issue(s, booking.id, { kind: 'deposit' });
  });

  const paths = ['/api/reports/aging', '/api/reports/deposits', '/api/reports/sales-tax', '/api/reports/revenue', '/api/reports/stock', '/api/reports/shortfalls'];

  it('401 signed out, 400 for a bad query with the field named, 403 for the crew and the office, 200 for the owner and the bookkeeper', async () => {
    const anonymous = await new ApiClient(app).init();
    for (const p of paths) expect((await anonymous.get(p)).status).toBe(401);
    expect((await anonymous.get('/api/reports/entries?accountIds=x')).status).toBe(401);

    const bad = await s.owner.get('/api/reports/aging?at=2027-02-30');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.at).toMatch(/YYYY-MM-DD/);
    expect((await s.owner.get('/api/reports/sales-tax?from=2027-13')).body.error.fields.from).toMatch(/YYYY-MM/);
    expect((await s.owner.get('/api/reports/sales-tax?from=2027-05&to=2027-04')).body.error.fields.to).toMatch(/on or after/);
    expect((await s.owner.get('/api/reports/stock?from=2027-05-02&to=2027-05-01')).body.error.fields.to).toMatch(/on or after/);
    expect((await s.owner.get('/api/reports/stock?from=2000-01-01&to=2027-05-01')).body.error.fields.from).toMatch(/ten years/);
    expect((await s.owner.get('/api/reports/revenue?year=twenty')).body.error.fields.year).toMatch(/four digits/);
    expect((await s.owner.get('/api/reports/entries')).body.error.fields.accountIds).toBeTruthy();
    expect((await s.owner.get('/api/reports/entries?accountIds=not-an-id')).body.error.fields.accountIds).toMatch(/not a valid/i);

    for (const p of paths) {
      expect((await s.crew.get(p)).status).toBe(403);
      expect((await s.office.get(p)).status).toBe(403);
      expect((await s.owner.get(p)).status).toBe(200);
      expect((await s.books.get(p)).status).toBe(200);
    }
    const aging: AgingReport = (await s.books.get('/api/reports/aging')).body;
    expect((await s.crew.get(`/api/reports/entries?${traceQuery(aging.reconciliation.trace)}`)).status).toBe(403);
    expect((await s.crew.get(`/api/reports/stock/items/${tentId}`)).status).toBe(403);
    expect((await s.owner.get('/api/reports/stock/items/not-an-id')).status).toBe(400);
    expect((await s.owner.get(`/api/reports/stock/items/${tentId}`)).status).toBe(200);
    expect((await s.office.get(`/api/reports/entries?${traceQuery(aging.reconciliation.trace)}`)).status).toBe(403);
  });

  it('another company sees nothing of this one: its own empty reports, and 404 for this company’s accounts and bookings', async () => {
    const mine: AgingReport = (await s.owner.get('/api/reports/aging')).body;
    expect(mine.customers).toHaveLength(1);
    expect(mine.totalCents).toBeGreaterThan(0);

    const theirs: AgingReport = (await other.owner.get('/api/reports/aging')).body;
    expect(theirs.customers).toEqual([]);
    expect(theirs.totalCents).toBe(0);
    const deposits: DepositsReport = (await other.books.get('/api/reports/deposits')).body;
    expect(deposits.customerDeposits.rows).toEqual([]);
    expect(deposits.totalCents).toBe(0);
    expect((await other.owner.get(`/api/reports/entries?${traceQuery(mine.reconciliation.trace)}`)).status).toBe(404);
    const ownAr = theirs.reconciliation.trace.accountIds[0];
    expect(ownAr).not.toBe(mine.reconciliation.trace.accountIds[0]);
    expect((await other.owner.get(`/api/reports/entries?accountIds=${ownAr}&bookingId=${bookingId}`)).status).toBe(404);
    expect((await other.owner.get(`/api/reports/stock/items/${tentId}`)).status).toBe(404);
    const empty: TracedEntries = (await other.owner.get(`/api/reports/entries?accountIds=${ownAr}`)).body;
    expect(empty).toMatchObject({ entries: [], total: 0, totalCents: 0 });
  });
});

describe('receivables aging, deposits held and sales tax, against the ledger', () => {
  let s: Company;
  const inv: Record<string, InvoiceRow> = {};
  let ids: { a: string; b: string; c: string; custA: string; custB: string; custC: string };

  beforeAll(async () => {
    s = await company();
    const custA = await buildCustomer(s.organization.id, { name: 'Hollin Family Reunion' });
    const custB = await buildCustomer(s.organization.id, { name: 'Quarry Pond Rowing Club' });
    const custC = await buildCustomer(s.organization.id, { name: 'Ashgrove Arts Night' });
    const tent = await buildItem(s.organization.id, { name: '20x30 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 30, quantityOwned: 10, rentalPriceCents: 45_000 });
    const event = addDays(s.today, 60);
    const book = async (customerId: string, taxRateBp: number) =>
      (await s.office.post('/api/bookings', bookingBody(customerId, event, [{ itemId: tent.id, quantity: 1, unitPriceCents: 45_000, description: '20x30 pole tent' }], { damageWaiver: false, taxRateBp }))).body.id as string;
    ids = { a: await book(custA.id, 725), b: await book(custB.id, 725), c: await book(custC.id, 887.5), custA: custA.id, custB: custB.id, custC: custC.id };

    // Customer A: a deposit 45 days late and part paid, a balance 91 days late with a credit note, and
    // additional charges due at every bucket edge.
    inv.depositA = await issue(s, ids.a, { kind: 'deposit' });
    await dueDaysAgo(s, inv.depositA.id, 45);
    expect((await s.office.post('/api/payments', { method: 'cash', invoiceId: inv.depositA.id, amountCents: 5_000 })).status).toBe(201);
    inv.balanceA = await issue(s, ids.a, { kind: 'balance' });
    await dueDaysAgo(s, inv.balanceA.id, 91);
    const note = await s.office.post(`/api/invoices/${inv.balanceA.id}/credit-notes`, { amountCents: 10_000, reason: 'Sidewalls not needed' });
    expect(note.status).toBe(201);
    inv.noteA = note.body;
    for (const days of [0, 30, 31, 60, 61, 90]) {
      inv[`edge${days}`] = await issue(s, ids.a, { kind: 'additional', lines: [{ charge: 'cleaning', description: `Cleaning ${days}`, amountCents: 1_000 + days }] });
      await dueDaysAgo(s, inv[`edge${days}`].id, days);
    }
    // Security deposit taken, part returned by the owner.
    expect((await s.office.post(`/api/bookings/${ids.a}/security-deposit`, { action: 'collect', amountCents: 10_000, method: 'check' })).status).toBe(201);
    expect((await s.owner.post(`/api/bookings/${ids.a}/security-deposit`, { action: 'refund', amountCents: 4_000, method: 'check' })).status).toBe(201);

    // Customer B: an overpaid deposit (the extra kept as account credit), a voided charge, a balance
    // paid and refunded (it owes again), and a check dated tomorrow on a damage charge.
    inv.depositB = await issue(s, ids.b, { kind: 'deposit' });
    expect((await s.office.post('/api/payments', { method: 'check', invoiceId: inv.depositB.id, amountCents: inv.depositB.totalCents + 2_000, keepExcessAsCredit: true })).status).toBe(201);
    inv.voidB = await issue(s, ids.b, { kind: 'additional', lines: [{ charge: 'late_return', description: 'Billed by mistake', amountCents: 7_000 }] });
    expect((await s.owner.post(`/api/invoices/${inv.voidB.id}/void`, { reason: 'Billed by mistake' })).status).toBe(200);
    inv.balanceB = await issue(s, ids.b, { kind: 'balance' });
    await dueDaysAgo(s, inv.balanceB.id, 10);
    const paid = await s.office.post('/api/payments', { method: 'check', invoiceId: inv.balanceB.id, amountCents: 3_000 });
    expect((await s.owner.post(`/api/payments/${paid.body.id}/refunds`, { amountCents: 3_000, reason: 'Check returned unpaid' })).status).toBe(201);
    inv.damageB = await issue(s, ids.b, { kind: 'additional', lines: [{ charge: 'damage', description: 'Bent leg on a banquet table', amountCents: 4_000 }] });
    await dueDaysAgo(s, inv.damageB.id, 0);
    const tomorrowNoon = zonedTimeToInstant(addDays(s.today, 1), '12:00', s.tz).toISOString();
    expect((await s.office.post('/api/payments', { method: 'check', invoiceId: inv.damageB.id, amountCents: 1_500, receivedAt: tomorrowNoon, reference: 'Post-dated check' })).status).toBe(201);

    // Customer C: taxed at another rate (8.875%); the deposit paid in full by transfer, then refunded in full (it owes again).
    inv.depositC = await issue(s, ids.c, { kind: 'deposit' });
    const paidC = await s.office.post('/api/payments', { method: 'transfer', invoiceId: inv.depositC.id, amountCents: inv.depositC.totalCents, reference: 'Transfer 5521' });
    expect((await s.owner.post(`/api/payments/${paidC.body.id}/refunds`, { amountCents: inv.depositC.totalCents, reason: 'Paid twice by mistake' })).status).toBe(201);
    for (const [k, v] of Object.entries(inv)) if (v.kind !== 'credit_note') inv[k] = (await s.office.get(`/api/invoices/${v.id}`)).body;
  });

  it('buckets each open invoice by days past due at its edges, and the total equals accounts receivable in the ledger', async () => {
    const res = await s.books.get('/api/reports/aging');
    expect(res.status).toBe(200);
    const r: AgingReport = res.body;
    expect(r.at).toBe(s.today);
    const rows = new Map(r.customers.flatMap((c) => c.invoices.map((i) => [i.id, i])));
    // Bucket edges from issue 8 (current, 1–30, 31–60, 61–90, over 90 days past due); common practice, no published source.
    const expected: [string, number, string][] = [
      ['edge0', 0, 'current'], ['edge30', 30, 'days1to30'], ['edge31', 31, 'days31to60'], ['edge60', 60, 'days31to60'],
      ['edge61', 61, 'days61to90'], ['edge90', 90, 'days61to90'], ['balanceA', 91, 'over90'], ['depositA', 45, 'days31to60'],
      ['balanceB', 10, 'days1to30'], ['damageB', 0, 'current'], ['depositC', 0, 'current'],
    ];
    for (const [key, days, bucket] of expected) {
      const row = rows.get(inv[key].id);
      expect(row, key).toBeDefined();
      expect(row, key).toMatchObject({ daysPastDue: days, bucket, number: inv[key].number });
    }
    // The paid deposit (its extra kept as credit) and the void invoice owe nothing: not listed.
    expect(rows.has(inv.depositB.id)).toBe(false);
    expect(rows.has(inv.voidB.id)).toBe(false);
    expect(rows.size).toBe(expected.length);

    // Balances as the invoices themselves state them (total - paid - credited); the check dated
    // tomorrow is not in today's figures yet.
    for (const [key] of expected) {
      const want = key === 'damageB' ? inv.damageB.balanceCents + 1_500 : inv[key].balanceCents;
      expect(rows.get(inv[key].id)!.balanceCents, key).toBe(want);
    }
    // The credit note came off the unpaid balance invoice whole.
    expect(inv.balanceA.creditedCents).toBe(10_000);
    expect(rows.get(inv.balanceA.id)).toMatchObject({ creditedCents: 10_000, paidCents: 0 });
    // The refunded payments reopened their invoices: nothing paid on them any more, the whole total owed again.
    expect(rows.get(inv.balanceB.id)).toMatchObject({ paidCents: 0, balanceCents: inv.balanceB.totalCents });
    expect(inv.depositC).toMatchObject({ status: 'open', paidCents: 0 });
    expect(rows.get(inv.depositC.id)).toMatchObject({ paidCents: 0, balanceCents: inv.depositC.totalCents });

    // Every customer row adds up, every bucket adds up, and the whole equals AR (account 1200) in the trial balance.
    for (const c of r.customers) {
      expect(c.totalCents).toBe(c.invoices.reduce((a, i) => a + i.balanceCents, 0));
      expect(Object.values(c.buckets).reduce((a, b) => a + b, 0)).toBe(c.totalCents);
    }
    expect(Object.values(r.totals).reduce((a, b) => a + b, 0)).toBe(r.totalCents);
    const tb = await trialBalance(s, s.today);
    expect(r.totalCents).toBeGreaterThan(0);
    expect(r.totalCents).toBe(tb('1200'));
    expect(r.reconciliation).toMatchObject({ ledgerCents: tb('1200'), reportCents: r.totalCents, differenceCents: 0, account: { code: '1200' } });
    // The entries behind the reconciliation add up to it.
    const behind = await entriesBehind(s, r.reconciliation.trace);
    expect(behind.side).toBe('debit');
    expect(behind.totalCents).toBe(tb('1200'));
    expect(behind.entries.reduce((a, e) => a + e.effectCents, 0)).toBe(behind.totalCents);
    expect(behind.total).toBe(behind.entries.length);
  });

  it('as of tomorrow the post-dated check counts, still equal to the ledger on that day', async () => {
    const tomorrow = addDays(s.today, 1);
    const r: AgingReport = (await s.owner.get(`/api/reports/aging?at=${tomorrow}`)).body;
    const damage = r.customers.flatMap((c) => c.invoices).find((i) => i.id === inv.damageB.id)!;
    expect(damage).toMatchObject({ paidCents: 1_500, balanceCents: inv.damageB.balanceCents, daysPastDue: 1, bucket: 'days1to30' });
    const tb = await trialBalance(s, tomorrow);
    expect(r.totalCents).toBe(tb('1200'));
    expect(r.reconciliation.differenceCents).toBe(0);
    // A day before anything was issued: nothing owed, and the ledger agrees.
    const before: AgingReport = (await s.owner.get(`/api/reports/aging?at=${addDays(s.today, -1)}`)).body;
    expect(before.totalCents).toBe(0);
    expect(before.reconciliation).toMatchObject({ ledgerCents: 0, differenceCents: 0 });
  });

  it('deposits, security deposits and account credit held, by booking, equal their ledger accounts', async () => {
    const r: DepositsReport = (await s.books.get('/api/reports/deposits')).body;
    const tb = await trialBalance(s, s.today);
    // Liabilities: credits less debits in the trial balance.
    expect(r.customerDeposits.totalCents).toBeGreaterThan(0);
    expect(r.customerDeposits.totalCents).toBe(-tb('2100'));
    expect(r.securityDeposits.totalCents).toBe(-tb('2150'));
    expect(r.customerCredit.totalCents).toBe(-tb('2120'));
    for (const section of [r.customerDeposits, r.securityDeposits, r.customerCredit]) {
      expect(section.check.differenceCents).toBe(0);
      expect(section.rows.reduce((a, x) => a + x.cents, 0)).toBe(section.totalCents);
    }
    expect(r.totalCents).toBe(r.customerDeposits.totalCents + r.securityDeposits.totalCents + r.customerCredit.totalCents);

    // By booking, against each booking's own journal lines.
    for (const bookingId of [ids.a, ids.b, ids.c]) {
      const row = r.customerDeposits.rows.find((x) => x.booking?.id === bookingId)!;
      expect(row.cents).toBe(await creditsOnBooking(bookingId, 'customer_deposits'));
      expect((await entriesBehind(s, row.trace)).totalCents).toBe(row.cents);
    }
    // 100.00 taken, 40.00 given back: 60.00 held (the booking's money panel says the same).
    const held = r.securityDeposits.rows.find((x) => x.booking?.id === ids.a)!;
    expect(held.cents).toBe(6_000);
    expect((await s.books.get(`/api/bookings/${ids.a}/ledger`)).body.securityDepositHeldCents).toBe(6_000);
    // The overpayment kept as credit: 20.00, by customer.
    const credit = r.customerCredit.rows.find((x) => x.customer?.id === ids.custB)!;
    expect(credit.cents).toBe(2_000);
    expect((await s.books.get(`/api/customers/${ids.custB}/credit`)).body.creditCents).toBe(2_000);
    expect((await entriesBehind(s, credit.trace)).totalCents).toBe(2_000);
  });

  it('sales tax by month and rate: what the invoices billed less what credit notes and voids gave back, equal to the movement of sales tax payable', async () => {
    const month = s.today.slice(0, 7);
    const r: SalesTaxReport = (await s.books.get(`/api/reports/sales-tax?from=${month}&to=${month}`)).body;
    const at725 = r.rows.find((x) => x.month === month && x.taxRateBp === 725)!;
    const at8875 = r.rows.find((x) => x.month === month && x.taxRateBp === 887.5)!;
    expect(r.rows).toHaveLength(2);
    // Independent sums from the invoices themselves.
    const taxed725 = Object.entries(inv).filter(([k, v]) => v.kind !== 'credit_note' && k !== 'depositC');
    expect(at725.billedCents).toBe(taxed725.reduce((a, [, v]) => a + v.taxCents, 0));
    expect(at725.returnedCents).toBe(inv.noteA.taxCents + inv.voidB.taxCents);
    expect(at725.netCents).toBe(at725.billedCents - at725.returnedCents);
    expect(at8875).toMatchObject({ billedCents: inv.depositC.taxCents, returnedCents: 0, netCents: inv.depositC.taxCents });
    // 8.875%: the one deposit; 7.25%: every taxed invoice (the voided one too) and the credit note.
    expect(at8875.invoiceCount).toBe(1);
    expect(at725.invoiceCount).toBe(taxed725.filter(([, v]) => v.taxCents > 0).length + 1);
    expect(r.netCents).toBe(at725.netCents + at8875.netCents);

    // Reconciled: the net credit movement of account 2200 over the month, from the trial balances at its two ends.
    const end = await trialBalance(s, s.today);
    const start = await trialBalance(s, addDays(`${month}-01`, -1));
    expect(r.netCents).toBe(-(end('2200') - start('2200')));
    expect(r.reconciliation).toMatchObject({ reportCents: r.netCents, ledgerCents: r.netCents, differenceCents: 0, account: { code: '2200' } });
    // Each row's entries add up to the row, and name the invoices they record.
    const behind725 = await entriesBehind(s, at725.trace);
    expect(behind725.totalCents).toBe(at725.netCents);
    expect(behind725.entries.map((e) => e.invoice?.id)).toEqual(expect.arrayContaining([inv.noteA.id, inv.voidB.id, inv.balanceA.id]));
    const behind8875 = await entriesBehind(s, at8875.trace);
    expect(behind8875.totalCents).toBe(at8875.netCents);
    expect(behind8875.entries.map((e) => e.invoice)).toEqual([{ id: inv.depositC.id, number: inv.depositC.number }]);
    expect(r.months.find((m) => m.month === month)!.netCents).toBe(r.netCents);
  });
});

describe('revenue by account and month', () => {
  it('this year against last, net of refunds and allowances, equal to the change in the revenue accounts', async () => {
    const s = await company();
    const customer = await buildCustomer(s.organization.id, { name: 'Fernbank School Fair' });
    const chairs = await buildItem(s.organization.id, { name: 'White folding chair', kind: 'chair', quantityOwned: 200, rentalPriceCents: 250 });
    // An event already held: its invoices are revenue when issued (no deposit to wait on).
    const booking = (await s.office.post('/api/bookings', bookingBody(customer.id, addDays(s.today, -3), [{ itemId: chairs.id, quantity: 120, unitPriceCents: 250 }], { taxRateBp: 725, setupLaborCents: 6_000 }))).body;
    const balance = await issue(s, booking.id, { kind: 'balance' });
    const damage = await issue(s, booking.id, { kind: 'additional', lines: [{ charge: 'missing', description: 'Four chairs not returned', amountCents: 8_000 }] });
    const note = (await s.office.post(`/api/invoices/${balance.id}/credit-notes`, { amountCents: 3_000, reason: 'Late delivery' })).body;

    const r: RevenueReport = (await s.books.get('/api/reports/revenue')).body;
    const year = Number(s.today.slice(0, 4));
    const m = Number(s.today.slice(5, 7)) - 1;
    expect(r.year).toBe(year);
    const row = (code: string) => r.accounts.find((a) => a.account.code === code)!;
    const part = (i: InvoiceRow, category: string) => i.lines.filter((l) => l.category === category).reduce((a, l) => a + l.amountCents, 0);
    // Default chart codes (server/ledger/chart.ts): 4000 rental, 4100 delivery and labor, 4200 damage waiver, 4300 damage recovery, 4900 refunds and allowances.
    expect(row('4000').thisYear[m]).toBe(part(balance, 'rental'));
    expect(row('4100').thisYear[m]).toBe(part(balance, 'delivery_labor'));
    expect(row('4200').thisYear[m]).toBe(part(balance, 'damage_waiver'));
    expect(row('4300').thisYear[m]).toBe(8_000);
    expect(row('4900').thisYear[m]).toBe(-(note.totalCents - note.taxCents));
    expect(row('4900').account.type).toBe('contra_revenue');
    for (const a of r.accounts) expect(a.lastYear.every((x) => x === 0)).toBe(true);
    // Missing stock is untaxed by default (ADDITIONAL_CHARGE_TAXABLE: common practice, no published source).
    expect(damage.taxCents).toBe(0);

    const net = balance.totalCents - balance.taxCents + 8_000 - (note.totalCents - note.taxCents);
    expect(r.totals.thisYear[m]).toBe(net);
    expect(r.totals.thisYearCents).toBe(net);
    // Against the ledger's own balances (balances.ts): revenue less contra revenue now; nothing at the end of last year.
    const balances = await accountBalances(s.organization.id, { at: s.today });
    const ledgerNet = balances.reduce((a, b) => a + (b.type === 'revenue' ? b.balanceCents : b.type === 'contra_revenue' ? -b.balanceCents : 0), 0);
    expect(r.totals.thisYearCents).toBe(ledgerNet);
    expect(r.reconciliation.thisYear).toMatchObject({ ledgerCents: ledgerNet, differenceCents: 0 });
    expect(r.reconciliation.lastYear).toMatchObject({ ledgerCents: 0, reportCents: 0, differenceCents: 0 });
    // A cell's entries add up to the cell; the month's total across accounts too.
    expect((await entriesBehind(s, row('4900').thisYearTraces[m])).totalCents).toBe(row('4900').thisYear[m]);
    expect((await entriesBehind(s, r.totals.thisYearTraces[m])).totalCents).toBe(net);
    expect((await s.books.get(`/api/reports/revenue?year=${year - 1}`)).body.totals.lastYearCents).toBe(0);
  });
});

describe('stock utilization, payback and shortfalls', () => {
  let s: Company;
  let tentId: string;
  let chairsId: string;
  let p1: { id: string; event: string };
  let p2: { id: string; event: string };
  let bookingsOf: { short1: string; short2: string };

  beforeAll(async () => {
    s = await company();
    const customer = await buildCustomer(s.organization.id, { name: 'Linden Court Neighbors' });
    const tent = await buildItem(s.organization.id, { name: '20x40 frame tent', kind: 'tent', tentType: 'frame', widthFt: 20, lengthFt: 40, quantityOwned: 2, rentalPriceCents: 45_000, purchaseCostCents: 60_000 });
    const chairs = await buildItem(s.organization.id, { name: 'Padded folding chair', kind: 'chair', quantityOwned: 100, rentalPriceCents: 200, purchaseCostCents: 300 });
    tentId = tent.id;
    chairsId = chairs.id;
    const through = async (id: string, statuses: string[]) => {
      for (const status of statuses) expect((await s.office.post(`/api/bookings/${id}/status`, { status, note: '' })).status, status).toBe(200);
    };
    const noTax = { damageWaiver: false, taxRateBp: 0 };
    // P1, 20 days ago: a tent at 450.00 and 50 chairs at 2.00; billed 550.00 as rental, 110.00 credited back.
    p1 = { id: '', event: addDays(s.today, -20) };
    p1.id = (await s.office.post('/api/bookings', bookingBody(customer.id, p1.event, [{ itemId: tent.id, quantity: 1, unitPriceCents: 45_000 }, { itemId: chairs.id, quantity: 50, unitPriceCents: 200 }], noTax))).body.id;
    await through(p1.id, ['reserved', 'out', 'returned', 'closed']);
    const invoice1 = await issue(s, p1.id, { kind: 'balance' });
    expect(invoice1.totalCents).toBe(55_000);
    expect((await s.office.post(`/api/invoices/${invoice1.id}/credit-notes`, { amountCents: 11_000, reason: 'Rain shortened the event' })).status).toBe(201);
    // P2, 10 days ago: a tent at 1,000.00 and 20 chairs at 2.00 with 10% off the booking.
    p2 = { id: '', event: addDays(s.today, -10) };
    p2.id = (await s.office.post('/api/bookings', bookingBody(customer.id, p2.event, [{ itemId: tent.id, quantity: 1, unitPriceCents: 100_000 }, { itemId: chairs.id, quantity: 20, unitPriceCents: 200 }], { ...noTax, discountBp: 1000 }))).body.id;
    await through(p2.id, ['reserved', 'out', 'returned']);
    await issue(s, p2.id, { kind: 'balance' });
    // A draft for the same tent holds nothing and earns nothing.
    await s.office.post('/api/bookings', bookingBody(customer.id, addDays(s.today, -15), [{ itemId: tent.id, quantity: 1, unitPriceCents: 45_000 }], noTax));

    // Shortfalls: both tents reserved in a month; two more requests are refused, one of them twice.
    const later = addDays(s.today, 30);
    const held = (await s.office.post('/api/bookings', bookingBody(customer.id, later, [{ itemId: tent.id, quantity: 2, unitPriceCents: 45_000 }], noTax))).body.id;
    await through(held, ['reserved']);
    const short1 = (await s.office.post('/api/bookings', bookingBody(customer.id, later, [{ itemId: tent.id, quantity: 1, unitPriceCents: 45_000 }], noTax))).body.id;
    const short2 = (await s.office.post('/api/bookings', bookingBody(customer.id, later, [{ itemId: tent.id, quantity: 3, unitPriceCents: 45_000 }, { itemId: chairs.id, quantity: 150, unitPriceCents: 200 }], noTax))).body.id;
    for (const id of [short1, short1, short2]) {
      const refused = await s.office.post(`/api/bookings/${id}/status`, { status: 'reserved', note: '' });
      expect(refused.status).toBe(409);
      expect(refused.body.error.code).toBe('shortfall');
    }
    bookingsOf = { short1, short2 };
  });

  it('days out against days owned, revenue split by the lines’ net, and the day the tent paid for itself', async () => {
    const from = addDays(s.today, -30);
    const res = await s.owner.get(`/api/reports/stock?from=${from}&to=${s.today}`);
    expect(res.status).toBe(200);
    const r: StockReport = res.body;
    // The list counts the bookings; one item's own report lists them.
    expect(r.items.find((i) => i.item.id === tentId)).toMatchObject({ bookingCount: 2, bookings: [] });
    const one = async (itemId: string) => {
      const res = await s.books.get(`/api/reports/stock/items/${itemId}?from=${from}&to=${s.today}`);
      expect(res.status).toBe(200);
      expect(res.body.items).toHaveLength(1);
      return (res.body as StockReport).items[0];
    };
    const tent = await one(tentId);
    const chairs = await one(chairsId);
    expect({ ...r.items.find((i) => i.item.id === tentId), bookings: tent.bookings }).toEqual(tent);
    // Owned from the first delivery (P1's, the day before its event), the catalog entry being newer:
    // the 22 days from 21 days ago to today, both included. Delivery the day before, pickup the day after: 3 days a booking.
    expect(tent).toMatchObject({ daysOwned: 2 * 22, daysOut: 1 * 3 + 1 * 3, utilizationBp: 1364 }); // 6 / 44 = 13.64%
    expect(chairs).toMatchObject({ daysOwned: 100 * 22, daysOut: 50 * 3 + 20 * 3, utilizationBp: 955 }); // 210 / 2200 = 9.545% -> 9.55%
    // P1: 550.00 billed less the 110.00 credit note = 440.00, split 450 : 100 -> 360.00 and 80.00.
    // P2: lines 1,000.00 and 40.00, 10% booking discount spread by net -> 900.00 and 36.00 (shared/quote.ts).
    expect(tent.bookings.map((b) => [b.bookingId, b.revenueCents])).toEqual([[p1.id, 36_000], [p2.id, 90_000]]);
    expect(chairs.bookings.map((b) => b.revenueCents)).toEqual([8_000, 3_600]);
    expect(tent).toMatchObject({ revenueInPeriodCents: 126_000, revenueToDateCents: 126_000, costCents: 120_000, payback: 'paid_back', paidForItselfOn: p2.event });
    expect(chairs).toMatchObject({ revenueToDateCents: 11_600, costCents: 30_000, payback: 'not_yet', paidForItselfOn: null });
    // Every cent of rental billed (net of credit notes) is attributed to an item.
    const billed = (await s.books.get(`/api/invoices?bookingId=${p1.id}`)).body.data.concat((await s.books.get(`/api/invoices?bookingId=${p2.id}`)).body.data) as InvoiceRow[];
    const rental = billed.reduce((a, i) => a + (i.kind === 'credit_note' ? -1 : 1) * i.lines.filter((l) => l.category === 'rental').reduce((x, l) => x + l.amountCents, 0), 0);
    expect(tent.revenueToDateCents + chairs.revenueToDateCents).toBe(rental);
    // P1's revenue comes from its balance invoice and the credit note on it.
    expect(tent.bookings[0].invoices.map((i) => i.number).sort()).toEqual(billed.filter((i) => i.bookingId === p1.id).map((i) => i.number).sort());
    expect(tent.bookings[0].daysOutInPeriod).toBe(3);
  });

  it('before the second booking the tent had not yet paid for itself', async () => {
    const r: StockReport = (await s.owner.get(`/api/reports/stock/items/${tentId}?from=${addDays(s.today, -30)}&to=${addDays(s.today, -15)}`)).body;
    const tent = r.items[0];
    expect(tent.bookings.map((b) => b.bookingId)).toEqual([p1.id]);
    expect(tent).toMatchObject({ revenueToDateCents: 36_000, payback: 'not_yet', paidForItselfOn: null, daysOut: 3 });
    // 21 days ago to 15 days ago: 7 days, 2 tents.
    expect(tent.daysOwned).toBe(14);
  });

  it('shortfalls by item: counts, units short and the bookings that asked', async () => {
    const r: ShortfallsReport = (await s.books.get('/api/reports/shortfalls')).body;
    const [first, second] = r.items;
    expect(first.item.id).toBe(tentId);
    // Refused: 1 tent short twice (short1), then 3 asked with 0 free (short2).
    expect(first).toMatchObject({ count: 3, bookingCount: 2, totalShort: 1 + 1 + 3, largestShort: 3, firstDate: addDays(s.today, 29), lastDate: addDays(s.today, 29) });
    expect(first.requests.map((q) => q.booking?.id)).toEqual([bookingsOf.short1, bookingsOf.short1, bookingsOf.short2]);
    expect(first.requests[2]).toMatchObject({ requested: 3, available: 0, shortfall: 3 });
    // 150 chairs asked, 100 owned and none held: 50 short.
    expect(second).toMatchObject({ item: { id: chairsId }, count: 1, totalShort: 50, largestShort: 50 });
    const outside: ShortfallsReport = (await s.books.get(`/api/reports/shortfalls?from=${s.today}&to=${addDays(s.today, 7)}`)).body;
    expect(outside.items).toEqual([]);
  });
});
