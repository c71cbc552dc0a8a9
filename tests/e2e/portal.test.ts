import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, describe, expect, it } from 'vitest';
import { formatMoney } from '../../shared/money';
import type { InvoiceRow } from '../../shared/schemas/invoices';
import { createApp } from '../../server/app';
import type { User } from '../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../factories';
import { ApiClient, linkToken, mailTo, uniqueEmail, uniqueIp, waitForMail } from '../support';
import { appUrl, sharedBrowser, signIn } from './browser';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const usd = (cents: number) => formatMoney(cents, 'USD');

const browser = sharedBrowser();

/**
 * A company, its customer and a quoted booking with its deposit and balance invoices issued.
 * 450.00 at 7.25% tax = 482.63 (32.625 rounds half up); the deposit is 30%, 144.79, so the
 * balance invoice is 337.84 (tests/server/api/invoices.test.ts works the same figures).
 */
async function bookingWithInvoices(customerName: string) {
  const company = await buildCompany();
  const email = uniqueEmail('portal');
  const customer = await buildCustomer(company.organization.id, { name: customerName, email });
  const tent = await buildItem(company.organization.id, { name: '20x30 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 30, quantityOwned: 5, rentalPriceCents: 45_000 });
  const office = await as(company.office);
  const created = await office.post('/api/bookings', bookingBody(customer.id, '2027-09-18', [{ itemId: tent.id, quantity: 1, unitPriceCents: 45_000, description: '20x30 pole tent' }], { taxRateBp: 725, damageWaiver: false }));
  expect(created.status).toBe(201);
  const booking = created.body as { id: string; reference: string };
  expect((await office.post(`/api/bookings/${booking.id}/status`, { status: 'quoted' })).status).toBe(200);
  const issue = async (kind: 'deposit' | 'balance') => {
    const draft = await office.post(`/api/bookings/${booking.id}/invoices`, { kind });
    expect(draft.status).toBe(201);
    const issued = await office.post(`/api/invoices/${draft.body.id}/issue`);
    expect(issued.status).toBe(200);
    return issued.body as InvoiceRow;
  };
  const deposit = await issue('deposit');
  const balance = await issue('balance');
  expect(deposit.totalCents).toBe(14_479);
  expect(balance.totalCents).toBe(33_784);
  return { company, customer, email, booking, deposit, balance, office };
}

/** A phone-sized browser with its own client address, so the sign-in rate limits never cross tests. */
const phone = () =>
  browser().newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true, acceptDownloads: true, extraHTTPHeaders: { 'X-Forwarded-For': uniqueIp() } });

/** Asks for a sign-in link on the page and follows the one that arrives in the mail sink. */
async function signInByMail(page: Page, email: string, next?: string) {
  await page.goto(`${appUrl()}/portal/sign-in${next ? `?next=${encodeURIComponent(next)}` : ''}`);
  await page.getByRole('heading', { level: 1, name: 'See your rentals' }).waitFor();
  await page.getByRole('textbox', { name: 'E-mail' }).fill(email);
  await page.getByRole('button', { name: 'E-mail me a sign-in link' }).click();
  await page.getByRole('heading', { name: 'Check your e-mail' }).waitFor();
  await expect.poll(() => page.getByText('It works once, for 15 minutes.').isVisible()).toBe(true);
  const mail = await waitForMail(email, { subject: /sign-in link/i });
  await page.goto(`${appUrl()}/portal/welcome?token=${linkToken(mail, '/portal/welcome')}`);
}

/** The card of one invoice on the booking page, by its heading ("Balance INV-2026-0002"). */
const invoiceCard = (page: Page, title: string) => page.getByRole('listitem').filter({ has: page.getByRole('heading', { level: 3, name: title }) });

/** Types a card on the hosted payment page (another origin on loopback) and presses Pay. */
async function payOnCardPage(page: Page, number: string, amount: string) {
  await page.getByRole('heading', { level: 1, name: new RegExp(`^Pay \\${amount} for`) }).waitFor();
  await page.locator('input[name="cardNumber"]').fill(number);
  await page.locator('input[name="expiry"]').fill('12/34');
  await page.locator('input[name="cvc"]').fill('123');
  await page.getByRole('button', { name: `Pay ${amount}` }).click();
}

