/**
 * Formulas in the CSV exports: every text cell of every CSV (names, codes, references, notes,
 * labels, header titles) that starts with =, +, -, @, tab or carriage return gets a leading
 * apostrophe, which spreadsheets read as "text"; amounts never do, so "-10.00" stays a number.
 * Source: OWASP, "CSV Injection" page (the characters and the apostrophe); OWASP ASVS 5.0,
 * V1.2.10 (the same characters). CSV read per RFC 4180 with csv-parse.
 */
import { parse } from 'csv-parse/sync';
import { QueryTypes } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { addDays, dateInZone } from '../../../shared/dates';
import { CSRF_HEADER } from '../../../shared/types';
import { createApp } from '../../../server/app';
import { sequelize } from '../../../server/db';
import type { User } from '../../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient } from '../../support';

const app = createApp();
const TZ = 'America/Chicago';
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const put = (c: ApiClient, url: string, body: unknown) => c.agent.put(url).set('X-Forwarded-For', c.ip).set(CSRF_HEADER, c.csrf).send(body as object);

const FORMULA_START = /^[=+\-@\t\r]/;
const MONEY = /^-?\d+\.\d{2}$/;
const HYPERLINK = '=HYPERLINK("http://example.test/pay","Pay here")';

/** The amount columns of each export, by title (the paid-invoices account columns start with the code). */
const AMOUNT_COLUMNS: Record<string, (title: string) => boolean> = {
  'paid-invoices': (t) => /^\d+ /.test(t) || t === 'Discount' || t.startsWith('Sales tax ') || t === 'Total',
  'invoice-lines': (t) => t === 'Amount',
  payments: (t) => ['Amount', 'Kept as account credit', 'Fee'].includes(t),
  journal: (t) => t === 'Debit' || t === 'Credit',
  'trial-balance': (t) => ['Debit', 'Credit', 'Balance'].includes(t),
};

async function download(client: ApiClient, url: string) {
  const res = await client.agent.get(url).set('X-Forwarded-For', client.ip).buffer(true).parse((r, done) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => done(null, Buffer.concat(chunks)));
  });
  expect(res.status).toBe(200);
  const [header, ...rows] = parse(res.body as Buffer, { bom: true }) as string[][];
  return { header, rows: rows.map((r) => Object.fromEntries(header.map((h, i) => [h, r[i]]))) };
}

