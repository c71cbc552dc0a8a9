import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll, inject } from 'vitest';

/** Debian's Chromium, headless, with the flags that work on these machines; never a downloaded browser. */
export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
      '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage',
    ],
  });
}

export const appUrl = () => inject('appUrl');

export async function signIn(page: Page, email: string, password: string) {
  await page.goto(`${appUrl()}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}

/**
 * One Chromium for a test file: launched before its tests, closed after them. Call at the top of
 * the file; the getter answers the running browser inside a test.
 */
export function sharedBrowser(): () => Browser {
  let browser: Browser | undefined;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });
  return () => {
    if (!browser) throw new Error('The browser is not running: call sharedBrowser() at the top of the test file.');
    return browser;
  };
}
