/**
 * The keyboard alone: Tab, Shift+Tab, typing, Enter and Escape, never the mouse. Every stop on
 * the way shows the focus ring; dialogs keep the focus inside (Tab from the last control comes
 * back to the first, Shift+Tab from the first goes to the last), Escape closes them and the focus
 * goes back to the button that opened them; forms are filled and sent with Enter. axe checks each
 * dialog while it is open (serious and critical violations, as tests/e2e/a11y.test.ts does).
 */
import AxeBuilder from '@axe-core/playwright';
import type { Locator, Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import type { User } from '../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../factories';
import { ApiClient, uniqueEmail } from '../support';
import { appUrl, sharedBrowser } from './browser';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);

const browser = sharedBrowser();

interface FocusStop {
  /** What has the focus, for messages: tag and visible name. */
  label: string;
  /** The page itself (or the browser's own toolbar) has it: nothing in the document. */
  onPage: boolean;
  /** The focus ring is drawn: :focus-visible (or a date field's :focus-within) with the app's 3 px outline. */
  ring: boolean;
  /** The open dialog the focus is in, by its title, or null. */
  dialog: string | null;
}

function focusStop(page: Page): Promise<FocusStop> {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body || el === document.documentElement) return { label: '(the page)', onPage: true, ring: false, dialog: null };
    const style = getComputedStyle(el);
    // A date field's calendar button is focused inside the field: then the field is :focus-within.
    const ring = (el.matches(':focus-visible') || el.matches(':focus-within')) && style.outlineStyle !== 'none' && parseFloat(style.outlineWidth) >= 2;
    const dialog = el.closest('dialog[open]');
    const titleId = dialog?.getAttribute('aria-labelledby');
    const name = el.getAttribute('aria-label') || (el as HTMLInputElement).labels?.[0]?.innerText || el.innerText || el.tagName;
    return {
      label: `${el.tagName.toLowerCase()} "${name.trim().replace(/\s+/g, ' ').slice(0, 70)}"`,
      onPage: false,
      ring,
      dialog: dialog ? (titleId ? document.getElementById(titleId)?.textContent ?? '' : '') : null,
    };
  });
}

const isFocused = (target: Locator) => target.evaluate((el) => el === document.activeElement).catch(() => false);

/** Presses Tab (or Shift+Tab) until `target` has the focus; every control on the way must show the ring. */
async function tabTo(page: Page, target: Locator, { back = false, max = 300 } = {}) {
  const stops: FocusStop[] = [];
  for (let i = 0; i <= max; i++) {
    if (await isFocused(target)) return stops;
    await page.keyboard.press(back ? 'Shift+Tab' : 'Tab');
    const stop = await focusStop(page);
    stops.push(stop);
    if (!stop.onPage) expect(stop.ring, `the focus ring on ${stop.label}`).toBe(true);
  }
  throw new Error(`Tab never reached the target; the stops were: ${stops.map((s) => s.label).join(' → ')}`);
}

/** Types into the focused control, key by key. */
const type = (page: Page, text: string) => page.keyboard.type(text);

/** A datetime-local field on Chromium's en-US segments: month, day, year, then Tab to the time. */
async function typeDateTime(page: Page, date: string, time: string) {
  const [y, m, d] = date.split('-');
  await type(page, `${m}${d}${y}`);
  await page.keyboard.press('Tab');
  const [h, min] = time.split(':').map(Number);
  await type(page, `${String(((h + 11) % 12) + 1).padStart(2, '0')}${String(min).padStart(2, '0')}${h < 12 ? 'A' : 'P'}`);
}

