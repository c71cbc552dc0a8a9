import { describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { appUrl, sharedBrowser, signIn } from './browser';

const browser = sharedBrowser();

// What each demo role must see in the main navigation (the mail inbox shows while the fakes run).
const expected: Record<string, string[]> = {
  'owner@demo.test': ['Home', 'Day sheets', 'Bookings', 'Invoices', 'Exports', 'Reports', 'Customers', 'Catalog', 'Users', 'Company settings', 'Mail inbox'],
  // The demo's caught mail holds live sign-in links: the owner's only.
  'office@demo.test': ['Home', 'Day sheets', 'Bookings', 'Invoices', 'Customers', 'Catalog'],
  'crew@demo.test': ['Home', 'Day sheets', 'Bookings', 'Customers', 'Catalog'],
  'books@demo.test': ['Home', 'Bookings', 'Invoices', 'Exports', 'Reports', 'Customers', 'Catalog'],
};

describe('signing in as each demo role', () => {
  for (const [email, links] of Object.entries(expected)) {
    it(`${email} sees ${links.join(', ')}`, async () => {
      const context = await browser().newContext({ viewport: { width: 1280, height: 800 } });
      const page = await context.newPage();
      await signIn(page, email, DEMO_PASSWORD);
      const nav = page.getByRole('navigation', { name: 'Main' });
      const names = (await nav.getByRole('link').allInnerTexts()).map((t) => t.trim()).filter(Boolean);
      expect(names).toEqual(links);
      await page.getByRole('heading', { level: 1 }).first().waitFor();
      expect(await page.getByRole('heading', { level: 1 }).count()).toBe(1);
      await context.close();
    });
  }

  it("Home's Overdue figure opens the overdue invoices, and their count is the same; the crew's Home has no money", async () => {
    const context = await browser().newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    await signIn(page, 'office@demo.test', DEMO_PASSWORD);
    const figures = page.getByRole('list', { name: 'Today’s figures' });
    const overdue = figures.getByRole('link', { name: /^Overdue/ });
    const note = (await overdue.innerText()).match(/(\d+) invoices? past/);
    expect(note).not.toBeNull();
    await overdue.click();
    await page.waitForURL(/\/app\/invoices\?status=overdue$/);
    await page.getByText(new RegExp(`^${note![1]} invoices?$`)).waitFor();
    await context.close();

    const crewContext = await browser().newContext({ viewport: { width: 1280, height: 800 } });
    const crewPage = await crewContext.newPage();
    await signIn(crewPage, 'crew@demo.test', DEMO_PASSWORD);
    const crewFigures = crewPage.getByRole('list', { name: 'Today’s figures' });
    await crewFigures.getByRole('link', { name: /^Stops today/ }).waitFor();
    expect(await crewFigures.getByText(/\$/).count()).toBe(0);
    await crewContext.close();
  });

  it('a signed-out visit to a page of the app goes to sign-in and comes back after', async () => {
    const context = await browser().newContext();
    const page = await context.newPage();
    await page.goto(`${appUrl()}/app/settings`);
    await page.waitForURL(/\/sign-in\?next=/);
    await page.getByLabel('E-mail').fill('owner@demo.test');
    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/app\/settings$/);
    await page.getByRole('heading', { level: 1, name: /Company settings/ }).waitFor();
    expect(page.url()).toMatch(/\/app\/settings$/);
    await context.close();
  });

  it('a wrong password shows the message and keeps what was typed', async () => {
    const context = await browser().newContext();
    const page = await context.newPage();
    await page.goto(`${appUrl()}/sign-in`);
    await page.getByLabel('E-mail').fill('office@demo.test');
    await page.getByLabel('Password').fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('E-mail or password is not right.').waitFor();
    expect(await page.getByLabel('E-mail').inputValue()).toBe('office@demo.test');
    await context.close();
  });
});
