/** What people see when access ends or is narrowed: a withdrawn pay link, and the crew's view of the company rules. */
import { describe, expect, it } from 'vitest';
import type { InvoiceRow } from '../../shared/schemas/invoices';
import { createApp } from '../../server/app';
import type { User } from '../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../factories';
import { ApiClient, uniqueEmail, uniqueIp, waitForMail } from '../support';
import { appUrl, sharedBrowser, signIn } from './browser';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);

const browser = sharedBrowser();

async function company() {
  const c = await buildCompany();
  const email = uniqueEmail('link-ends');
  const customer = await buildCustomer(c.organization.id, { name: 'Perpetua Lindqvist', email });
  const chairs = await buildItem(c.organization.id, { name: 'White folding chair', kind: 'chair', quantityOwned: 200, rentalPriceCents: 250 });
  const desk = await as(c.office);
  const booking = (await desk.post('/api/bookings', bookingBody(customer.id, '2027-09-11', [{ itemId: chairs.id, quantity: 60, unitPriceCents: 250, description: 'White folding chair' }], { taxRateBp: 0, damageWaiver: false, guestCount: 60 }))).body as { id: string; reference: string };
  return { ...c, email, desk, booking };
}

const context = () => browser().newContext({ viewport: { width: 1280, height: 900 }, extraHTTPHeaders: { 'X-Forwarded-For': uniqueIp() } });

describe('a withdrawn pay link', () => {
  it('the office withdraws an invoice’s pay links on the invoice page; the e-mailed link then tells the customer to ask for a new one', { timeout: 120_000 }, async () => {
    const c = await company();
    const draft = (await c.desk.post(`/api/bookings/${c.booking.id}/invoices`, { kind: 'deposit' })).body as InvoiceRow;
    const invoice = (await c.desk.post(`/api/invoices/${draft.id}/issue`)).body as InvoiceRow;
    const mailed = (await waitForMail(c.email, { subject: new RegExp(invoice.number!) })).text.match(/https?:\/\/\S+\/pay\/[A-Za-z0-9._-]+/)![0];

    const officeContext = await context();
    const office = await officeContext.newPage();
    await signIn(office, c.office.email, TEST_PASSWORD);
    await office.goto(`${appUrl()}/app/invoices/${invoice.id}`);
    const shown = await office.getByLabel(`Card payment link for ${invoice.number}`).inputValue();
    await office.getByRole('button', { name: 'Withdraw pay links' }).click();
    const dialog = office.getByRole('dialog', { name: 'Withdraw this invoice’s pay links?' });
    await dialog.getByRole('button', { name: 'Withdraw the links' }).click();
    await office.getByText('Every earlier pay link of this invoice has stopped working').waitFor();
    // The page shows a new link in place of the old one.
    await expect.poll(() => office.getByLabel(`Card payment link for ${invoice.number}`).inputValue()).not.toBe(shown);
    await officeContext.close();

    const customerContext = await context();
    const page = await customerContext.newPage();
    await page.goto(mailed);
    await page.getByRole('heading', { level: 1, name: 'This pay link no longer works' }).waitFor();
    await page.getByText(`${c.organization.name} has withdrawn this pay link. Ask ${c.organization.name} to send you a new one`).waitFor();
    await page.getByRole('link', { name: 'Sign in to your rentals' }).waitFor();
    await customerContext.close();
  });
});

describe('the crew and the company rules', () => {
  it('the crew reads the planning rules in Company settings and works a booking page, with no price anywhere', { timeout: 90_000 }, async () => {
    const c = await company();
    const crewContext = await context();
    const page = await crewContext.newPage();
    await signIn(page, c.crew.email, TEST_PASSWORD);

    await page.goto(`${appUrl()}/app/settings`);
    const rules = page.getByRole('definition').filter({ hasText: 'mph sustained: take tents down' });
    await rules.waitFor();
    expect(await page.getByText('Planning rules', { exact: true }).count()).toBeGreaterThan(0);
    expect(await page.getByText('Pricing and planning rules').count()).toBe(0);
    expect(await page.getByLabel('Sales tax rate (%)').count()).toBe(0);

    await page.goto(`${appUrl()}/app/bookings/${c.booking.id}`);
    await page.getByRole('heading', { level: 1, name: `Booking ${c.booking.reference}` }).waitFor();
    // The editor renders from the rules the crew was sent, and the planner still answers.
    await page.getByRole('button', { name: 'Plan the tent' }).click();
    await page.getByRole('heading', { name: 'Cautions' }).waitFor();
    expect(await page.locator('main').getByText(/\$\d/).count()).toBe(0);
    await crewContext.close();
  });
});
