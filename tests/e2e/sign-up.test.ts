import { describe, expect, it } from 'vitest';
import { linkToken, uniqueEmail, waitForMail } from '../support';
import { appUrl, sharedBrowser } from './browser';

const browser = sharedBrowser();

describe('signing up a company', () => {
  it('the form says to check the e-mail; its link makes the company and opens the app as its owner', async () => {
    const context = await browser().newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    const email = uniqueEmail('browser-founder');
    await page.goto(`${appUrl()}/sign-up`);
    await page.getByLabel('Company name').fill('Hollow Oak Marquees');
    await page.getByLabel('Your name').fill('Ilse Brandt');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill('password123');
    await page.getByRole('button', { name: 'Create account' }).click();
    // A very common password is refused on its field.
    await page.getByText(/one of the most common/).first().waitFor();

    await page.getByLabel('Password').fill('marquee poles in the rain');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByRole('heading', { name: 'Check your e-mail' }).waitFor();
    expect(await page.getByText(email).count()).toBeGreaterThan(0);

    const token = linkToken(await waitForMail(email, { subject: /Finish creating Hollow Oak Marquees/ }), '/sign-up/confirm');
    await page.goto(`${appUrl()}/sign-up/confirm?token=${token}`);
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Users' }).count()).toBe(1);

    // The link works once.
    await page.goto(`${appUrl()}/sign-up/confirm?token=${token}`);
    await page.getByRole('heading', { name: 'This link no longer works' }).waitFor();
    await context.close();
  });
});
