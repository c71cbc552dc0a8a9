import AxeBuilder from '@axe-core/playwright';
import { describe, expect, it } from 'vitest';
import { addDays, dateInZone } from '../../shared/dates';
import { formatMoney } from '../../shared/money';
import type { AgingReport } from '../../shared/schemas/reports';
import type { InvoiceRow } from '../../shared/schemas/invoices';
import { createApp } from '../../server/app';
import { Invoice, type User } from '../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../factories';
import { ApiClient } from '../support';
import { appUrl, sharedBrowser, signIn } from './browser';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const usd = (cents: number) => formatMoney(cents, 'USD');

const browser = sharedBrowser();

async function companyWithDebts() {
  const c = await buildCompany();
  const today = dateInZone(new Date(), c.organization.timeZone);
  const office = await as(c.office);
  const customer = await buildCustomer(c.organization.id, { name: 'Bramblewood Garden Club' });
  const tent = await buildItem(c.organization.id, { name: '30x30 frame tent', kind: 'tent', tentType: 'frame', widthFt: 30, lengthFt: 30, quantityOwned: 2, rentalPriceCents: 80_000 });
  const booking = (await office.post('/api/bookings', bookingBody(customer.id, addDays(today, 60), [{ itemId: tent.id, quantity: 1, unitPriceCents: 80_000 }], { taxRateBp: 725, damageWaiver: false }))).body;
  const issue = async (kind: 'deposit' | 'balance') => {
    const draft = await office.post(`/api/bookings/${booking.id}/invoices`, { kind });
    return (await office.post(`/api/invoices/${draft.body.id}/issue`)).body as InvoiceRow;
  };
  // The clock moved through the data: the deposit fell due 45 days ago, the balance 5 days ago and is part paid.
  const deposit = await issue('deposit');
  await Invoice.update({ dueDate: addDays(today, -45) }, { where: { id: deposit.id } });
  const balance = await issue('balance');
  await Invoice.update({ dueDate: addDays(today, -5) }, { where: { id: balance.id } });
  expect((await office.post('/api/payments', { method: 'check', invoiceId: balance.id, amountCents: 20_000, reference: 'Check 311' })).status).toBe(201);
  return { ...c, customer, deposit, balance: (await office.get(`/api/invoices/${balance.id}`)).body as InvoiceRow };
}