describe('formulas in the CSV exports', () => {
  it('a code starting like a formula is refused with a 400 naming the field; the database refuses it too', async () => {
    const c = await buildCompany();
    const owner = await as(c.owner);
    const accounts = (await owner.get('/api/ledger/accounts')).body.data as { id: string; code: string; systemKey: string }[];
    const rental = accounts.find((a) => a.systemKey === 'rental_revenue')!;
    for (const code of ['-4000', '+4000', '=4000', '@4000']) {
      const res = await put(owner, `/api/ledger/accounts/${rental.id}`, { code, name: 'Rental revenue' });
      expect([res.status, Object.keys(res.body.error.fields)]).toEqual([400, ['code']]);
      expect(res.body.error.fields.code).toBe('Start the code with a digit or a letter: a code cannot start with -, +, = or @.');
    }
    // A hyphen inside a code is still fine.
    expect((await put(owner, `/api/ledger/accounts/${rental.id}`, { code: '4000-R', name: 'Rental revenue' })).status).toBe(200);
    await expect(sequelize.query(`UPDATE accounts SET code = '-4000' WHERE id = :id`, { replacements: { id: rental.id }, type: QueryTypes.UPDATE })).rejects.toThrow(/accounts_code_not_formula/);
  });

  it('every text cell of every CSV is defused, account names and customers included; amounts never are', async () => {
    const c = await buildCompany();
    const customer = await buildCustomer(c.organization.id, { name: HYPERLINK });
    const tent = await buildItem(c.organization.id, { name: '30x40 frame tent', kind: 'tent', tentType: 'frame', widthFt: 30, lengthFt: 40, quantityOwned: 3, rentalPriceCents: 90_000 });
    const [owner, office, books] = await Promise.all([as(c.owner), as(c.office), as(c.bookkeeper)]);

    // The owner names accounts like formulas: the revenue the paid invoices and lines use, the cash the payments go to, the tax.
    const accounts = (await owner.get('/api/ledger/accounts')).body.data as { id: string; code: string; systemKey: string }[];
    const names: Record<string, string> = { rental_revenue: '=HYPERLINK("http://example.test/r","Rental")', cash_on_hand: '@SUM(1+1)', sales_tax_payable: '+1+1', customer_deposits: '-Deposits held' };
    for (const [key, name] of Object.entries(names)) {
      const account = accounts.find((a) => a.systemKey === key)!;
      expect((await put(owner, `/api/ledger/accounts/${account.id}`, { code: account.code, name })).status).toBe(200);
    }

    const booking = (await office.post('/api/bookings', bookingBody(customer.id, addDays(dateInZone(new Date(), TZ), 40), [{ itemId: tent.id, quantity: 1, unitPriceCents: 90_000 }], { taxRateBp: 725 }))).body;
    const issue = async (body: Record<string, unknown>) => {
      const draft = await office.post(`/api/bookings/${booking.id}/invoices`, body);
      return (await office.post(`/api/invoices/${draft.body.id}/issue`)).body as { id: string; totalCents: number };
    };
    const deposit = await issue({ kind: 'deposit' });
    expect((await office.post('/api/payments', { method: 'cash', reference: '=2+5', invoiceId: deposit.id, amountCents: deposit.totalCents })).status).toBe(201);
    const balance = await issue({ kind: 'balance' });
    const part = await office.post('/api/payments', { method: 'cash', reference: '+1 555 0100', invoiceId: balance.id, amountCents: 2_000 });
    expect((await owner.post(`/api/payments/${part.body.id}/refunds`, { amountCents: 1_000, reason: '-2 chairs, fewer guests' })).status).toBe(201);
    expect((await office.post(`/api/bookings/${booking.id}/security-deposit`, { action: 'collect', amountCents: 20_000, method: 'cash' })).status).toBe(201);
    expect((await owner.post(`/api/bookings/${booking.id}/security-deposit`, { action: 'refund', amountCents: 20_000, method: 'cash', reason: '@returned in full' })).status).toBe(201);

    const today = dateInZone(new Date(), TZ);
    const files = {
      'paid-invoices': await download(books, `/api/exports/paid-invoices.csv?from=${today}&to=${today}`),
      'invoice-lines': await download(books, `/api/exports/invoice-lines.csv?from=${today}&to=${today}`),
      payments: await download(books, `/api/exports/payments.csv?from=${today}&to=${today}`),
      journal: await download(books, `/api/exports/journal.csv?from=${today}&to=${today}`),
      'trial-balance': await download(books, `/api/exports/trial-balance.csv?at=${today}`),
    };

    let negativeAmounts = 0;
    for (const [kind, { header, rows }] of Object.entries(files)) {
      expect(rows.length, kind).toBeGreaterThan(0);
      for (const title of header) expect(title, `${kind} header`).not.toMatch(FORMULA_START);
      for (const row of rows) {
        for (const [column, cell] of Object.entries(row)) {
          if (AMOUNT_COLUMNS[kind](column)) {
            // Amounts as they are: never an apostrophe, a minus sign kept.
            if (!(kind === 'payments' && column === 'Fee' && cell === '')) expect(cell, `${kind} ${column}`).toMatch(MONEY);
            if (cell.startsWith('-')) negativeAmounts += 1;
          } else {
            expect(cell, `${kind} ${column}`).not.toMatch(FORMULA_START);
          }
        }
      }
    }
    expect(negativeAmounts).toBeGreaterThan(0);

    const defused = (text: string) => `'${text}`;
    expect(files['paid-invoices'].rows.map((r) => r.Customer)).toEqual([defused(HYPERLINK)]);
    expect(files['paid-invoices'].header).toContain(`${accounts.find((a) => a.systemKey === 'rental_revenue')!.code} ${names.rental_revenue}`);
    expect(new Set(files['invoice-lines'].rows.map((r) => r.Customer))).toEqual(new Set([defused(HYPERLINK)]));
    expect(files['invoice-lines'].rows.find((r) => r.Category === 'rental')!['Account name']).toBe(defused(names.rental_revenue));
    expect(files['invoice-lines'].rows.find((r) => r.Category === 'tax')!['Account name']).toBe(defused(names.sales_tax_payable));
    const payments = files.payments.rows;
    expect(payments.find((r) => r.Type === 'Payment' && r.Reference === defused('=2+5'))).toBeTruthy();
    expect(payments.find((r) => r.Type === 'Refund')).toMatchObject({ Amount: '-10.00', Reference: defused('+1 555 0100'), Note: defused('-2 chairs, fewer guests'), Customer: defused(HYPERLINK) });
    expect(payments.find((r) => r.Type === 'Security deposit returned')).toMatchObject({ Amount: '-200.00', Note: defused('@returned in full') });
    const journal = files.journal.rows;
    expect(journal.find((r) => r['Source document'] === defused('=2+5'))).toBeTruthy();
    expect(new Set(journal.filter((r) => r.Customer).map((r) => r.Customer))).toEqual(new Set([defused(HYPERLINK)]));
    expect(journal.filter((r) => r['Account name'] === defused(names.cash_on_hand)).length).toBeGreaterThan(0);
    expect(journal.filter((r) => r['Account name'] === defused(names.customer_deposits)).length).toBeGreaterThan(0);
    const tb = files['trial-balance'].rows;
    for (const key of ['cash_on_hand', 'sales_tax_payable', 'customer_deposits']) expect(tb.map((r) => r['Account name'])).toContain(defused(names[key]));
  });
});
