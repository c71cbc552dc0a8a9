/**
 * The Exports screen in the browser: quick picks, a streamed download saved as a file that parses
 * back (csv-parse; RFC 4180), a slow download with its progress bar cancelled half way (the
 * history then says so), and dates in the wrong order refused in words with what was typed kept.
 */
import fs from 'node:fs';
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { dateInZone } from '../../shared/dates';
import { createApp } from '../../server/app';
import { sequelize } from '../../server/db';
import { ensureChart } from '../../server/ledger/chart';
import { ExportRun, type User } from '../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../factories';
import { ApiClient } from '../support';
import { appUrl, sharedBrowser, signIn } from './browser';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);

const browser = sharedBrowser();

describe('the Exports screen', () => {
  it('the bookkeeper picks this month, downloads the paid invoices as a file that parses back, and sees it in the history', { timeout: 120_000 }, async () => {
    const company = await buildCompany();
    const customer = await buildCustomer(company.organization.id, { name: 'Marisol Vantongeren' });
    const tent = await buildItem(company.organization.id, { name: '20x20 frame tent', kind: 'tent', tentType: 'frame', widthFt: 20, lengthFt: 20, quantityOwned: 5, rentalPriceCents: 60_000 });
    const office = await as(company.office);
    const booking = (await office.post('/api/bookings', bookingBody(customer.id, '2027-07-10', [{ itemId: tent.id, quantity: 1, unitPriceCents: 60_000, description: '20x20 frame tent' }], { taxRateBp: 725, damageWaiver: false }))).body;
    const draft = (await office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'balance' })).body;
    const invoice = (await office.post(`/api/invoices/${draft.id}/issue`)).body;
    expect((await office.post('/api/payments', { method: 'check', reference: 'Check 5120', invoiceId: invoice.id, amountCents: invoice.totalCents })).status).toBe(201);

    const context = await browser().newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
    const page = await context.newPage();
    await signIn(page, company.bookkeeper.email, TEST_PASSWORD);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Exports' }).click();
    await page.getByRole('heading', { level: 1, name: 'Exports' }).waitFor();
    await page.getByText('Nothing exported yet.').waitFor();

    const today = dateInZone(new Date(), 'America/Chicago');
    await page.getByRole('button', { name: 'This month' }).click();
    expect(await page.getByLabel('First day').inputValue()).toBe(`${today.slice(0, 7)}-01`);
    expect(await page.getByLabel('Last day').inputValue()).toBe(today);
    expect(await page.getByRole('button', { name: 'This month' }).getAttribute('aria-pressed')).toBe('true');

    const card = page.getByTestId('export-paid-invoices');
    const [download] = await Promise.all([page.waitForEvent('download'), card.getByRole('button', { name: 'Download' }).click()]);
    const filename = `paid-invoices_${today.slice(0, 7)}-01_${today}.csv`;
    expect(download.suggestedFilename()).toBe(filename);
    const bytes = fs.readFileSync((await download.path())!);
    const [header, ...rows] = parse(bytes, { bom: true }) as string[][];
    expect(header.slice(0, 5)).toEqual(['Number', 'Type', 'Credits invoice', 'Issue date', 'Paid date']);
    expect(rows.map((r) => [r[0], r[5]])).toEqual([[invoice.number, 'Marisol Vantongeren']]);
    expect(rows[0][header.indexOf('Total')]).toBe(`${String(invoice.totalCents).slice(0, -2)}.${String(invoice.totalCents).slice(-2)}`);
    await card.getByText(`Saved ${filename}`).waitFor();
    await card.getByText('1 row').waitFor();

    const history = page.getByRole('table', { name: 'Export history' });
    await history.getByRole('row', { name: /Paid invoices/ }).getByText('Finished').waitFor();
    expect(await history.getByRole('row', { name: /Paid invoices/ }).getByText('Test bookkeeper').isVisible()).toBe(true);
    await context.close();
  });

  it('a long journal shows its progress and can be cancelled; the history says cancelled', { timeout: 120_000 }, async () => {
    const company = await buildCompany();
    await sequelize.transaction((t) => ensureChart(company.organization.id, t));
    // 3,000 balanced entries with long memos: about 3 MB of journal, sent slowly below.
    await sequelize.query(
      `WITH acc AS (SELECT (SELECT id FROM accounts WHERE organization_id = :org AND system_key = 'cash_on_hand') AS cash,
                           (SELECT id FROM accounts WHERE organization_id = :org AND system_key = 'accounts_receivable') AS ar),
            e AS (INSERT INTO journal_entries (organization_id, occurred_at, kind, memo)
                  SELECT :org, timestamptz '2025-03-01 12:00Z' + g * interval '1 hour', 'payment_received', 'Bulk payment ' || g || ' ' || repeat('sidewall and stakes ', 18)
                    FROM generate_series(1, 3000) g RETURNING id)
       INSERT INTO journal_lines (organization_id, entry_id, position, account_id, debit_cents, credit_cents)
       SELECT :org, e.id, p.pos, CASE p.pos WHEN 0 THEN acc.cash ELSE acc.ar END, CASE p.pos WHEN 0 THEN 2500 ELSE 0 END, CASE p.pos WHEN 0 THEN 0 ELSE 2500 END
         FROM e CROSS JOIN acc CROSS JOIN (VALUES (0), (1)) p(pos)`,
      { replacements: { org: company.organization.id } },
    );

    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signIn(page, company.bookkeeper.email, TEST_PASSWORD);
    await page.goto(`${appUrl()}/app/exports?from=2025-01-01&to=2025-12-31`);
    await page.getByRole('heading', { level: 1, name: 'Exports' }).waitFor();
    expect(await page.getByLabel('First day').inputValue()).toBe('2025-01-01');
    // A slow line (256 KB/s, Chrome DevTools Protocol network emulation), so the download lasts long enough to watch and stop.
    const cdp = await context.newCDPSession(page);
    await cdp.send('Network.enable');
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 20, downloadThroughput: 256 * 1024, uploadThroughput: 256 * 1024 });

    const card = page.getByTestId('export-journal');
    await card.getByRole('button', { name: 'Download' }).click();
    const bar = card.getByRole('progressbar', { name: 'General journal download' });
    await bar.waitFor();
    // Rows arrive and the bar moves, against the 6,000 lines counted first.
    await expect.poll(async () => Number((await bar.getAttribute('aria-valuenow')) ?? 0), { timeout: 30_000 }).toBeGreaterThan(0);
    expect(await bar.getAttribute('aria-valuetext')).toMatch(/^[\d,]+ of 6,000 rows/);
    await card.getByRole('button', { name: 'Cancel' }).click();
    await card.getByText('Cancelled: nothing was saved.').waitFor();
    await expect.poll(async () => (await ExportRun.findOne({ where: { organizationId: company.organization.id } }))?.status, { timeout: 20_000 }).toBe('aborted');
    const history = page.getByRole('table', { name: 'Export history' });
    await history.getByRole('row', { name: /General journal/ }).getByText('Cancelled').waitFor({ timeout: 15_000 });
    await context.close();
  });

  it('dates in the wrong order are refused in words; what was typed stays; nothing is sent', { timeout: 60_000 }, async () => {
    const company = await buildCompany();
    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signIn(page, company.owner.email, TEST_PASSWORD);
    // On a phone.
    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto(`${appUrl()}/app/exports`);
    await page.getByRole('heading', { level: 1, name: 'Exports' }).waitFor();
    await page.getByLabel('First day').fill('2026-03-31');
    await page.getByLabel('Last day').fill('2026-03-01');
    await page.getByText('The last day must be on or after the first day.').waitFor();
    await page.getByTestId('export-journal').getByRole('button', { name: 'Download' }).click();
    await page.getByText('Fix the dates above, then download.').waitFor();
    expect(await page.getByLabel('First day').inputValue()).toBe('2026-03-31');
    expect(await page.getByLabel('Last day').inputValue()).toBe('2026-03-01');
    expect(await ExportRun.count({ where: { organizationId: company.organization.id } })).toBe(0);
    await context.close();
  });
});