async function seriousViolations(page: Page, where: string) {
  // Colours are measured as they are now: let transitions (a button turning from disabled to
  // enabled, say) finish first, or axe measures a colour half way.
  await page.waitForFunction(() => document.getAnimations().every((a) => a.playState !== 'running' || a.effect?.getTiming().iterations === Infinity));
  const results = await new AxeBuilder({ page }).analyze();
  return results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${where}: ${v.id} (${v.impact}) at ${v.nodes.slice(0, 5).map((n) => `${n.target.join(' ')} (${n.failureSummary?.split('\n')[1]?.trim() ?? ''})`).join(' | ')}`);
}

/**
 * Opens a dialog from its button with Enter and walks it: the focus starts inside; Tab and
 * Shift+Tab go round its controls, each with the ring, and never leave it; axe finds nothing
 * serious; Escape closes it and the focus is back on the button. Returns the dialog, closed.
 */
async function walkDialog(page: Page, opener: Locator, title: string | RegExp) {
  await tabTo(page, opener);
  await page.keyboard.press('Enter');
  const dialog = page.getByRole('dialog', { name: title });
  await dialog.waitFor();
  const start = await focusStop(page);
  expect(start.dialog, `the focus starts in the dialog, not on ${start.label}`).not.toBeNull();
  const controls = await dialog.evaluate((d) =>
    [...d.querySelectorAll<HTMLElement>('a[href], button, input, select, textarea, summary, [tabindex]')].filter((el) => el.tabIndex >= 0 && !(el as HTMLButtonElement).disabled && el.getClientRects().length > 0).length,
  );
  expect(controls).toBeGreaterThan(1);
  for (const key of ['Tab', 'Shift+Tab']) {
    // Twice round, and a step more: every stop inside, with the ring.
    for (let i = 0; i < controls * 2 + 1; i++) {
      await page.keyboard.press(key);
      const stop = await focusStop(page);
      expect(stop.dialog, `${key} #${i + 1} left the dialog for ${stop.label}`).not.toBeNull();
      expect(stop.ring, `the focus ring on ${stop.label}`).toBe(true);
    }
  }
  expect(await seriousViolations(page, `dialog ${title}`)).toEqual([]);
  await page.keyboard.press('Escape');
  await dialog.waitFor({ state: 'hidden' });
  expect(await isFocused(opener), 'the focus is back on the button that opened the dialog').toBe(true);
  expect((await focusStop(page)).ring).toBe(true);
  return dialog;
}

/** Reopens a dialog with Enter on its (focused) button. */
async function reopen(page: Page, opener: Locator, title: string | RegExp) {
  expect(await isFocused(opener)).toBe(true);
  await page.keyboard.press('Enter');
  const dialog = page.getByRole('dialog', { name: title });
  await dialog.waitFor();
  return dialog;
}