describe('a customer pays a balance from their own pages', () => {
  let context: BrowserContext | undefined;
  afterAll(async () => {
    await context?.close();
  });

  it('signs in by the e-mailed link, pays the balance with 4242 4242 4242 4242, comes back to a paid invoice, and the receipt arrives by mail', { timeout: 120_000 }, async () => {
    const s = await bookingWithInvoices('Odile Varnum');
    const balanceTitle = `Balance ${s.balance.number}`;
    context = await phone();
    const page = await context.newPage();

    // The link was asked for from the booking's address, so it lands on the booking.
    await signInByMail(page, s.email, `/portal/bookings/${s.booking.id}`);
    await page.getByRole('heading', { level: 1, name: `Booking ${s.booking.reference}` }).waitFor();
    await page.getByText('1×').waitFor();
    await page.getByText('20x30 pole tent').waitFor();
    // The company's name heads the page; the two invoices owe the whole booking.
    await page.getByRole('banner').getByText(s.company.organization.name).waitFor();
    await page.getByText(`${usd(48_263)} to pay now.`).waitFor();

    const card = invoiceCard(page, balanceTitle);
    expect(await card.getByTestId('invoice-status').innerText()).toBe('To pay');
    await card.getByText(`Left to pay: ${usd(33_784)}`).waitFor();
    await card.getByRole('button', { name: `Pay ${usd(33_784)} by card` }).click();

    await payOnCardPage(page, '4242 4242 4242 4242', usd(33_784));

    // Back on the return page: it confirms, then shows the payment with its receipt.
    await page.waitForURL(/\/portal\/checkouts\/[0-9a-f-]+$/);
    await page.getByRole('heading', { level: 1, name: 'Paid — thank you' }).waitFor({ timeout: 60_000 });
    await page.getByText(`We received ${usd(33_784)} for invoice ${s.balance.number}.`).waitFor();
    const receiptLink = page.getByRole('link', { name: 'Download your receipt (PDF)' });
    await receiptLink.waitFor({ timeout: 30_000 });
    const [download] = await Promise.all([page.waitForEvent('download'), receiptLink.click()]);
    expect(download.suggestedFilename()).toMatch(/\.pdf$/);

    // The booking shows the invoice paid, the receipt listed, and only the deposit still to pay.
    await page.getByRole('link', { name: '← Back to your booking' }).click();
    await expect.poll(() => invoiceCard(page, balanceTitle).getByTestId('invoice-status').innerText()).toBe('Paid');
    await expect.poll(() => invoiceCard(page, balanceTitle).getByRole('button', { name: /by card/ }).count()).toBe(0);
    await page.getByText(`${usd(14_479)} to pay now.`).waitFor();
    await page.getByRole('link', { name: /^Download receipt .+ \(PDF\)$/ }).waitFor();

    // The office's figures agree, and the receipt e-mail reached the customer.
    const invoice = (await s.office.get(`/api/invoices/${s.balance.id}`)).body as InvoiceRow;
    expect(invoice).toMatchObject({ status: 'paid', paidCents: 33_784, balanceCents: 0 });
    const receipt = await waitForMail(s.email, { subject: /receipt/i, timeoutMs: 30_000 });
    expect(receipt.attachments.some((a) => /\.pdf$/i.test(a.filename))).toBe(true);

    // The office sees the card processor's fee beside the payment: 2.9% + 30¢ of $337.84 is
    // 979.736 + 30 cents, $10.10 (Stripe pricing page, standard US card rate, from memory; the card fake's rule).
    await expect.poll(async () => (await s.office.get(`/api/bookings/${s.booking.id}/payments`)).body.data[0]?.feeCents, { timeout: 15_000 }).toBe(1_010);
    const desk = await browser().newContext();
    try {
      const officePage = await desk.newPage();
      await signIn(officePage, s.company.office.email, TEST_PASSWORD);
      await officePage.goto(`${appUrl()}/app/invoices/${s.balance.id}`);
      await officePage.getByRole('table', { name: `Payments on invoice ${s.balance.number}` }).getByText(`fee ${usd(1_010)}`).waitFor();
    } finally {
      await desk.close();
    }

    // Your rentals lists the booking with the deposit still to pay.
    await page.getByRole('navigation', { name: 'Your account' }).getByRole('link', { name: 'Your rentals' }).click();
    await page.getByRole('heading', { level: 1, name: 'Your rentals' }).waitFor();
    const summary = page.getByRole('link', { name: new RegExp(`Booking ${s.booking.reference}`) });
    await summary.getByText(`Balance ${usd(14_479)}`).waitFor();
    await summary.getByText('Needs your attention').waitFor();
  });
});