describe('the Reports screen', () => {
  it('the owner opens Reports, reads the aging that agrees with the ledger, and clicks a figure through to its invoice', async () => {
    const s = await companyWithDebts();
    const owner = await as(s.owner);
    const aging = (await owner.get('/api/reports/aging')).body as AgingReport;

    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signIn(page, s.owner.email, TEST_PASSWORD);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Reports' }).click();
    await page.getByRole('heading', { level: 1, name: 'Reports' }).waitFor();
    await page.getByRole('heading', { level: 2, name: 'Receivables aging' }).waitFor();

    // The chart says in words what it draws; the table has the figures.
    const chart = page.getByRole('img', { name: /Owed by days past due/ });
    expect(await chart.getAttribute('aria-label')).toContain(`${usd(aging.totalCents)} owed`);
    const row = page.getByRole('row', { name: /Bramblewood Garden Club/ });
    await expect.poll(() => row.getByRole('button', { name: /31 to 60 days past due/ }).innerText()).toBe(usd(s.deposit.balanceCents));
    expect(await row.getByRole('button', { name: /1 to 30 days past due/ }).innerText()).toBe(usd(s.balance.balanceCents));
    expect(await page.getByTestId('aging-total').innerText()).toBe(usd(s.deposit.balanceCents + s.balance.balanceCents));
    // The total agrees with accounts receivable, and the note says so with the ledger's own figure.
    expect(await page.getByTestId('aging-check').innerText()).toContain('Agrees with the ledger');
    expect(await page.getByTestId('aging-check-ledger').innerText()).toBe(usd(aging.reconciliation.ledgerCents));

    // The 31–60 figure opens the invoice behind it; its number goes to the invoice page.
    await row.getByRole('button', { name: /31 to 60 days past due/ }).click();
    const drawer = page.getByRole('dialog', { name: /Invoices behind/ });
    await drawer.waitFor();
    expect(await drawer.getByRole('row', { name: new RegExp(s.deposit.number!) }).getByRole('cell').nth(2).innerText()).toBe('45');
    await drawer.getByRole('link', { name: s.deposit.number! }).click();
    await page.waitForURL(new RegExp(`/app/invoices/${s.deposit.id}$`));
    await page.getByRole('heading', { level: 1, name: new RegExp(s.deposit.number!) }).waitFor();
    await expect.poll(() => page.getByTestId('invoice-balance').innerText()).toBe(usd(s.deposit.balanceCents));
    await context.close();
  });

  it('the ledger check opens the journal entries behind accounts receivable, which add up to it', async () => {
    const s = await companyWithDebts();
    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signIn(page, s.bookkeeper.email, TEST_PASSWORD);
    await page.goto(`${appUrl()}/app/reports?tab=aging`);
    await page.getByTestId('aging-check-ledger').click();
    const drawer = page.getByRole('dialog', { name: /Entries behind/ });
    await drawer.getByTestId('entries-total').waitFor();
    const total = s.deposit.balanceCents + s.balance.balanceCents;
    // Two invoices issued and one payment: three entries.
    expect(await drawer.getByTestId('entries-total').innerText()).toBe(`3 entries, adding up to ${usd(total)}, the figure you opened.`);
    expect(await drawer.getByRole('link', { name: `Invoice ${s.deposit.number}` }).count()).toBe(1);
    await drawer.getByRole('button', { name: 'Close' }).click();
    await context.close();
  });

  it('other tabs keep their dates in the address, a period that ends before it starts is refused on its field, and every tab passes an axe check', async () => {
    const s = await companyWithDebts();
    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signIn(page, s.owner.email, TEST_PASSWORD);
    await page.goto(`${appUrl()}/app/reports?tab=stock`);
    await page.getByRole('heading', { level: 2, name: 'Stock utilization and payback' }).waitFor();
    await page.getByLabel('From', { exact: true }).fill('2027-05-02');
    await page.getByLabel('To', { exact: true }).fill('2027-05-01');
    await page.getByRole('button', { name: 'Show' }).click();
    // The shared schema's message, before anything is asked of the server.
    await page.getByText('The end date comes on or after the start date.').waitFor();
    expect(page.url()).not.toContain('from=');

    await page.getByRole('navigation', { name: 'Reports' }).getByRole('link', { name: 'Deposits held' }).click();
    await page.getByRole('heading', { level: 2, name: 'Deposits and security deposits held' }).waitFor();
    expect(page.url()).toMatch(/tab=deposits/);
    expect(await page.getByTestId('held-deposits-check').innerText()).toContain('Agrees with the ledger');

    // Every tab, with its chart or empty state, passes axe's WCAG 2.1 A and AA rules.
    for (const [tab, heading] of [
      ['Receivables aging', 'Receivables aging'], ['Deposits held', 'Deposits and security deposits held'], ['Sales tax', 'Sales tax collected'],
      ['Revenue', /^Revenue by month/], ['Stock and payback', 'Stock utilization and payback'], ['Shortfalls', 'Shortfalls: what to buy next'],
    ] as const) {
      await page.getByRole('navigation', { name: 'Reports' }).getByRole('link', { name: tab }).click();
      await page.getByRole('heading', { level: 2, name: heading }).waitFor();
      await page.getByText('Updating…').waitFor({ state: 'detached' });
      const results = await new AxeBuilder({ page }).include('#main').withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
      expect(results.passes.length, tab).toBeGreaterThan(0);
      expect(results.violations.map((v) => `${tab}: ${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)).toEqual([]);
    }
    await context.close();
  });

  it('the office and the crew are not shown Reports, and a direct visit says it is not part of their role', async () => {
    const s = await companyWithDebts();
    for (const user of [s.office, s.crew]) {
      const context = await browser().newContext();
      const page = await context.newPage();
      await signIn(page, user.email, TEST_PASSWORD);
      expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Reports' }).count()).toBe(0);
      await page.goto(`${appUrl()}/app/reports`);
      await page.getByRole('heading', { level: 1, name: 'Not part of your role' }).waitFor();
      await context.close();
    }
  });
});