/** A company whose customer has a reserved booking, an issued deposit invoice with a $50.00 check on it, and an issued balance invoice. */
async function companyWithMoney() {
  const company = await buildCompany();
  const customer = await buildCustomer(company.organization.id, { name: 'Perpetua Lindqvist', email: uniqueEmail('keys') });
  const tent = await buildItem(company.organization.id, { name: '20x30 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 30, quantityOwned: 4, rentalPriceCents: 45_000 });
  const office = await as(company.office);
  const created = await office.post('/api/bookings', bookingBody(customer.id, '2027-09-18', [{ itemId: tent.id, quantity: 1, unitPriceCents: 45_000, description: '20x30 pole tent' }], { taxRateBp: 0, damageWaiver: false }));
  expect(created.status).toBe(201);
  const booking = created.body as { id: string; reference: string };
  expect((await office.post(`/api/bookings/${booking.id}/status`, { status: 'reserved' })).status).toBe(200);
  const issue = async (kind: 'deposit' | 'balance') => {
    const draft = await office.post(`/api/bookings/${booking.id}/invoices`, { kind });
    const issued = await office.post(`/api/invoices/${draft.body.id}/issue`);
    expect(issued.status).toBe(200);
    return issued.body as { id: string; number: string };
  };
  const deposit = await issue('deposit');
  const balance = await issue('balance');
  expect((await office.post('/api/payments', { method: 'check', reference: 'Check 300', invoiceId: deposit.id, amountCents: 5_000 })).status).toBe(201);
  return { company, customer, tent, booking, deposit, balance, office };
}

/** Signs in with the keyboard alone: Tab to each field, type, Enter. */
async function signInByKeyboard(page: Page, email: string) {
  await page.goto(`${appUrl()}/sign-in`);
  await page.getByRole('heading', { level: 1, name: 'Sign in' }).waitFor();
  await tabTo(page, page.getByLabel('E-mail'));
  await type(page, email);
  await tabTo(page, page.getByLabel('Password'));
  await type(page, TEST_PASSWORD);
  await page.keyboard.press('Enter');
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}

describe('forms with the keyboard alone', () => {
  it('sign-in: a wrong password is said in words with the e-mail kept; Shift+Tab goes back; Enter signs in', { timeout: 60_000 }, async () => {
    const company = await buildCompany();
    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await page.goto(`${appUrl()}/sign-in`);
    await page.getByRole('heading', { level: 1, name: 'Sign in' }).waitFor();
    await tabTo(page, page.getByLabel('E-mail'));
    await type(page, company.owner.email);
    await tabTo(page, page.getByLabel('Password'));
    await type(page, 'not the password');
    await page.keyboard.press('Enter');
    await page.getByRole('alert').filter({ hasText: /e-mail or password/i }).waitFor();
    expect(await page.getByLabel('E-mail').inputValue()).toBe(company.owner.email);
    await tabTo(page, page.getByLabel('Password'), { back: true });
    await page.keyboard.press('Control+A');
    await type(page, TEST_PASSWORD);
    await page.keyboard.press('Enter');
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    // The first Tab on a signed-in page offers the skip link, and it leads into the page.
    await page.keyboard.press('Tab');
    const skip = page.getByRole('link', { name: 'Skip to main content' });
    expect(await isFocused(skip)).toBe(true);
    await page.keyboard.press('Enter');
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('main');
    await context.close();
  });

  it('a new customer: sent empty, the focus goes to the field that needs fixing; filled, Enter saves it', { timeout: 60_000 }, async () => {
    const company = await buildCompany();
    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signInByKeyboard(page, company.office.email);
    await page.goto(`${appUrl()}/app/customers`);
    await page.getByRole('heading', { level: 1, name: 'Customers' }).waitFor();
    await tabTo(page, page.getByRole('link', { name: 'New customer' }));
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { level: 1, name: 'New customer' }).waitFor();
    await tabTo(page, page.getByRole('button', { name: 'Create customer' }));
    await page.keyboard.press('Enter');
    await page.getByText('Enter the customer name.').waitFor();
    expect(await isFocused(page.getByLabel('Customer name'))).toBe(true);
    await type(page, 'Ottoline Brackenridge');
    await tabTo(page, page.getByLabel('E-mail'));
    await type(page, 'ottoline@example.test');
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { level: 1, name: 'Ottoline Brackenridge' }).waitFor();
    await context.close();
  });

  it('a new booking: customer found and chosen, times typed, a tent line added and the booking created, all by keyboard', { timeout: 90_000 }, async () => {
    const company = await buildCompany();
    await buildCustomer(company.organization.id, { name: 'Leocadia Fairweather', email: uniqueEmail('leocadia') });
    await buildItem(company.organization.id, { name: '20x30 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 30, quantityOwned: 4, rentalPriceCents: 45_000 });
    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signInByKeyboard(page, company.office.email);
    await page.goto(`${appUrl()}/app/bookings/new`);
    await page.getByRole('heading', { level: 1, name: 'New booking' }).waitFor();

    await tabTo(page, page.getByLabel('Find a customer'));
    await type(page, 'Leocadia');
    const choose = page.getByRole('button', { name: /^Choose Leocadia Fairweather/ });
    await choose.waitFor();
    await tabTo(page, choose);
    await page.keyboard.press('Enter');
    await page.getByRole('button', { name: 'Change customer' }).waitFor();

    for (const [label, date, time] of [
      ['Event starts', '2027-09-18', '18:00'],
      ['Event ends', '2027-09-18', '23:00'],
      ['Delivery from', '2027-09-17', '09:00'],
      ['Delivery until', '2027-09-17', '12:00'],
      ['Pickup from', '2027-09-19', '09:00'],
      ['Pickup until', '2027-09-19', '12:00'],
    ] as const) {
      await tabTo(page, page.getByLabel(label));
      await typeDateTime(page, date, time);
      expect(await page.getByLabel(label).inputValue()).toBe(`${date}T${time}`);
    }

    await tabTo(page, page.getByRole('button', { name: 'Add a line' }));
    await page.keyboard.press('Enter');
    const item = page.getByLabel('Item, line 1');
    await item.waitFor();
    await tabTo(page, item, { back: true });
    // A closed select takes the first letters of an option, as on any desktop browser.
    await type(page, '20x30');
    await expect.poll(async () => item.evaluate((el: HTMLSelectElement) => el.selectedOptions[0]?.textContent ?? '')).toMatch(/^20x30 pole tent/);

    await tabTo(page, page.getByRole('button', { name: 'Create booking' }));
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { level: 1, name: /^Booking B-\d+$/ }).waitFor();
    await page.getByText('Leocadia Fairweather').first().waitFor();
    await context.close();
  });
});

describe('the money dialogs with the keyboard alone', () => {
  it('record a payment, issue a credit note and void an invoice from the invoice page', { timeout: 120_000 }, async () => {
    const s = await companyWithMoney();
    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signInByKeyboard(page, s.company.owner.email);

    // Record a payment on the deposit invoice: walked, closed with Escape, then filled and sent.
    await page.goto(`${appUrl()}/app/invoices/${s.deposit.id}`);
    await page.getByRole('heading', { level: 1, name: new RegExp(s.deposit.number) }).waitFor();
    const pay = page.getByRole('button', { name: 'Record a payment' });
    await walkDialog(page, pay, 'Record a payment');
    let dialog = await reopen(page, pay, 'Record a payment');
    await tabTo(page, dialog.getByLabel('Method'));
    await type(page, 'Cash');
    expect(await dialog.getByLabel('Method').inputValue()).toBe('cash');
    await tabTo(page, dialog.getByLabel('Amount'));
    await page.keyboard.press('Control+A');
    await type(page, '25');
    await page.keyboard.press('Enter');
    await dialog.waitFor({ state: 'hidden' });
    await page.getByText(/^Payment of \$25\.00 recorded/).waitFor();
    expect(await isFocused(pay)).toBe(true);

    // A credit note: walked and closed, then ten dollars credited with a reason.
    const credit = page.getByRole('button', { name: 'Issue a credit note' });
    await walkDialog(page, credit, 'Issue a credit note');
    dialog = await reopen(page, credit, 'Issue a credit note');
    await tabTo(page, dialog.getByLabel('Amount to credit'));
    await page.keyboard.press('Control+A');
    await type(page, '10');
    await tabTo(page, dialog.getByLabel('Reason'));
    await type(page, 'Chairs delivered late');
    await tabTo(page, dialog.getByRole('button', { name: 'Issue the credit note' }));
    await page.keyboard.press('Enter');
    await dialog.waitFor({ state: 'hidden' });
    await page.getByText(/^Credit note .+ for \$10\.00 is issued/).waitFor();

    // Void the unpaid balance invoice: walked, then voided with a reason.
    await page.goto(`${appUrl()}/app/invoices/${s.balance.id}`);
    await page.getByRole('heading', { level: 1, name: new RegExp(s.balance.number) }).waitFor();
    const voidButton = page.getByRole('button', { name: 'Void invoice' });
    await walkDialog(page, voidButton, /^Void invoice/);
    dialog = await reopen(page, voidButton, /^Void invoice/);
    await tabTo(page, dialog.getByLabel('Reason'));
    await type(page, 'Made by mistake');
    await tabTo(page, dialog.getByRole('button', { name: 'Void the invoice' }));
    await page.keyboard.press('Enter');
    await dialog.waitFor({ state: 'hidden' });
    await page.getByText('This invoice is void.').waitFor();
    await context.close();
  });

  it('additional charges and a refund from the booking page', { timeout: 120_000 }, async () => {
    const s = await companyWithMoney();
    const context = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signInByKeyboard(page, s.company.owner.email);
    await page.goto(`${appUrl()}/app/bookings/${s.booking.id}`);
    await page.getByRole('heading', { level: 2, name: 'Money' }).waitFor();
    await page.waitForLoadState('networkidle');

    // Additional charges: walked and closed, then one damage charge typed and the draft made.
    const charges = page.getByRole('button', { name: 'Additional charges' });
    await walkDialog(page, charges, 'Additional charges');
    let dialog = await reopen(page, charges, 'Additional charges');
    const first = dialog.getByRole('group', { name: 'Charge 1' });
    await tabTo(page, first.getByLabel('Description'));
    await type(page, 'Torn sidewall panel');
    await tabTo(page, first.getByLabel('Amount'));
    await type(page, '85');
    await tabTo(page, dialog.getByRole('button', { name: 'Create the draft invoice' }));
    await page.keyboard.press('Enter');
    await dialog.waitFor({ state: 'hidden' });
    await page.getByText('Draft additional charges created for $85.00.', { exact: false }).waitFor();

    // A refund of part of the check: walked and closed, then sent.
    const refund = page.getByRole('button', { name: /^Refund the payment of / });
    await walkDialog(page, refund, 'Refund a payment');
    dialog = await reopen(page, refund, 'Refund a payment');
    await tabTo(page, dialog.getByLabel('Amount'));
    await page.keyboard.press('Control+A');
    await type(page, '10');
    await tabTo(page, dialog.getByLabel('Reason'));
    await type(page, 'One table not used');
    await tabTo(page, dialog.getByRole('button', { name: 'Refund', exact: true }));
    await page.keyboard.press('Enter');
    await dialog.waitFor({ state: 'hidden' });
    await page.getByText('Refund of $10.00 recorded.', { exact: false }).waitFor();
    await context.close();
  });
});
