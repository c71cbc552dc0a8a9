/**
 * The bookkeeper's exports, read back as a bookkeeper's tools would read them.
 *
 * Sources of the checked formats: CSV per RFC 4180 ("Common Format and MIME Type for CSV Files"):
 * §2 rule 1 (records end in CRLF), rule 3 (an optional header line with the same fields), rules
 * 5-7 (a field with a comma, quote or line break is enclosed in double quotes; a quote inside is
 * doubled); §3 (the MIME type text/csv with its `header` parameter). The UTF-8 byte order mark
 * (EF BB BF, Unicode Standard §3.10, D95) and the column choices are common practice, no
 * published source. UBL: OASIS UBL 2.1 (docs.oasis-open.org/ubl/os-UBL-2.1), element order from
 * xsd/maindoc/UBL-Invoice-2.1.xsd and UBL-CreditNote-2.1.xsd. Test card 4242 4242 4242 4242
 * succeeds (Stripe testing documentation, docs.stripe.com/testing).
 */
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { parse } from 'csv-parse/sync';
import { Op, QueryTypes } from 'sequelize';
import { describe, expect, inject, it } from 'vitest';
import { addDays, dateInZone, zonedTimeToInstant } from '../../../shared/dates';
import { createApp } from '../../../server/app';
import { issueInvoice } from '../../../server/commands/invoices';
import { sequelize, withTransaction } from '../../../server/db';
import { trialBalance } from '../../../server/ledger/balances';
import { CardCheckout, Document, ExportRun, Invoice, Payment, Refund, type User } from '../../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient, uniqueEmail, uniqueIp } from '../../support';

const run = promisify(execFile);
const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const TZ = 'America/Chicago';

type Row = Record<string, string>;

/** Downloads an export as bytes (supertest buffers it). */
async function download(client: ApiClient, url: string) {
  const res = await client.agent.get(url).set('X-Forwarded-For', client.ip).buffer(true).parse((r, done) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => done(null, Buffer.concat(chunks)));
  });
  return { res, bytes: res.body as Buffer };
}

/** A CSV parsed the standard way: csv-parse, header row as the columns, the BOM dropped. */
function csvRows(bytes: Buffer): { header: string[]; rows: Row[] } {
  const records = parse(bytes, { bom: true }) as string[][];
  const [header, ...rest] = records;
  return { header, rows: rest.map((r) => Object.fromEntries(header.map((h, i) => [h, r[i]]))) };
}

const MONEY = /^-?\d+\.\d{2}$/;
/** "123.45" -> 12345, "-0.05" -> -5: integer cents from the decimal string, no float. */
function cents(text: string): number {
  expect(text).toMatch(MONEY);
  const negative = text.startsWith('-');
  const [whole, fraction] = text.replace('-', '').split('.');
  const n = Number(whole) * 100 + Number(fraction);
  return negative ? -n : n;
}
/** 14479 -> "144.79", by string, for expected texts. */
const dollars = (c: number) => `${String(c).padStart(3, '0').slice(0, -2)}.${String(c).padStart(3, '0').slice(-2)}`;
const total = (rows: Row[], column: string) => rows.reduce((a, r) => a + cents(r[column]), 0);

async function unzip(bytes: Buffer) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'guyline-export-'));
  const file = path.join(dir, 'export.zip');
  fs.writeFileSync(file, bytes);
  // Debian's unzip: `-t` tests every entry's CRC, `-d` extracts.
  await run('unzip', ['-tq', file]);
  await run('unzip', ['-q', file, '-d', path.join(dir, 'out')]);
  const files = new Map<string, Buffer>();
  const walk = (d: string, prefix: string) => {
    for (const e of fs.readdirSync(d, { withFileTypes: true })) {
      if (e.isDirectory()) walk(path.join(d, e.name), `${prefix}${e.name}/`);
      else files.set(`${prefix}${e.name}`, fs.readFileSync(path.join(d, e.name)));
    }
  };
  walk(path.join(dir, 'out'), '');
  fs.rmSync(dir, { recursive: true, force: true });
  return files;
}

/** Pays a checkout on the card fake's page without a browser, as the payer would. */
async function payOnFake(checkoutId: string) {
  const checkout = (await CardCheckout.findByPk(checkoutId))!;
  const res = await fetch(`${inject('cardFakeUrl')}/_fake/sessions/${checkout.stripeSessionId}/pay`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ cardNumber: '4242424242424242', expiry: '12/34', cvc: '123' }),
  });
  expect(((await res.json()) as { outcome: string }).outcome).toBe('succeeded');
}

/**
 * A company's month of money, made through the API: deposits, balances, an additional-charges
 * invoice paid from the security deposit, a card payment partly refunded and paid again, credit
 * notes (one settling an invoice, one becoming account credit paid back), a payment dated last
 * January, a void invoice and an open one. Two tax rates.
 */
