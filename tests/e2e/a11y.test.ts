/**
 * axe-core on every main screen in Chromium: the office's screens on a laptop, the crew's day on a
 * phone, and the customer's own pages, the signing page and the pay page on a phone. No serious
 * or critical violation is allowed (axe's own impact levels). The rule set is axe's default: the
 * WCAG 2.0/2.1 A and AA rules and its best practices.
 */
import AxeBuilder from '@axe-core/playwright';
import type { BrowserContext, Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import type { User } from '../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../factories';
import { ApiClient, linkToken, uniqueEmail, uniqueIp, waitForMail } from '../support';
import { appUrl, sharedBrowser, signIn } from './browser';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);

const browser = sharedBrowser();

const LAPTOP = { viewport: { width: 1280, height: 900 } };
// A phone in portrait (CSS pixels), with its own client address so rate limits never cross tests.
const phone = () => browser().newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true, extraHTTPHeaders: { 'X-Forwarded-For': uniqueIp() } });

/** One company with a reserved booking that has an agreement out for signature, an issued deposit invoice with a payment, and crew on it. */
async function companyWithABooking() {
  const company = await buildCompany();
  const email = uniqueEmail('a11y');
  const customer = await buildCustomer(company.organization.id, { name: 'Rosalind Achterberg', email, phone: '555-0123' });
  const tent = await buildItem(company.organization.id, { name: '20x30 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 30, quantityOwned: 3, rentalPriceCents: 45_000, polesPerSetup: 6, stakesPerSetup: 18 });
  const chairs = await buildItem(company.organization.id, { name: 'White folding chair', kind: 'chair', quantityOwned: 200, rentalPriceCents: 200 });
  const office = await as(company.office);
  const eventDate = '2028-04-15';
  const deliveryDate = '2028-04-14';
  const created = await office.post('/api/bookings', bookingBody(customer.id, eventDate, [
    { itemId: tent.id, quantity: 1, unitPriceCents: 45_000, description: '20x30 pole tent' },
    { itemId: chairs.id, quantity: 60, unitPriceCents: 200, description: 'White folding chair' },
  ], { taxRateBp: 725, guestCount: 60, siteLine1: '14 Orchard Row', siteCity: 'Millbrook' }));
  expect(created.status).toBe(201);
  const booking = created.body as { id: string; reference: string };
  expect((await office.post(`/api/bookings/${booking.id}/status`, { status: 'reserved' })).status).toBe(200);
  const crew = await office.agent.put(`/api/field/bookings/${booking.id}/crew`).set('X-CSRF-Token', office.csrf).set('X-Forwarded-For', office.ip).send({ userIds: [company.crew.id] });
  expect(crew.status).toBe(200);

  const agreement = await office.post(`/api/bookings/${booking.id}/agreement`);
  expect(agreement.status).toBe(201);
  expect((await office.post(`/api/documents/${agreement.body.id}/signature-request`, {})).status).toBe(201);
  const signingMail = await waitForMail(email, { subject: /sign your rental agreement/i });
  const signLink = signingMail.text.match(/https?:\/\/\S+\/sign\/[A-Za-z0-9_-]+/)![0];

  const draft = await office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' });
  const deposit = await office.post(`/api/invoices/${draft.body.id}/issue`);
  expect(deposit.status).toBe(200);
  const invoiceMail = await waitForMail(email, { subject: new RegExp(deposit.body.number) });
  const payLink = invoiceMail.text.match(/https?:\/\/\S+\/pay\/[A-Za-z0-9._-]+/)![0];
  expect((await office.post('/api/payments', { method: 'check', reference: 'Check 2210', invoiceId: deposit.body.id, amountCents: 5_000 })).status).toBe(201);
  return { company, customer, email, tent, booking, deliveryDate, deposit: deposit.body as { id: string; number: string }, signLink, payLink };
}

let world: Awaited<ReturnType<typeof companyWithABooking>>;
beforeAll(async () => {
  world = await companyWithABooking();
}, 120_000);

/** What axe finds serious or critical on the page as it is now, one line per rule. */
async function seriousViolations(page: Page, screen: string): Promise<string[]> {
  // Colours are measured as they are now: let transitions (a button turning from disabled to
  // enabled, say) finish first, or axe measures a colour half way.
  await page.waitForFunction(() => document.getAnimations().every((a) => a.playState !== 'running' || a.effect?.getTiming().iterations === Infinity));
  const results = await new AxeBuilder({ page }).analyze();
  return results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${screen}: ${v.id} (${v.impact}) ${v.help} at ${v.nodes.slice(0, 5).map((n) => `${n.target.join(' ')} (${n.failureSummary?.split('\n')[1]?.trim() ?? ''})`).join(' | ')}`);
}

/** Opens a screen and waits until it has its heading and nothing more is loading. */
async function open(page: Page, path: string, heading?: string | RegExp) {
  await page.goto(`${appUrl()}${path}`);
  if (heading) await page.getByRole('heading', { level: 1, name: heading }).waitFor();
  else await page.locator('h1').first().waitFor();
  await page.waitForLoadState('networkidle');
}

async function checkScreens(context: BrowserContext, screens: [string, string][]) {
  const page = await context.newPage();
  const found: string[] = [];
  for (const [screen, path] of screens) {
    await open(page, path);
    found.push(...(await seriousViolations(page, screen)));
  }
  return found;
}

describe('axe on every main screen', () => {
  it('the signed-out pages and the office screens on a laptop', { timeout: 240_000 }, async () => {
    const context = await browser().newContext(LAPTOP);
    const found = await checkScreens(context, [
      ['Sign-in', '/sign-in'],
      ['Sign-up', '/sign-up'],
      ['Forgot password', '/forgot-password'],
    ]);
    const page = await context.newPage();
    await signIn(page, world.company.owner.email, TEST_PASSWORD);
    const w = world;
    found.push(...(await checkScreens(context, [
      ['Home', '/app'],
      ['Bookings', '/app/bookings'],
      ['Booking', `/app/bookings/${w.booking.id}`],
      ['New booking', '/app/bookings/new'],
      ['Calendar', '/app/bookings/calendar?month=2028-04'],
      ['Invoices', '/app/invoices'],
      ['Invoice', `/app/invoices/${w.deposit.id}`],
      ['Customers', '/app/customers'],
      ['Customer', `/app/customers/${w.customer.id}`],
      ['New customer', '/app/customers/new'],
      ['Statement', `/app/customers/${w.customer.id}/statement`],
      ['Catalog', '/app/catalog'],
      ['Item', `/app/catalog/${w.tent.id}?month=2028-04`],
      ['New item', '/app/catalog/new'],
      ['Users', '/app/users'],
      ['Company settings', '/app/settings'],
      ['Templates', '/app/settings/templates'],
      ['Template', '/app/settings/templates/rental-agreement'],
      ['Clauses', '/app/settings/clauses'],
      ['Accounts', '/app/settings/accounts'],
      ['Mail inbox', '/app/dev/mail'],
    ])));
    // A form showing its errors: the new customer sent empty.
    await open(page, '/app/customers/new', 'New customer');
    await page.getByRole('button', { name: 'Create customer' }).click();
    await page.getByText('Enter the customer name.').waitFor();
    found.push(...(await seriousViolations(page, 'New customer, with its errors')));
    // The booking page with the planner's answer open.
    await open(page, `/app/bookings/${w.booking.id}`);
    await page.getByRole('button', { name: 'Plan the tent' }).click();
    await page.getByRole('button', { name: /^Add these lines for / }).first().waitFor();
    found.push(...(await seriousViolations(page, 'Booking, planner open')));
    await context.close();
    expect(found).toEqual([]);
  });

  it("the crew's day on a phone", { timeout: 120_000 }, async () => {
    const context = await phone();
    const page = await context.newPage();
    await page.goto(`${appUrl()}/sign-in`);
    await page.getByLabel('E-mail').fill(world.company.crew.email);
    await page.getByLabel('Password').fill(TEST_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('button', { name: 'Menu' }).waitFor();
    const w = world;
    // The phone's menu, open.
    await page.getByRole('button', { name: 'Menu' }).click();
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Day sheets' }).waitFor();
    const found = await seriousViolations(page, 'Menu, open');
    found.push(...(await checkScreens(context, [
      ['Home (crew)', '/app'],
      ['Day sheets (today)', '/app/field'],
      ['Day sheet', `/app/field/days/${w.deliveryDate}`],
      ['Load list', `/app/field/days/${w.deliveryDate}/load-list`],
      ['Stop', `/app/field/bookings/${w.booking.id}`],
      ['Site check', `/app/field/bookings/${w.booking.id}/site-check`],
      ['Check-in', `/app/field/bookings/${w.booking.id}/check-in`],
      ['Calendar feed', '/app/field/calendar'],
    ])));
    await context.close();
    expect(found).toEqual([]);
  });

  it("the customer's own pages, the signing page and the pay page on a phone", { timeout: 120_000 }, async () => {
    const context = await phone();
    const page = await context.newPage();
    const found: string[] = [];
    await open(page, '/portal/sign-in', 'See your rentals');
    found.push(...(await seriousViolations(page, 'Portal sign-in')));
    await page.getByRole('textbox', { name: 'E-mail' }).fill(world.email);
    await page.getByRole('button', { name: 'E-mail me a sign-in link' }).click();
    await page.getByRole('heading', { name: 'Check your e-mail' }).waitFor();
    found.push(...(await seriousViolations(page, 'Portal sign-in, link sent')));
    const mail = await waitForMail(world.email, { subject: /sign-in link/i });
    await page.goto(`${appUrl()}/portal/welcome?token=${linkToken(mail, '/portal/welcome')}`);
    await page.waitForURL(/\/portal$/);
    found.push(...(await checkScreens(context, [
      ['Your rentals', '/portal'],
      ['Your booking', `/portal/bookings/${world.booking.id}`],
    ])));
    // The signing page: the disclosure, then, once consented, the agreement to initial and sign.
    const signing = await phone();
    const sign = await signing.newPage();
    await open(sign, new URL(world.signLink).pathname, 'Sign your rental agreement');
    found.push(...(await seriousViolations(sign, 'Signing page, disclosure')));
    // Consent waits until the PDF was opened.
    const pdf = signing.waitForEvent('page', { timeout: 5_000 }).catch(() => null);
    await sign.getByRole('link', { name: 'Open the agreement as a PDF' }).click();
    await (await pdf)?.close();
    await sign.getByRole('checkbox', { name: /I have opened the PDF and I agree/ }).check();
    await sign.getByRole('button', { name: 'I agree' }).click();
    await sign.getByRole('button', { name: /^Continue to/ }).first().waitFor();
    found.push(...(await seriousViolations(sign, 'Signing page, reading')));
    const initials = sign.getByRole('textbox', { name: /^Initials for / });
    while ((await initials.count()) === 0) await sign.getByRole('button', { name: /^Continue to/ }).first().click();
    found.push(...(await seriousViolations(sign, 'Signing page, initials')));
    for (const box of await initials.all()) await box.fill('RA');
    const fullName = sign.getByRole('textbox', { name: 'Full legal name' });
    while ((await fullName.count()) === 0) await sign.getByRole('button', { name: /^Continue to/ }).first().click();
    found.push(...(await seriousViolations(sign, 'Signing page, signature')));
    // The pay page, and its part-payment form.
    await open(sign, new URL(world.payLink).pathname);
    found.push(...(await seriousViolations(sign, 'Pay page')));
    await sign.getByRole('button', { name: 'Pay part of it' }).click();
    await sign.getByRole('textbox', { name: 'Amount to pay, in dollars' }).waitFor();
    found.push(...(await seriousViolations(sign, 'Pay page, part payment')));
    await signing.close();
    await context.close();
    expect(found).toEqual([]);
  });
});