describe('a declined card', () => {
  it('shows the decline in plain words and leaves the invoice open', { timeout: 120_000 }, async () => {
    const s = await bookingWithInvoices('Percival Ashgrove');
    const context = await phone();
    const page = await context.newPage();
    await signInByMail(page, s.email);
    // Without `next`, the link lands on Your rentals.
    await page.getByRole('heading', { level: 1, name: 'Your rentals' }).waitFor();
    await page.getByRole('link', { name: new RegExp(`Booking ${s.booking.reference}`) }).click();

    const depositTitle = `Deposit ${s.deposit.number}`;
    await invoiceCard(page, depositTitle).getByRole('button', { name: `Pay ${usd(14_479)} by card` }).click();
    await payOnCardPage(page, '4000 0000 0000 0002', usd(14_479));

    // The secure page says why, in words for a person, and nothing was paid.
    const refusal = page.getByRole('alert').filter({ hasText: 'The payment did not go through' });
    await refusal.waitFor();
    expect(await refusal.innerText()).toMatch(/declined/i);

    // Cancel brings the customer back: nothing charged, the refusal repeated, Try again offered.
    await page.getByRole('link', { name: 'Cancel' }).click();
    await page.waitForURL(/\/portal\/checkouts\/[0-9a-f-]+\?cancelled=1$/);
    await page.getByRole('heading', { level: 1, name: 'Payment cancelled' }).waitFor();
    await page.getByText('Nothing was charged.', { exact: true }).waitFor();
    // The word from the card's bank, as the customer reads it (once the processor has told us).
    const why = page.getByRole('status').filter({ hasText: 'Why the card was refused' });
    await why.waitFor({ timeout: 10_000 });
    expect(await why.innerText()).toMatch(/declined/i);
    await page.getByRole('button', { name: 'Try again' }).waitFor();

    await page.getByRole('link', { name: '← Back to your booking' }).click();
    const card = invoiceCard(page, depositTitle);
    await card.getByText(`Left to pay: ${usd(14_479)}`).waitFor();
    expect(await card.getByTestId('invoice-status').innerText()).toBe('To pay');
    const invoice = (await s.office.get(`/api/invoices/${s.deposit.id}`)).body as InvoiceRow;
    expect(invoice).toMatchObject({ status: 'open', paidCents: 0, balanceCents: 14_479 });
    expect((await mailTo(s.email)).some((m) => /receipt/i.test(m.subject))).toBe(false);
    await context.close();
  });

  it('keeps a part amount below $0.50 or above the balance on the page, with the typed amount', { timeout: 60_000 }, async () => {
    const s = await bookingWithInvoices('Rosalind Thackery');
    const context = await phone();
    const page = await context.newPage();
    await signInByMail(page, s.email, `/portal/bookings/${s.booking.id}`);
    const card = invoiceCard(page, `Deposit ${s.deposit.number}`);
    await card.getByRole('button', { name: 'Pay part of it' }).click();
    const amount = card.getByRole('textbox', { name: 'Amount to pay, in dollars' });
    await expect.poll(() => amount.evaluate((el) => el === document.activeElement)).toBe(true);
    await amount.fill('0.25');
    await card.getByRole('button', { name: 'Pay this amount by card' }).click();
    await card.getByText('Card payments start at $0.50.').waitFor();
    expect(await amount.inputValue()).toBe('0.25');
    await amount.fill('500');
    await card.getByRole('button', { name: 'Pay this amount by card' }).click();
    await card.getByText(`That is more than the balance of ${usd(14_479)}.`).waitFor();
    expect(await amount.getAttribute('aria-invalid')).toBe('true');
    expect(page.url()).toContain(`/portal/bookings/${s.booking.id}`);
    await context.close();
  });
});

describe('another customer', () => {
  it('gets a 404 for a booking that is not theirs, on the page and from the API', { timeout: 90_000 }, async () => {
    const s = await bookingWithInvoices('Thea Lindqvist');
    const stranger = uniqueEmail('stranger');
    await buildCustomer(s.company.organization.id, { name: 'Bram Okonkwo', email: stranger });
    const context = await phone();
    const page = await context.newPage();
    await signInByMail(page, stranger);
    await page.getByRole('heading', { level: 1, name: 'Your rentals' }).waitFor();
    await page.getByText('No rentals yet').waitFor();

    await page.goto(`${appUrl()}/portal/bookings/${s.booking.id}`);
    await page.getByRole('heading', { level: 1, name: 'We can’t find this booking' }).waitFor();
    for (const path of [`/api/portal/bookings/${s.booking.id}`, `/api/portal/documents/${s.balance.documentId}/pdf`]) {
      expect((await page.request.get(`${appUrl()}${path}`)).status(), path).toBe(404);
    }
    const csrf = (await context.cookies()).find((c) => c.name === 'guyline_csrf')?.value ?? '';
    const pay = await page.request.post(`${appUrl()}/api/invoices/${s.balance.id}/checkout`, { data: {}, headers: { 'X-CSRF-Token': csrf } });
    expect(pay.status()).toBe(404);

    // Signing out ends the session: the rentals page sends them to sign in, coming back after.
    await page.goto(`${appUrl()}/portal`);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByText('You are signed out.').waitFor();
    await page.goto(`${appUrl()}/portal/bookings/${s.booking.id}`);
    await page.waitForURL(new RegExp(`/portal/sign-in\\?next=${encodeURIComponent(`/portal/bookings/${s.booking.id}`)}$`));
    await context.close();
  });
});