async function buildBooks() {
  const c = await buildCompany();
  const customer = await buildCustomer(c.organization.id, { name: 'Rosalind Oakhurst', email: uniqueEmail('books') });
  const tent = await buildItem(c.organization.id, { name: '20x30 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 30, quantityOwned: 50, rentalPriceCents: 45_000 });
  const [office, owner, bookkeeper, crew] = await Promise.all([as(c.office), as(c.owner), as(c.bookkeeper), as(c.crew)]);
  const booking = async (date: string, taxRateBp: number) =>
    (await office.post('/api/bookings', bookingBody(customer.id, date, [{ itemId: tent.id, quantity: 1, unitPriceCents: 45_000, description: '20x30 pole tent' }], { taxRateBp, damageWaiver: false }))).body;
  const issue = async (bookingId: string, body: Record<string, unknown>) => {
    const draft = await office.post(`/api/bookings/${bookingId}/invoices`, body);
    expect(draft.status).toBe(201);
    const done = await office.post(`/api/invoices/${draft.body.id}/issue`);
    expect(done.status).toBe(200);
    return done.body as { id: string; number: string; totalCents: number };
  };
  const pay = async (body: Record<string, unknown>) => {
    const r = await office.post('/api/payments', body);
    expect(r.status).toBe(201);
    return r.body as { id: string };
  };

  const a = await booking('2027-09-18', 725);
  const b = await booking('2027-10-02', 825);
  const aDeposit = await issue(a.id, { kind: 'deposit' });
  await pay({ method: 'check', reference: 'Check 2201', invoiceId: aDeposit.id, amountCents: aDeposit.totalCents });
  const aBalance = await issue(a.id, { kind: 'balance' });
  await pay({ method: 'cash', invoiceId: aBalance.id, amountCents: 20_000 });
  const settlingNote = await office.post(`/api/invoices/${aBalance.id}/credit-notes`, { amountCents: aBalance.totalCents - 20_000, reason: 'Chairs not needed after all' });
  expect(settlingNote.status).toBe(201);
  const damage = await issue(a.id, {
    kind: 'additional',
    lines: [
      { charge: 'damage', description: '20 ft sidewall, torn panel', amountCents: 8_500 },
      { charge: 'cleaning', description: '=Tent top washed, "sap" and mud', amountCents: 15_000 },
    ],
  });
  expect((await office.post(`/api/bookings/${a.id}/security-deposit`, { action: 'collect', amountCents: 30_000, method: 'check' })).status).toBe(201);
  expect((await office.post(`/api/bookings/${a.id}/security-deposit`, { action: 'apply', amountCents: damage.totalCents, invoiceId: damage.id })).status).toBe(201);

  // A card payment of the whole deposit, a tenth refunded (the invoice owes again), then paid in cash.
  const bDeposit = await issue(b.id, { kind: 'deposit' });
  const checkout = await office.post(`/api/invoices/${bDeposit.id}/checkout`, {});
  expect(checkout.status).toBe(201);
  await payOnFake(checkout.body.checkoutId);
  await expect.poll(async () => (await Invoice.findByPk(bDeposit.id))!.status, { timeout: 20_000 }).toBe('paid');
  const card = (await Payment.findOne({ where: { bookingId: b.id, method: 'card' } }))!;
  const refund = await owner.post(`/api/payments/${card.id}/refunds`, { amountCents: 1_000, reason: '-2 chairs, fewer guests' });
  expect(refund.status).toBe(201);
  await expect.poll(async () => (await Refund.findByPk(refund.body.id))!.status, { timeout: 20_000 }).toBe('succeeded');
  expect((await Invoice.findByPk(bDeposit.id))!.status).toBe('partly_paid');
  await pay({ method: 'cash', invoiceId: bDeposit.id, amountCents: 1_000 });

  // Paid last January (a transfer recorded late), 50.00 over and kept as the customer's credit, on
  // the balance invoice issued the week before (a payment is never received before its invoice).
  const today = dateInZone(new Date(), TZ);
  const lastJanuary = `${Number(today.slice(0, 4)) - 1}-01-15`;
  const bBalanceDraft = await office.post(`/api/bookings/${b.id}/invoices`, { kind: 'balance' });
  expect(bBalanceDraft.status).toBe(201);
  await withTransaction((t) => issueInvoice(c.office, bBalanceDraft.body.id, null, t, { at: zonedTimeToInstant(addDays(lastJanuary, -7), '10:00', TZ), email: false }));
  const bBalance = (await office.get(`/api/invoices/${bBalanceDraft.body.id}`)).body as { id: string; number: string; totalCents: number };
  await pay({ method: 'transfer', reference: 'Wire 7781', invoiceId: bBalance.id, amountCents: bBalance.totalCents + 5_000, keepExcessAsCredit: true, receivedAt: `${lastJanuary}T18:00:00Z` });
  // A credit note on a paid invoice becomes account credit; part of the credit goes back by check.
  const creditNote = await office.post(`/api/invoices/${aDeposit.id}/credit-notes`, { amountCents: 2_000, reason: 'Goodwill for the late delivery' });
  expect(creditNote.status).toBe(201);
  expect((await owner.post(`/api/customers/${customer.id}/credit/refunds`, { amountCents: 1_500, method: 'check', reason: 'Paid back by check 1043' })).status).toBe(201);

  const voided = await issue(b.id, { kind: 'additional', lines: [{ charge: 'late_return', description: 'Billed in error', amountCents: 4_000 }] });
  expect((await owner.post(`/api/invoices/${voided.id}/void`, { reason: 'Billed in error' })).status).toBe(200);
  const open = await issue(b.id, { kind: 'additional', lines: [{ charge: 'cleaning', description: 'Mud on sidewalls', amountCents: 3_000 }] });

  return {
    ...c, customer, office, owner, bookkeeper, crew, today, lastJanuary, a, b,
    invoices: { aDeposit, aBalance, damage, bDeposit, bBalance, voided, open, settlingNote: settlingNote.body, creditNote: creditNote.body },
  };
}

let books: Promise<Awaited<ReturnType<typeof buildBooks>>> | null = null;
/** One set of books for the read-only checks below (each is a fresh company; the tests only read it). */
const theBooks = () => (books ??= buildBooks());

const range = (from: string, to: string) => `from=${from}&to=${to}`;

describe('exports: who may run them and with what range', () => {
  it('401 -> 400 with field messages -> 403 for office and crew; the bookkeeper and the owner download', async () => {
    const s = await buildCompany();
    const anonymous = await new ApiClient(app).init();
    expect((await anonymous.get('/api/exports/journal.csv?from=2026-01-01&to=2026-01-31')).status).toBe(401);
    const bookkeeper = await as(s.bookkeeper);
    const missing = await bookkeeper.get('/api/exports/journal.csv');
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields).toMatchObject({ from: 'Enter the first day as YYYY-MM-DD.', to: 'Enter the last day as YYYY-MM-DD.' });
    const backwards = await bookkeeper.get('/api/exports/paid-invoices.csv?from=2026-02-01&to=2026-01-31');
    expect(backwards.status).toBe(400);
    expect(backwards.body.error.fields.to).toBe('The last day must be on or after the first day.');
    // 30 February is not a day (a well-formed string is not enough).
    const impossible = await bookkeeper.get('/api/exports/payments.csv?from=2026-02-30&to=2026-03-01');
    expect(impossible.status).toBe(400);
    expect(impossible.body.error.fields.from).toMatch(/YYYY-MM-DD/);
    expect((await bookkeeper.get('/api/exports/trial-balance.csv?at=31-01-2026')).body.error.fields.at).toMatch(/YYYY-MM-DD/);
    expect((await bookkeeper.get('/api/exports/receivables/count?from=2026-01-01&to=2026-01-31')).status).toBe(400);
    for (const url of ['/api/exports/journal.csv', '/api/exports/paid-invoices.csv', '/api/exports/invoices.zip', '/api/exports/ubl.zip', '/api/exports/journal/count']) {
      for (const who of [s.office, s.crew]) expect((await (await as(who)).get(`${url}?${range('2026-01-01', '2026-01-31')}`)).status).toBe(403);
    }
    expect((await (await as(s.crew)).get('/api/exports/history')).status).toBe(403);
    expect((await (await as(s.office)).get('/api/exports/trial-balance.csv?at=2026-01-31')).status).toBe(403);
    // Nothing refused left a history row.
    expect(await ExportRun.count({ where: { organizationId: s.organization.id } })).toBe(0);
    const owner = await as(s.owner);
    const ok = await download(owner, `/api/exports/journal.csv?${range('2026-01-01', '2026-01-31')}`);
    expect(ok.res.status).toBe(200);
    expect(ok.res.headers['content-disposition']).toBe('attachment; filename="journal_2026-01-01_2026-01-31.csv"');
    expect(ok.res.headers['x-content-type-options']).toBe('nosniff');
    expect(ok.res.headers['cache-control']).toBe('no-store');
    // RFC 4180 §3: text/csv, with the header parameter saying the first line is a header.
    expect(ok.res.headers['content-type']).toBe('text/csv; charset=utf-8; header=present');
    // An empty range still has its header row (RFC 4180 §2 rule 3), after the UTF-8 BOM.
    expect(ok.bytes.subarray(0, 3)).toEqual(Buffer.from([0xef, 0xbb, 0xbf]));
    expect(csvRows(ok.bytes).rows).toHaveLength(0);
    expect(csvRows(ok.bytes).header[0]).toBe('Date');
  });
});

describe('exports read back to the same numbers as the books', () => {
  it('paid invoices: paid in full in the range, by the day they were paid; parts by revenue account and tax by rate; credit notes negative', async () => {
    const s = await theBooks();
    const { res, bytes } = await download(s.bookkeeper, `/api/exports/paid-invoices.csv?${range(s.today, s.today)}`);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toBe(`attachment; filename="paid-invoices_${s.today}_${s.today}.csv"`);
    // RFC 4180 §2 rule 1: every record ends with CRLF; no bare LF anywhere in this file.
    const text = bytes.toString('utf8');
    expect(text.endsWith('\r\n')).toBe(true);
    expect(text.replace(/\r\n/g, '').includes('\n')).toBe(false);
    const { header, rows } = csvRows(bytes);
    expect(header).toEqual([
      'Number', 'Type', 'Credits invoice', 'Issue date', 'Paid date', 'Customer', 'Booking',
      '4000 Rental revenue', '4100 Delivery and labor revenue', '4200 Damage waiver revenue', '4300 Damage recovery',
      'Discount', 'Sales tax 7.25%', 'Sales tax 8.25%', 'Total', 'Currency', 'Payment methods and references',
    ]);
    const i = s.invoices;
    const expected = [i.aDeposit.number, i.aBalance.number, i.damage.number, i.bDeposit.number, i.settlingNote.number, i.creditNote.number];
    expect(rows.map((r) => r.Number).sort()).toEqual(expected.sort());
    // B's balance was paid last January: it is in that month's file, on that day.
    const january = csvRows((await download(s.bookkeeper, `/api/exports/paid-invoices.csv?${range(s.lastJanuary.slice(0, 8) + '01', s.lastJanuary.slice(0, 8) + '31')}`)).bytes).rows;
    expect(january.map((r) => [r.Number, r['Paid date']])).toEqual([[i.bBalance.number, s.lastJanuary]]);

    const db = await Invoice.findAll({ where: { organizationId: s.organization.id, number: { [Op.in]: expected } } });
    expect(db).toHaveLength(expected.length);
    for (const inv of db) {
      const row = rows.find((r) => r.Number === inv.number)!;
      // A credit note's amounts read as minus (+ 0 turns JavaScript's -0 into 0).
      const sign = (n: number) => (inv.kind === 'credit_note' ? -n : n) + 0;
      const rate = inv.bookingId === s.a.id ? 'Sales tax 7.25%' : 'Sales tax 8.25%';
      const other = inv.bookingId === s.a.id ? 'Sales tax 8.25%' : 'Sales tax 7.25%';
      expect({
        rental: cents(row['4000 Rental revenue']), delivery: cents(row['4100 Delivery and labor revenue']), waiver: cents(row['4200 Damage waiver revenue']),
        damage: cents(row['4300 Damage recovery']), tax: cents(row[rate]), otherTax: cents(row[other]), total: cents(row.Total), discount: row.Discount,
      }).toEqual({
        rental: sign(inv.rentalCents), delivery: sign(inv.deliveryLaborCents), waiver: sign(inv.damageWaiverCents), damage: sign(inv.damageCents),
        tax: sign(inv.taxCents), otherTax: 0, total: sign(inv.totalCents), discount: '0.00',
      });
      // The parts add up to the total in every row.
      expect(cents(row['4000 Rental revenue']) + cents(row['4100 Delivery and labor revenue']) + cents(row['4200 Damage waiver revenue']) + cents(row['4300 Damage recovery']) + cents(row[rate])).toBe(cents(row.Total));
      expect(row['Issue date']).toBe(inv.issueDate);
      expect(row['Paid date']).toBe(s.today);
      expect(row.Customer).toBe('Rosalind Oakhurst');
      expect(row.Currency).toBe('USD');
    }
    const byNumber = (n: string) => rows.find((r) => r.Number === n)!;
    expect(byNumber(i.aDeposit.number)['Payment methods and references']).toBe('check Check 2201');
    expect(byNumber(i.aBalance.number)['Payment methods and references']).toBe(`cash; credit note ${i.settlingNote.number}`);
    expect(byNumber(i.damage.number)['Payment methods and references']).toBe('security deposit');
    expect(byNumber(i.bDeposit.number)['Payment methods and references']).toMatch(/^card pi_\w+; cash$/);
    expect(byNumber(i.settlingNote.number)).toMatchObject({ Type: 'Credit note', 'Credits invoice': i.aBalance.number });
    // The damage invoice: 150.00 cleaning x 7.25% = 10.875 -> 10.88 (rounded half up once per invoice, SSUTA §324); damage untaxed.
    expect(byNumber(i.damage.number)).toMatchObject({ '4300 Damage recovery': '85.00', '4100 Delivery and labor revenue': '150.00', 'Sales tax 7.25%': '10.88', Total: '245.88' });
    // The count the screen shows progress against is the number of rows.
    expect((await s.bookkeeper.get(`/api/exports/paid-invoices/count?${range(s.today, s.today)}`)).body).toEqual({ kind: 'paid-invoices', rows: rows.length, bytes: null });
  });

  it('invoice lines: every line of the invoices issued in the range with its account; each invoice’s lines add up to its total', async () => {
    const s = await theBooks();
    const { bytes } = await download(s.owner, `/api/exports/invoice-lines.csv?${range(s.today, s.today)}`);
    // RFC 4180 §2 rules 6-7: a field with a comma and quotes is enclosed in quotes, its quotes doubled.
    expect(bytes.toString('utf8')).toContain('"Cleaning: =Tent top washed, ""sap"" and mud"');
    const { rows } = csvRows(bytes);
    const issued = await Invoice.findAll({ where: { organizationId: s.organization.id, status: { [Op.notIn]: ['draft', 'void'] }, issueDate: s.today } });
    expect(new Set(rows.map((r) => r['Invoice number']))).toEqual(new Set(issued.map((i) => i.number)));
    expect(rows.some((r) => r['Invoice number'] === s.invoices.voided.number)).toBe(false);
    expect(rows.filter((r) => r['Invoice number'] === s.invoices.open.number).map((r) => r.Status)).toContain('Open');
    for (const inv of issued) {
      const mine = rows.filter((r) => r['Invoice number'] === inv.number);
      expect(mine).toHaveLength(inv.lines.length);
      expect(total(mine, 'Amount')).toBe((inv.kind === 'credit_note' ? -1 : 1) * inv.totalCents);
    }
    const accountOf = Object.fromEntries(rows.map((r) => [r.Category, `${r['Account code']} ${r['Account name']}`]));
    expect(accountOf).toMatchObject({ rental: '4000 Rental revenue', delivery_labor: '4100 Delivery and labor revenue', damage: '4300 Damage recovery', tax: '2200 Sales tax payable' });
    expect(rows.map((r) => r.Description)).toContain('Cleaning: =Tent top washed, "sap" and mud');
  });

  it('payments and refunds: one row each, with method, reference and the card processor’s ids and fee; fees unknown are empty', async () => {
    const s = await theBooks();
    const { rows } = csvRows((await download(s.bookkeeper, `/api/exports/payments.csv?${range(s.today, s.today)}`)).bytes);
    const payments = await Payment.findAll({ where: { organizationId: s.organization.id } });
    const today = payments.filter((p) => dateInZone(p.receivedAt, TZ) === s.today);
    expect(rows.filter((r) => r.Type === 'Payment')).toHaveLength(today.length);
    for (const p of today) {
      const row = rows.find((r) => r.Type === 'Payment' && cents(r.Amount) === p.amountCents && r.Method === { cash: 'cash', check: 'check', transfer: 'bank transfer', card: 'card', security_deposit: 'security deposit', credit: 'account credit' }[p.method])!;
      expect(row).toBeTruthy();
      expect(row['Card payment id']).toBe(p.stripePaymentIntentId ?? '');
      expect(row.Fee).toBe(p.feeCents === null ? '' : dollars(p.feeCents));
      if (p.method !== 'card') expect(row.Fee).toBe('');
    }
    const card = rows.find((r) => r.Type === 'Payment' && r.Method === 'card')!;
    // The card fake's fee: 2.9% + 30¢ rounded to the cent (Stripe pricing page, standard US card rate, from memory).
    expect(card.Fee).toBe(dollars(Math.round((cents(card.Amount) * 29) / 1000) + 30));
    expect(card['Card payment id']).toMatch(/^pi_/);
    expect(card['Card charge id']).toMatch(/^ch_/);
    const refund = rows.find((r) => r.Type === 'Refund')!;
    expect(refund).toMatchObject({ Amount: '-10.00', Method: 'card', Status: 'Refunded', 'Card payment id': card['Card payment id'] });
    // A note that starts like a spreadsheet formula (here a minus) is kept as text (OWASP, "CSV Injection").
    expect(refund.Note).toBe("'-2 chairs, fewer guests");
    expect(refund['Card refund id']).toMatch(/^re_/);
    expect(rows.find((r) => r.Type === 'Security deposit received')).toMatchObject({ Amount: '300.00', Method: 'check' });
    expect(rows.find((r) => r.Type === 'Account credit paid back')).toMatchObject({ Amount: '-15.00', Method: 'check' });
    expect(rows.find((r) => r.Method === 'check' && r.Type === 'Payment')).toMatchObject({ Reference: 'Check 2201', Invoices: `${s.invoices.aDeposit.number} ${dollars(s.invoices.aDeposit.totalCents)}` });
    // The late transfer is in last January's file, with the part kept as credit.
    const january = csvRows((await download(s.bookkeeper, `/api/exports/payments.csv?${range(s.lastJanuary, s.lastJanuary)}`)).bytes).rows;
    expect(january).toHaveLength(1);
    expect(january[0]).toMatchObject({ Type: 'Payment', Method: 'bank transfer', Reference: 'Wire 7781', 'Kept as account credit': '50.00', Date: s.lastJanuary });
    expect(cents(january[0].Amount)).toBe(s.invoices.bBalance.totalCents + 5_000);
    expect((await s.bookkeeper.get(`/api/exports/payments/count?${range(s.today, s.today)}`)).body.rows).toBe(rows.length);
  });

  it('the journal of any range balances, line by line as in the ledger, with stable entry numbers 1..n; the trial balance sums to zero', async () => {
    const s = await theBooks();
    const ledger = await sequelize.query<{ entry_number: string; code: string; debit_cents: number; credit_cents: number; day: string }>(
      `SELECT e.entry_number::text, a.code, l.debit_cents, l.credit_cents, to_char(e.occurred_at AT TIME ZONE :tz, 'YYYY-MM-DD') AS day
         FROM journal_entries e JOIN journal_lines l ON l.entry_id = e.id JOIN accounts a ON a.id = l.account_id WHERE e.organization_id = :org`,
      { replacements: { org: s.organization.id, tz: TZ }, type: QueryTypes.SELECT },
    );
    const numbers = [...new Set(ledger.map((l) => Number(l.entry_number)))].sort((x, y) => x - y);
    expect(numbers).toEqual(Array.from({ length: numbers.length }, (_, k) => k + 1));
    for (const [from, to] of [[s.today, s.today], [s.lastJanuary, s.lastJanuary], [`${s.lastJanuary.slice(0, 4)}-01-01`, addDays(s.today, 1)], [addDays(s.today, 1), addDays(s.today, 30)]]) {
      const { rows } = csvRows((await download(s.bookkeeper, `/api/exports/journal.csv?${range(from, to)}`)).bytes);
      const inRange = ledger.filter((l) => l.day >= from && l.day <= to);
      expect(rows).toHaveLength(inRange.length);
      // Balanced: sum of debits = sum of credits, compared as whole cents.
      expect(total(rows, 'Debit')).toBe(total(rows, 'Credit'));
      expect(total(rows, 'Debit')).toBe(inRange.reduce((a, l) => a + Number(l.debit_cents), 0));
      const key = (n: string, code: string, d: number, c: number) => `${n}|${code}|${d}|${c}`;
      expect(rows.map((r) => key(r['Entry number'], r['Account code'], cents(r.Debit), cents(r.Credit))).sort()).toEqual(
        inRange.map((l) => key(l.entry_number, l.code, Number(l.debit_cents), Number(l.credit_cents))).sort(),
      );
      expect((await s.bookkeeper.get(`/api/exports/journal/count?${range(from, to)}`)).body.rows).toBe(rows.length);
    }
    const { rows: today } = csvRows((await download(s.bookkeeper, `/api/exports/journal.csv?${range(s.today, s.today)}`)).bytes);
    expect(today.find((r) => r['Source document'] === s.invoices.damage.number)).toMatchObject({ Entry: 'Invoice issued', Source: 'invoice' });
    expect(today.find((r) => r['Source document'] === 'Check 2201')).toMatchObject({ Entry: 'Payment received', 'Account code': '1000' });
    const voidedEntry = today.find((r) => r.Entry === 'Reversal')!;
    expect(voidedEntry['Source document']).toBe(s.invoices.voided.number);
    expect(Number(voidedEntry['Reverses entry'])).toBeLessThan(Number(voidedEntry['Entry number']));

    const tb = await download(s.bookkeeper, `/api/exports/trial-balance.csv?at=${s.today}`);
    expect(tb.res.headers['content-disposition']).toBe(`attachment; filename="trial-balance_${s.today}.csv"`);
    const { rows: accounts } = csvRows(tb.bytes);
    expect(total(accounts, 'Debit')).toBe(total(accounts, 'Credit'));
    expect(total(accounts, 'Balance')).toBe(0);
    const fromLedger = await trialBalance(s.organization.id, s.today);
    expect(accounts.map((r) => [r['Account code'], cents(r.Debit), cents(r.Credit)])).toEqual(fromLedger.accounts.map((a) => [a.code, a.debitCents, a.creditCents]));
    expect(total(accounts, 'Debit')).toBe(fromLedger.totalDebitCents);
  });

  it('the ZIP of PDFs holds exactly the paid invoices’, credit notes’ and receipts’ stored PDFs, named by number', async () => {
    const s = await theBooks();
    const count = (await s.bookkeeper.get(`/api/exports/invoices/count?${range(s.today, s.today)}`)).body;
    const { res, bytes } = await download(s.bookkeeper, `/api/exports/invoices.zip?${range(s.today, s.today)}`);
    expect(res.headers['content-type']).toBe('application/zip');
    expect(res.headers['content-disposition']).toBe(`attachment; filename="invoices_${s.today}_${s.today}.zip"`);
    const files = await unzip(bytes);
    const paid = await Invoice.findAll({
      where: { organizationId: s.organization.id, number: { [Op.in]: [s.invoices.aDeposit, s.invoices.aBalance, s.invoices.damage, s.invoices.bDeposit, s.invoices.settlingNote, s.invoices.creditNote].map((i) => i.number) } },
    });
    const docs = await Document.findAll({ where: { id: paid.map((p) => p.documentId!) } });
    const payments = await sequelize.query<{ receipt_document_id: string }>(
      `SELECT DISTINCT p.receipt_document_id FROM payments p JOIN payment_allocations a ON a.payment_id = p.id WHERE a.invoice_id IN (:ids)`,
      { replacements: { ids: paid.map((p) => p.id) }, type: QueryTypes.SELECT },
    );
    const receipts = await Document.findAll({ where: { id: payments.map((p) => p.receipt_document_id) } });
    const expected = new Map<string, string>([
      ...docs.map((d) => [`${d.kind === 'credit_note' ? 'credit-notes' : 'invoices'}/${d.number}.pdf`, d.sha256] as const),
      ...receipts.map((d) => [`receipts/${d.number}.pdf`, d.sha256] as const),
    ]);
    expect([...files.keys()].sort()).toEqual([...expected.keys()].sort());
    for (const [name, data] of files) {
      expect(data.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      expect(createHash('sha256').update(data).digest('hex')).toBe(expected.get(name));
    }
    // Invoice files are named by the invoice number.
    expect(files.has(`invoices/${s.invoices.aDeposit.number}.pdf`)).toBe(true);
    expect(count.rows).toBe(files.size);
    // Files are stored, not recompressed: the size known ahead is within a few hundred bytes.
    expect(Math.abs(count.bytes - bytes.length)).toBeLessThan(200 * files.size);
    const runs = (await s.bookkeeper.get('/api/exports/history')).body;
    const zipRun = runs.data.find((r: { kind: string; status: string }) => r.kind === 'invoices');
    expect(zipRun).toMatchObject({ status: 'ok', rows: files.size, bytes: bytes.length, from: s.today, to: s.today });
  });

  it('UBL 2.1: each paid invoice as an Invoice, each credit note as a CreditNote, elements in the schema’s order', async () => {
    const s = await theBooks();
    const { create } = await import('xmlbuilder2');
    const files = await unzip((await download(s.bookkeeper, `/api/exports/ubl.zip?${range(s.today, s.today)}`)).bytes);
    const numbers = [s.invoices.aDeposit, s.invoices.aBalance, s.invoices.damage, s.invoices.bDeposit, s.invoices.settlingNote, s.invoices.creditNote].map((i) => `${i.number}.xml`);
    expect([...files.keys()].sort()).toEqual(numbers.sort());
    const childNames = (node: { childNodes: ArrayLike<{ nodeType: number; nodeName: string }> }) => Array.from(node.childNodes).filter((n) => n.nodeType === 1).map((n) => n.nodeName);
    const read = (name: string) => create(files.get(name)!.toString('utf8')).root().node as unknown as Element;

    // OASIS UBL 2.1, xsd/maindoc/UBL-Invoice-2.1.xsd, InvoiceType's sequence (the part of it used here, in order).
    const INVOICE_ORDER = [
      'cbc:UBLVersionID', 'cbc:ID', 'cbc:IssueDate', 'cbc:DueDate', 'cbc:InvoiceTypeCode', 'cbc:Note', 'cbc:DocumentCurrencyCode',
      'cac:AccountingSupplierParty', 'cac:AccountingCustomerParty', 'cac:PrepaidPayment', 'cac:TaxTotal', 'cac:LegalMonetaryTotal', 'cac:InvoiceLine',
    ];
    // OASIS UBL 2.1, xsd/maindoc/UBL-CreditNote-2.1.xsd, CreditNoteType's sequence (CreditNoteTypeCode after TaxPointDate, no DueDate).
    const CREDIT_NOTE_ORDER = [
      'cbc:UBLVersionID', 'cbc:ID', 'cbc:IssueDate', 'cbc:CreditNoteTypeCode', 'cbc:Note', 'cbc:DocumentCurrencyCode', 'cac:BillingReference',
      'cac:AccountingSupplierParty', 'cac:AccountingCustomerParty', 'cac:TaxTotal', 'cac:LegalMonetaryTotal', 'cac:CreditNoteLine',
    ];
    const inOrder = (names: string[], order: string[]) => {
      const positions = names.map((n) => order.indexOf(n));
      expect(positions.every((p) => p >= 0)).toBe(true);
      expect(positions).toEqual([...positions].sort((x, y) => x - y));
    };

    const invoice = read(`${s.invoices.damage.number}.xml`);
    expect(invoice.localName).toBe('Invoice');
    // OASIS UBL 2.1: the Invoice document namespace and the common basic/aggregate component namespaces.
    expect(invoice.namespaceURI).toBe('urn:oasis:names:specification:ubl:schema:xsd:Invoice-2');
    expect(invoice.lookupNamespaceURI('cbc')).toBe('urn:oasis:names:specification:ubl:schema:xsd:CommonBasicComponents-2');
    expect(invoice.lookupNamespaceURI('cac')).toBe('urn:oasis:names:specification:ubl:schema:xsd:CommonAggregateComponents-2');
    const names = childNames(invoice);
    inOrder(names, INVOICE_ORDER);
    // UBL 2.1 InvoiceType: ID, IssueDate, AccountingSupplierParty, AccountingCustomerParty, LegalMonetaryTotal and InvoiceLine are required.
    for (const required of ['cbc:ID', 'cbc:IssueDate', 'cac:AccountingSupplierParty', 'cac:AccountingCustomerParty', 'cac:LegalMonetaryTotal', 'cac:InvoiceLine']) expect(names).toContain(required);
    const text = (el: Element, tag: string) => el.getElementsByTagName(tag)[0]?.textContent;
    const db = (await Invoice.findByPk(s.invoices.damage.id))!;
    expect(text(invoice, 'cbc:ID')).toBe(db.number);
    // UN/CEFACT code list 1001: 380 commercial invoice, 381 credit note.
    expect(text(invoice, 'cbc:InvoiceTypeCode')).toBe('380');
    const monetary = invoice.getElementsByTagName('cac:LegalMonetaryTotal')[0];
    // cac:LegalMonetaryTotal (MonetaryTotalType): LineExtensionAmount, TaxExclusiveAmount, TaxInclusiveAmount, PrepaidAmount, PayableAmount, in that order.
    expect(childNames(monetary)).toEqual(['cbc:LineExtensionAmount', 'cbc:TaxExclusiveAmount', 'cbc:TaxInclusiveAmount', 'cbc:PrepaidAmount', 'cbc:PayableAmount']);
    expect(cents(text(monetary, 'cbc:TaxInclusiveAmount')!)).toBe(db.totalCents);
    expect(cents(text(monetary, 'cbc:TaxExclusiveAmount')!)).toBe(db.totalCents - db.taxCents);
    expect(cents(text(monetary, 'cbc:PayableAmount')!)).toBe(0);
    expect(monetary.getElementsByTagName('cbc:PayableAmount')[0].getAttribute('currencyID')).toBe('USD');
    expect(cents(text(invoice.getElementsByTagName('cac:TaxTotal')[0], 'cbc:TaxAmount')!)).toBe(db.taxCents);
    const lines = Array.from(invoice.getElementsByTagName('cac:InvoiceLine'));
    expect(lines.reduce((a, l) => a + cents(text(l, 'cbc:LineExtensionAmount')!), 0)).toBe(db.totalCents - db.taxCents);
    // cac:InvoiceLine (InvoiceLineType): ID, InvoicedQuantity, LineExtensionAmount, Item, Price.
    expect(childNames(lines[0])).toEqual(['cbc:ID', 'cbc:InvoicedQuantity', 'cbc:LineExtensionAmount', 'cac:Item', 'cac:Price']);
    expect(text(invoice.getElementsByTagName('cac:AccountingCustomerParty')[0], 'cbc:Name')).toBe('Rosalind Oakhurst');

    const note = read(`${s.invoices.settlingNote.number}.xml`);
    expect(note.localName).toBe('CreditNote');
    expect(note.namespaceURI).toBe('urn:oasis:names:specification:ubl:schema:xsd:CreditNote-2');
    inOrder(childNames(note), CREDIT_NOTE_ORDER);
    expect(text(note, 'cbc:CreditNoteTypeCode')).toBe('381');
    expect(text(note.getElementsByTagName('cac:BillingReference')[0], 'cbc:ID')).toBe(s.invoices.aBalance.number);
    expect(cents(text(note.getElementsByTagName('cac:LegalMonetaryTotal')[0], 'cbc:PayableAmount')!)).toBe(s.invoices.aBalance.totalCents - 20_000);
  });
});

describe('exports and other companies', () => {
  it('a bookkeeper sees only their own company: rows, files and history', async () => {
    const s = await theBooks();
    const other = await buildCompany();
    const customer = await buildCustomer(other.organization.id, { name: 'Tobias Quillfeather' });
    const office = await as(other.office);
    const bookingRes = await office.post('/api/bookings', bookingBody(customer.id, '2027-06-05', [{ itemId: null, quantity: 1, unitPriceCents: 20_000, description: 'Chairs', kind: 'fee' }], { taxRateBp: 0, damageWaiver: false }));
    const draft = await office.post(`/api/bookings/${bookingRes.body.id}/invoices`, { kind: 'balance' });
    const inv = (await office.post(`/api/invoices/${draft.body.id}/issue`)).body;
    await office.post('/api/payments', { method: 'cash', invoiceId: inv.id, amountCents: inv.totalCents });
    const theirs = await as(other.bookkeeper);
    const paid = csvRows((await download(theirs, `/api/exports/paid-invoices.csv?${range(s.today, s.today)}`)).bytes).rows;
    expect(paid.map((r) => r.Customer)).toEqual(['Tobias Quillfeather']);
    const journal = csvRows((await download(theirs, `/api/exports/journal.csv?${range('2020-01-01', addDays(s.today, 1))}`)).bytes).rows;
    expect(journal.length).toBeGreaterThan(0);
    expect(journal.every((r) => r.Customer === 'Tobias Quillfeather')).toBe(true);
    expect(total(journal, 'Debit')).toBe(total(journal, 'Credit'));
    const files = await unzip((await download(theirs, `/api/exports/invoices.zip?${range(s.today, s.today)}`)).bytes);
    expect([...files.keys()].filter((f) => f.startsWith('invoices/'))).toEqual([`invoices/${inv.number}.pdf`]);
    const history = (await theirs.get('/api/exports/history?pageSize=200')).body;
    const ours = await ExportRun.findAll({ where: { organizationId: s.organization.id }, attributes: ['id'] });
    expect(ours.length).toBeGreaterThan(0);
    expect(history.data.some((r: { id: string }) => ours.some((o) => o.id === r.id))).toBe(false);
    expect(history.total).toBe(3);
  });
});

describe('export history', () => {
  it('lists who ran what, newest first, paginated, with rows and bytes', async () => {
    const s = await buildCompany();
    const bookkeeper = await as(s.bookkeeper);
    const owner = await as(s.owner);
    await download(bookkeeper, `/api/exports/journal.csv?${range('2026-01-01', '2026-01-31')}`);
    await download(owner, '/api/exports/trial-balance.csv?at=2026-01-31');
    const first = await download(bookkeeper, `/api/exports/payments.csv?${range('2026-02-01', '2026-02-28')}`);
    const page1 = await bookkeeper.get('/api/exports/history?pageSize=2');
    expect(page1.body.total).toBe(3);
    expect(page1.body.data.map((r: { kind: string }) => r.kind)).toEqual(['payments', 'trial-balance']);
    expect(page1.body.data[0]).toMatchObject({ status: 'ok', rows: 0, bytes: first.bytes.length, by: 'Test bookkeeper', from: '2026-02-01', to: '2026-02-28', filename: 'payments_2026-02-01_2026-02-28.csv' });
    expect(page1.body.data[1]).toMatchObject({ from: null, to: '2026-01-31', by: 'Test owner', filename: 'trial-balance_2026-01-31.csv' });
    const page2 = await bookkeeper.get('/api/exports/history?pageSize=2&page=2');
    expect(page2.body.data.map((r: { kind: string }) => r.kind)).toEqual(['journal']);
    expect((await bookkeeper.get('/api/exports/history?page=0')).body.error.fields.page).toBe('Pages start at 1.');
  });

  it('the screen’s Cancel marks the person’s own run cancelled even after the server finished it; a failed run stays failed; others get 404 or 403', async () => {
    const s = await buildCompany();
    const bookkeeper = await as(s.bookkeeper);
    const owner = await as(s.owner);
    const done = await download(bookkeeper, `/api/exports/journal.csv?${range('2026-01-01', '2026-01-31')}`);
    const runId = done.res.headers['x-export-run'] as string;
    // The history row closes just after the last byte.
    await expect.poll(async () => (await ExportRun.findByPk(runId))!.status).toBe('ok');
    // Not the bookkeeper's run: the owner of the same company, the crew, another company's bookkeeper, a made-up id.
    expect((await owner.post(`/api/exports/history/${runId}/cancel`)).status).toBe(404);
    expect((await (await as(s.crew)).post(`/api/exports/history/${runId}/cancel`)).status).toBe(403);
    const other = await buildCompany();
    expect((await (await as(other.bookkeeper)).post(`/api/exports/history/${runId}/cancel`)).status).toBe(404);
    expect((await bookkeeper.post('/api/exports/history/00000000-0000-4000-8000-000000000000/cancel')).status).toBe(404);
    expect((await bookkeeper.post('/api/exports/history/not-an-id/cancel')).status).toBe(400);
    expect((await ExportRun.findByPk(runId))!.status).toBe('ok');
    const cancelled = await bookkeeper.post(`/api/exports/history/${runId}/cancel`);
    expect(cancelled.status).toBe(204);
    const row = (await ExportRun.findByPk(runId))!;
    expect(row.status).toBe('aborted');
    // What was sent stays on the record.
    expect(Number(row.byteCount)).toBe(done.bytes.length);
    const failed = await ExportRun.create({ organizationId: s.organization.id, userId: s.bookkeeper.id, kind: 'journal', fromDate: '2026-01-01', toDate: '2026-01-31', status: 'failed', finishedAt: new Date() });
    expect((await bookkeeper.post(`/api/exports/history/${failed.id}/cancel`)).status).toBe(204);
    expect((await ExportRun.findByPk(failed.id))!.status).toBe('failed');
    const history = await bookkeeper.get('/api/exports/history');
    expect(history.body.data.find((r: { id: string }) => r.id === runId).status).toBe('aborted');
  });

  it('a run left saying running by a server that stopped (no process holds its lock) reads as failed in the history', async () => {
    const s = await buildCompany();
    const bookkeeper = await as(s.bookkeeper);
    // What a killed server leaves: the row, and no connection holding its lock.
    const orphan = await ExportRun.create({ organizationId: s.organization.id, userId: s.bookkeeper.id, kind: 'journal', fromDate: '2026-01-01', toDate: '2026-01-31', startedAt: new Date(Date.now() - 60_000) });
    const other = await buildCompany();
    const othersOrphan = await ExportRun.create({ organizationId: other.organization.id, userId: other.bookkeeper.id, kind: 'journal', fromDate: '2026-01-01', toDate: '2026-01-31' });
    const history = await bookkeeper.get('/api/exports/history');
    expect(history.status).toBe(200);
    expect(history.body.data.find((r: { id: string }) => r.id === orphan.id)).toMatchObject({ status: 'failed', error: 'The server stopped during this export; the file was not finished.', finishedAt: expect.any(String) });
    // Another company's rows are left to its own people's history.
    expect((await ExportRun.findByPk(othersOrphan.id))!.status).toBe('running');
  });

  it('a download the browser stops half way is marked aborted, with what was sent so far', async () => {
    const s = await buildCompany();
    // A long journal: 20,000 balanced entries with long memos (about 20 MB of CSV), more than the sockets between here and the server hold.
    await sequelize.transaction(async (t) => {
      const { ensureChart } = await import('../../../server/ledger/chart');
      await ensureChart(s.organization.id, t);
    });
    await sequelize.query(
      `WITH acc AS (SELECT (SELECT id FROM accounts WHERE organization_id = :org AND system_key = 'cash_on_hand') AS cash,
                           (SELECT id FROM accounts WHERE organization_id = :org AND system_key = 'accounts_receivable') AS ar),
            e AS (INSERT INTO journal_entries (organization_id, occurred_at, kind, memo)
                  SELECT :org, timestamptz '2025-06-01 12:00Z' + g * interval '1 minute', 'payment_received', 'Bulk payment ' || g || ' ' || repeat('stake and ballast ', 20)
                    FROM generate_series(1, 20000) g RETURNING id)
       INSERT INTO journal_lines (organization_id, entry_id, position, account_id, debit_cents, credit_cents)
       SELECT :org, e.id, p.pos, CASE p.pos WHEN 0 THEN acc.cash ELSE acc.ar END, CASE p.pos WHEN 0 THEN 100 ELSE 0 END, CASE p.pos WHEN 0 THEN 0 ELSE 100 END
         FROM e CROSS JOIN acc CROSS JOIN (VALUES (0), (1)) p(pos)`,
      { replacements: { org: s.organization.id } },
    );
    const bookkeeper = await as(s.bookkeeper);
    const server = app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    try {
      const { port } = server.address() as { port: number };
      const login = await fetch(`http://127.0.0.1:${port}/api/auth/login`, {
        method: 'POST', headers: { 'Content-Type': 'application/json', 'X-Forwarded-For': uniqueIp() }, body: JSON.stringify({ email: s.bookkeeper.email, password: TEST_PASSWORD }),
      });
      expect(login.status).toBe(200);
      const cookie = login.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
      const controller = new AbortController();
      const res = await fetch(`http://127.0.0.1:${port}/api/exports/journal.csv?${range('2025-01-01', '2025-12-31')}`, { headers: { cookie }, signal: controller.signal });
      expect(res.status).toBe(200);
      const runId = res.headers.get('x-export-run')!;
      const reader = res.body!.getReader();
      const first = await reader.read();
      expect(first.done).toBe(false);
      // While it runs, its process holds the run's lock: the history says running.
      const during = await bookkeeper.get('/api/exports/history');
      expect(during.body.data.find((r: { id: string }) => r.id === runId).status).toBe('running');
      controller.abort();
      await expect.poll(async () => (await ExportRun.findByPk(runId))!.status, { timeout: 60_000 }).toBe('aborted');
      const row = (await ExportRun.findByPk(runId))!;
      expect(row.finishedAt).toBeTruthy();
      expect(Number(row.rowCount)).toBeGreaterThan(0);
      expect(Number(row.rowCount)).toBeLessThan(40_000);
      // The whole range counted, for the screen's progress bar: two lines per entry.
      expect((await bookkeeper.get(`/api/exports/journal/count?${range('2025-01-01', '2025-12-31')}`)).body.rows).toBe(40_000);
    } finally {
      // Keep-alive sockets (the sign-in's) would hold close() open until they time out.
      server.closeAllConnections();
      await new Promise((r) => server.close(r));
    }
    // Inserting 20,000 entries through the ledger's commit-time checks takes a while on a busy machine.
  }, 120_000);
});
