/**
 * Closed books in the browser: the bookkeeper closes the books through a day on the Exports screen
 * (today refused in words, then a confirm), cannot move the date back, and the office's payment
 * dialog refuses a received day before the invoice's issue day and one in the closed period,
 * naming the day, with what was typed kept.
 */
import { describe, expect, it } from 'vitest';
import { addDays, dateInZone, zonedTimeToInstant } from '../../shared/dates';
import { createApp } from '../../server/app';
import { issueInvoice } from '../../server/commands/invoices';
import { withTransaction } from '../../server/db';
import { type User } from '../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../factories';
import { ApiClient } from '../support';
import { appUrl, sharedBrowser, signIn } from './browser';

const app = createApp();
const TZ = 'America/Chicago';
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
/** "Jun 12, 2027", as the screen writes a calendar day. */
const shown = (day: string) => new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeZone: 'UTC' }).format(new Date(`${day}T12:00:00Z`));

const browser = sharedBrowser();

describe('closed books', () => {
  it('the bookkeeper closes the books through a day with a confirm; the office cannot then date a payment in it', { timeout: 180_000 }, async () => {
    const t0 = dateInZone(new Date(), TZ);
    const company = await buildCompany();
    const customer = await buildCustomer(company.organization.id, { name: 'Ottoline Brack' });
    const tent = await buildItem(company.organization.id, { name: '20x30 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 30, quantityOwned: 4, rentalPriceCents: 45_000 });
    const office = await as(company.office);
    const booking = (await office.post('/api/bookings', bookingBody(customer.id, addDays(t0, 60), [{ itemId: tent.id, quantity: 1, unitPriceCents: 45_000 }]))).body;
    const draft = (await office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).body;
    const issuedOn = addDays(t0, -20);
    await withTransaction((t) => issueInvoice(company.office, draft.id, null, t, { at: zonedTimeToInstant(issuedOn, '10:00', TZ), email: false }));
    const closedThrough = addDays(t0, -5);

    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signIn(page, company.bookkeeper.email, TEST_PASSWORD);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Exports' }).click();
    const panel = page.getByRole('region', { name: 'Closed books' });
    await panel.getByText('No period is closed').waitFor();

    // Today: refused in words, the day kept.
    const day = panel.getByLabel('Close the books through', { exact: true });
    await day.fill(t0);
    await panel.getByRole('button', { name: 'Close the books…' }).click();
    await panel.getByText(`Close through yesterday (${addDays(t0, -1)}) at the latest`).waitFor();
    expect(await day.inputValue()).toBe(t0);
    expect(await day.getAttribute('aria-invalid')).toBe('true');

    // A day before yesterday: asked first, then closed.
    await day.fill(closedThrough);
    await panel.getByRole('button', { name: 'Close the books…' }).click();
    const confirm = page.getByRole('dialog', { name: `Close the books through ${shown(closedThrough)}?` });
    await confirm.getByRole('button', { name: 'Close the books' }).click();
    await confirm.waitFor({ state: 'hidden' });
    await panel.getByTestId('lock-date').getByText(shown(closedThrough)).waitFor();
    await panel.getByText(`The books are closed through ${shown(closedThrough)}.`).waitFor();

    // Back: the owner's; the bookkeeper is told so, the day kept.
    await day.fill(addDays(closedThrough, -10));
    await panel.getByRole('button', { name: 'Close the books…' }).click();
    await panel.getByText('Only the owner moves the date back').waitFor();
    expect(await day.inputValue()).toBe(addDays(closedThrough, -10));
    await context.close();

    // The office records a payment on the invoice: before its issue day, then in the closed period.
    const officeContext = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const officePage = await officeContext.newPage();
    await signIn(officePage, company.office.email, TEST_PASSWORD);
    await officePage.goto(`${appUrl()}/app/invoices/${draft.id}`);
    await officePage.getByRole('button', { name: 'Record a payment' }).click();
    const dialog = officePage.getByRole('dialog', { name: 'Record a payment' });
    await dialog.getByLabel('Method').selectOption('check');
    await dialog.getByLabel('Amount').fill('25.00');
    const received = dialog.getByLabel('Received at');
    await received.fill(`${addDays(issuedOn, -1)}T15:00`);
    await dialog.getByRole('button', { name: 'Record payment' }).click();
    await dialog.getByText(`The invoice was issued on ${issuedOn}: enter a day on or after it.`).waitFor();
    expect(await received.inputValue()).toBe(`${addDays(issuedOn, -1)}T15:00`);

    await received.fill(`${addDays(closedThrough, -1)}T15:00`);
    await dialog.getByRole('button', { name: 'Record payment' }).click();
    await dialog.getByText(`The books are closed through ${closedThrough}`).first().waitFor();
    expect(await received.getAttribute('aria-invalid')).toBe('true');
    expect(await received.inputValue()).toBe(`${addDays(closedThrough, -1)}T15:00`);
    expect(await dialog.getByLabel('Amount').inputValue()).toBe('25.00');

    await received.fill(`${addDays(closedThrough, 1)}T15:00`);
    await dialog.getByRole('button', { name: 'Record payment' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await officeContext.close();
  });
});