describe('a pay link from the invoice e-mail', () => {
  it('pays the invoice without signing in, comes back to the paid state with its receipt; a made-up link says so and offers sign-in', { timeout: 120_000 }, async () => {
    const s = await bookingWithInvoices('Casimir Fenwright');
    const mail = await waitForMail(s.email, { subject: new RegExp(s.deposit.number!) });
    const link = mail.text.match(/https?:\/\/\S+\/pay\/[A-Za-z0-9._-]+/)![0];
    const context = await phone();
    const page = await context.newPage();

    await page.goto(link);
    await page.getByRole('heading', { level: 1, name: `Pay Deposit ${s.deposit.number}` }).waitFor();
    await page.getByText(`For Casimir Fenwright, booking ${s.booking.reference}`).waitFor();
    await page.getByText(`Left to pay: ${usd(14_479)}`).waitFor();
    // A part payment: $100.00 of the deposit.
    await page.getByRole('button', { name: 'Pay part of it' }).click();
    await page.getByRole('textbox', { name: 'Amount to pay, in dollars' }).fill('100');
    await page.getByRole('button', { name: 'Pay this amount by card' }).click();
    await payOnCardPage(page, '4242424242424242', usd(10_000));

    await page.waitForURL(/\/pay\/[^/]+\/checkouts\/[0-9a-f-]+$/);
    await page.getByRole('heading', { level: 1, name: 'Paid — thank you' }).waitFor({ timeout: 60_000 });
    await page.getByText(`We received ${usd(10_000)} for invoice ${s.deposit.number}.`).waitFor();
    const receiptLink = page.getByRole('link', { name: 'Download your receipt (PDF)' });
    await receiptLink.waitFor({ timeout: 30_000 });
    const [download] = await Promise.all([page.waitForEvent('download'), receiptLink.click()]);
    expect(download.suggestedFilename()).toMatch(/\.pdf$/);

    // Back on the invoice: part paid, the rest still payable.
    await page.getByRole('link', { name: '← Back to the invoice' }).click();
    await page.getByText(`Left to pay: ${usd(4_479)}`).waitFor();
    expect(await page.getByTestId('invoice-status').innerText()).toBe('Part paid');
    await page.getByRole('button', { name: `Pay ${usd(4_479)} by card` }).waitFor();

    await page.goto(`${appUrl()}/pay/${s.deposit.id}.${'A'.repeat(32)}`);
    await page.getByRole('heading', { level: 1, name: 'This pay link doesn’t work' }).waitFor();
    await page.getByRole('link', { name: 'Sign in to your rentals' }).click();
    await page.getByRole('heading', { level: 1, name: 'See your rentals' }).waitFor();
    await context.close();
  });
});

describe('a customer opens the agreement to sign from their pages', () => {
  it('"Read and sign" asks for a signing link (a POST with the CSRF header) and opens the signing page; the page names the one company', { timeout: 120_000 }, async () => {
    const s = await bookingWithInvoices('Perpetua Lindqvist');
    expect((await s.office.post(`/api/bookings/${s.booking.id}/agreement`)).status).toBe(201);
    const context = await phone();
    const page = await context.newPage();
    await signInByMail(page, s.email, `/portal/bookings/${s.booking.id}`);
    await page.getByRole('heading', { level: 1, name: `Booking ${s.booking.reference}` }).waitFor();
    await page.goto(`${appUrl()}/portal`);
    await page.getByText(`These are your rentals with ${s.company.organization.name}.`).waitFor();
    await page.goto(`${appUrl()}/portal/bookings/${s.booking.id}`);
    await page.getByRole('heading', { level: 1, name: `Booking ${s.booking.reference}` }).waitFor();
    await page.getByRole('button', { name: 'Read and sign' }).first().click();
    await page.waitForURL(/\/sign\/[A-Za-z0-9_-]+$/);
    await page.getByRole('heading', { level: 1, name: 'Sign your rental agreement' }).waitFor();
    await context.close();
  });
});
