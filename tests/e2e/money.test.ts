import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { formatMoney } from '../../shared/money';
import type { BookingLedger, CustomerCredit, InvoiceRow } from '../../shared/schemas/invoices';
import { createApp } from '../../server/app';
import type { User } from '../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../factories';
import { ApiClient, uniqueEmail } from '../support';
import { appUrl, sharedBrowser, signIn } from './browser';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const usd = (cents: number) => formatMoney(cents, 'USD');

const browser = sharedBrowser();

/** The text of an element named by its test id, once it has settled on a money amount. */
const amountOn = async (page: Page, testId: string) => (await page.getByTestId(testId).innerText()).trim();

/** Every total in the booking's Money panel against GET /api/bookings/:id/ledger. */
async function expectPanelMatchesLedger(page: Page, api: ApiClient, bookingId: string) {
  const ledger = (await api.get(`/api/bookings/${bookingId}/ledger`)).body as BookingLedger;
  for (const [id, cents] of [
    ['booking-invoiced', ledger.invoicedCents],
    ['booking-credited', ledger.creditedCents],
    ['booking-paid', ledger.paidCents],
    ['booking-balance', ledger.balanceCents],
  ] as const) {
    await expect.poll(() => amountOn(page, id), { message: id }).toBe(usd(cents));
  }
  return ledger;
}

/** The invoice page's Credited, Paid and Balance against GET /api/invoices/:id. */
async function expectInvoicePageMatchesApi(page: Page, api: ApiClient, invoiceId: string) {
  const invoice = (await api.get(`/api/invoices/${invoiceId}`)).body as InvoiceRow;
  await expect.poll(() => amountOn(page, 'invoice-balance'), { message: 'invoice balance' }).toBe(usd(invoice.balanceCents));
  expect(await amountOn(page, 'invoice-total')).toBe(usd(invoice.totalCents));
  expect(await amountOn(page, 'invoice-paid')).toBe(usd(invoice.paidCents));
  expect(await amountOn(page, 'invoice-credited')).toBe(usd(invoice.creditedCents));
  expect(invoice.balanceCents).toBe(invoice.totalCents - invoice.paidCents - invoice.creditedCents);
  return invoice;
}

const invoiceIdOf = (page: Page) => new URL(page.url()).pathname.split('/').pop()!;

/** From the booking's Money panel: the success notice's link to the new draft, then Issue invoice on its page. */
async function openAndIssueDraft(page: Page) {
  await page.getByRole('link', { name: 'Open it to check the lines and issue it' }).click();
  await page.getByRole('button', { name: 'Issue invoice' }).click();
  await page.getByText(/^Invoice .+ is issued/).waitFor();
  return invoiceIdOf(page);
}

describe('money after the event: overpayment kept as credit, additional charges, the security deposit and credit notes', () => {
  it('the office and the owner settle a booking in the browser, and every balance on screen is the API’s', { timeout: 180_000 }, async () => {
    const company = await buildCompany();
    const customer = await buildCustomer(company.organization.id, { name: 'Wren Halloway', email: uniqueEmail('wren') });
    const tent = await buildItem(company.organization.id, { name: '20x30 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 30, quantityOwned: 5, rentalPriceCents: 45_000 });
    const api = await as(company.office);
    const created = await api.post('/api/bookings', bookingBody(customer.id, '2027-09-18', [{ itemId: tent.id, quantity: 1, unitPriceCents: 45_000, description: '20x30 pole tent' }], { taxRateBp: 725, damageWaiver: false }));
    expect(created.status).toBe(201);
    const booking = created.body as { id: string; reference: string; totals: { totalCents: number; depositCents: number } };
    // 450.00 + 7.25% tax (32.625 -> 32.63, half up) = 482.63; the deposit is 30% of it, 144.789 -> 144.79 (tests/server/api/invoices.test.ts).
    expect(booking.totals).toMatchObject({ totalCents: 48_263, depositCents: 14_479 });
    const bookingUrl = `${appUrl()}/app/bookings/${booking.id}`;

    const office = await browser().newContext({ viewport: { width: 1366, height: 900 } });
    const page = await office.newPage();
    await signIn(page, company.office.email, TEST_PASSWORD);

    // 1. The deposit invoice, made from the quote and issued.
    await page.goto(bookingUrl);
    await page.getByRole('heading', { level: 2, name: 'Money' }).waitFor();
    await page.getByRole('button', { name: 'Create deposit invoice' }).click();
    const depositId = await openAndIssueDraft(page);

    // 2. A check for 194.79 on the 144.79 deposit: refused until the extra 50.00 is kept as credit.
    await page.getByRole('button', { name: 'Record a payment' }).click();
    let dialog = page.getByRole('dialog', { name: 'Record a payment' });
    await dialog.getByLabel('Method').selectOption('check');
    await dialog.getByLabel('Reference').fill('Check 1042');
    await dialog.getByLabel('Amount').fill('194.79');
    const keep = dialog.getByRole('checkbox', { name: 'Keep the extra $50.00 as the customer’s credit' });
    await keep.waitFor();
    expect(await keep.isChecked()).toBe(false);
    await dialog.getByRole('button', { name: 'Record payment' }).click();
    await dialog.getByText(/That is more than the balance of .+, \$144\.79\./).waitFor();
    expect(await dialog.getByLabel('Amount').inputValue()).toBe('194.79');
    await keep.check();
    await dialog.getByRole('button', { name: 'Record payment' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await page.getByText('Payment of $194.79 recorded, $50.00 of it kept as the customer’s credit.', { exact: false }).waitFor();
    const deposit = await expectInvoicePageMatchesApi(page, api, depositId);
    expect(deposit).toMatchObject({ status: 'paid', paidCents: 14_479, balanceCents: 0 });
    expect(((await api.get(`/api/customers/${customer.id}/credit`)).body as CustomerCredit).creditCents).toBe(5_000);

    // 3. Additional charges for the damaged sidewall: a row left undescribed is refused with the typed amount kept.
    await page.goto(bookingUrl);
    await page.getByRole('heading', { level: 2, name: 'Money' }).waitFor();
    await expect.poll(() => page.getByTestId('booking-customer-credit').innerText()).toBe('$50.00');
    await page.getByRole('button', { name: 'Additional charges' }).click();
    dialog = page.getByRole('dialog', { name: 'Additional charges' });
    const first = dialog.getByRole('group', { name: 'Charge 1' });
    expect(await first.getByLabel('Type').inputValue()).toBe('damage');
    // Damage is untaxed unless the office says otherwise (ADDITIONAL_CHARGE_TAXABLE).
    expect(await first.getByRole('checkbox', { name: 'Taxable' }).isChecked()).toBe(false);
    await first.getByLabel('Amount').fill('85');
    await dialog.getByRole('button', { name: 'Add a charge' }).click();
    const second = dialog.getByRole('group', { name: 'Charge 2' });
    await second.getByLabel('Type').selectOption('cleaning');
    expect(await second.getByRole('checkbox', { name: 'Taxable' }).isChecked()).toBe(true);
    await second.getByLabel('Description').fill('Sidewall washed of mud');
    await second.getByLabel('Amount').fill('30');
    // A third row, added and removed again.
    await dialog.getByRole('button', { name: 'Add a charge' }).click();
    await dialog.getByRole('button', { name: 'Remove charge 3' }).click();
    await dialog.getByRole('group', { name: 'Charge 3' }).waitFor({ state: 'detached' });
    await dialog.getByRole('button', { name: 'Create the draft invoice' }).click();
    await first.getByText('Describe the charge.').waitFor();
    expect(await first.getByLabel('Amount').inputValue()).toBe('85');
    await first.getByLabel('Description').fill('20 ft sidewall, torn panel');
    await dialog.getByRole('button', { name: 'Create the draft invoice' }).click();
    await dialog.waitFor({ state: 'hidden' });
    // 85.00 untaxed + 30.00 taxed at 7.25% (2.175 -> 2.18, half up) = 117.18.
    await page.getByText('Draft additional charges created for $117.18.', { exact: false }).waitFor();
    const additionalId = await openAndIssueDraft(page);

    // 4. The 50.00 of credit pays part of it.
    await page.getByRole('button', { name: 'Pay from credit' }).click();
    dialog = page.getByRole('dialog', { name: 'Pay from account credit' });
    expect(await dialog.getByLabel('Amount').inputValue()).toBe('50.00');
    await dialog.getByRole('button', { name: 'Pay from credit' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await page.getByText(/^\$50\.00 of account credit paid on invoice .+\. \$67\.18 is left to pay\.$/).waitFor();
    expect(await expectInvoicePageMatchesApi(page, api, additionalId)).toMatchObject({ totalCents: 11_718, paidCents: 5_000, balanceCents: 6_718 });
    await expect.poll(async () => page.getByRole('button', { name: 'Pay from credit' }).count()).toBe(0);

    // 5. The held security deposit pays the rest of the charges.
    await page.goto(bookingUrl);
    await page.getByRole('heading', { level: 2, name: 'Money' }).waitFor();
    await page.getByRole('button', { name: 'Collect the security deposit' }).click();
    dialog = page.getByRole('dialog', { name: 'Collect the security deposit' });
    await dialog.getByLabel('Amount').fill('100');
    await dialog.getByLabel('Method').selectOption('cash');
    await dialog.getByRole('button', { name: 'Record it as held' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await page.getByRole('button', { name: 'Apply to an invoice' }).click();
    dialog = page.getByRole('dialog', { name: 'Apply to an invoice' });
    // The only open invoice is chosen, and the amount is the held deposit up to its balance.
    expect(await dialog.getByLabel('Invoice', { exact: true }).inputValue()).toBe(additionalId);
    expect(await dialog.getByLabel('Amount').inputValue()).toBe('67.18');
    await dialog.getByRole('button', { name: 'Pay the invoice from the deposit' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await page.getByText(/\$67\.18 of security deposit applied to .+\. \$32\.82 is held now\./).waitFor();
    await expect.poll(() => amountOn(page, 'security-deposit-held')).toBe('$32.82');
    const payments = page.getByRole('table', { name: `Payments on booking ${booking.reference}` });
    await payments.getByRole('cell', { name: 'From security deposit' }).waitFor();
    await payments.getByRole('cell', { name: 'From account credit' }).waitFor();
    await payments.getByText('Kept as credit $50.00').waitFor();

    // 6. The balance invoice.
    await page.getByRole('button', { name: 'Create balance invoice' }).click();
    const balanceId = await openAndIssueDraft(page);
    await office.close();

    // 7. The owner credits 40.00 on the balance invoice (first asking too much), then 10.00 on the paid deposit.
    const ownerContext = await browser().newContext({ viewport: { width: 1366, height: 900 } });
    const owner = await ownerContext.newPage();
    await signIn(owner, company.owner.email, TEST_PASSWORD);
    await owner.goto(`${appUrl()}/app/invoices/${balanceId}`);
    await owner.getByRole('button', { name: 'Issue a credit note' }).click();
    dialog = owner.getByRole('dialog', { name: 'Issue a credit note' });
    // 482.63 - 144.79 = 337.84, the whole balance, is the first guess.
    expect(await dialog.getByLabel('Amount to credit').inputValue()).toBe('337.84');
    await dialog.getByLabel('Amount to credit').fill('400');
    await dialog.getByLabel('Reason').fill('Two banquet tables missing at delivery');
    await dialog.getByRole('button', { name: 'Issue the credit note' }).click();
    await dialog.getByText(/At most \$337\.84 can still be credited/).waitFor();
    await dialog.getByLabel('Amount to credit').fill('40');
    await expect.poll(() => dialog.getByTestId('credit-note-explanation').innerText()).toMatch(/^\$40\.00 comes off the balance of .+, leaving \$297\.84 to pay\.$/);
    await dialog.getByRole('button', { name: 'Issue the credit note' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await owner.getByText(/^Credit note .+ for \$40\.00 is issued\. \$40\.00 came off the balance\.$/).waitFor();
    expect(await expectInvoicePageMatchesApi(owner, api, balanceId)).toMatchObject({ creditedCents: 4_000, balanceCents: 33_784 - 4_000 });
    await owner.getByRole('heading', { level: 2, name: 'Credit notes' }).waitFor();
    await owner.getByRole('link', { name: /^Credit note / }).click();
    await owner.getByRole('heading', { level: 1, name: /^Credit note .+-CR-/ }).waitFor();
    await owner.getByText('Applied', { exact: true }).first().waitFor();
    await owner.getByText('Two banquet tables missing at delivery').waitFor();

    // The booking's totals, on screen and in the API: balance = invoiced - credited - paid while no credit note went to account credit.
    await owner.goto(bookingUrl);
    await owner.getByRole('heading', { level: 2, name: 'Money' }).waitFor();
    let ledger = await expectPanelMatchesLedger(owner, api, booking.id);
    // Invoiced 144.79 + 117.18 + 337.84 = 599.81; paid 144.79 by check + 50.00 from credit + 67.18 from the deposit = 261.97.
    expect(ledger).toMatchObject({ invoicedCents: 59_981, creditedCents: 4_000, paidCents: 26_197, balanceCents: 29_784, customerCreditCents: 0, securityDepositHeldCents: 3_282 });
    expect(ledger.balanceCents).toBe(ledger.invoicedCents - ledger.creditedCents - ledger.paidCents);
    expect(await owner.getByTestId('booking-customer-credit').count()).toBe(0);

    // A credit note on the paid deposit has no balance to lower: all of it becomes account credit.
    await owner.goto(`${appUrl()}/app/invoices/${depositId}`);
    await owner.getByRole('button', { name: 'Issue a credit note' }).click();
    dialog = owner.getByRole('dialog', { name: 'Issue a credit note' });
    expect(await dialog.getByLabel('Amount to credit').inputValue()).toBe('');
    await dialog.getByLabel('Amount to credit').fill('10');
    await expect.poll(() => dialog.getByTestId('credit-note-explanation').innerText()).toMatch(/has nothing left to pay, so all \$10\.00 becomes the customer’s account credit\.$/);
    await dialog.getByLabel('Reason').fill('Goodwill for the late delivery');
    await dialog.getByRole('button', { name: 'Issue the credit note' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await owner.getByText(/^Credit note .+ for \$10\.00 is issued\. The invoice had nothing left to pay, so all of it became Wren Halloway’s account credit\.$/).waitFor();
    await expectInvoicePageMatchesApi(owner, api, depositId);

    await owner.goto(bookingUrl);
    await owner.getByRole('heading', { level: 2, name: 'Money' }).waitFor();
    ledger = await expectPanelMatchesLedger(owner, api, booking.id);
    // The 10.00 went to account credit, not off a balance: credited stays at what came off balances.
    expect(ledger).toMatchObject({ creditedCents: 4_000, balanceCents: 29_784, customerCreditCents: 1_000 });
    await expect.poll(() => owner.getByTestId('booking-customer-credit').innerText()).toBe(usd(ledger.customerCreditCents));
    expect(ledger.balanceCents).toBe(ledger.invoicedCents - ledger.creditedCents - ledger.paidCents);

    // 8. The customer's page shows the credit; the owner pays it back by check.
    await owner.goto(`${appUrl()}/app/customers/${customer.id}`);
    await owner.getByRole('heading', { level: 2, name: 'Account credit' }).waitFor();
    await expect.poll(() => amountOn(owner, 'customer-credit')).toBe('$10.00');
    await owner.getByRole('button', { name: 'Pay credit back' }).click();
    dialog = owner.getByRole('dialog', { name: 'Pay credit back' });
    expect(await dialog.getByLabel('Amount').inputValue()).toBe('10.00');
    await dialog.getByRole('button', { name: 'Pay it back' }).click();
    await dialog.getByText('Choose how the money goes back.').waitFor();
    await dialog.getByLabel('Method').selectOption('check');
    await dialog.getByLabel('Reason').fill('Customer asked for a check');
    await dialog.getByRole('button', { name: 'Pay it back' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await owner.getByText('$10.00 of credit paid back to Wren Halloway.').waitFor();
    await expect.poll(() => amountOn(owner, 'customer-credit')).toBe('$0.00');
    expect(((await api.get(`/api/customers/${customer.id}/credit`)).body as CustomerCredit).creditCents).toBe(0);
    await ownerContext.close();
  });

  it('the office is not offered paying credit back, and a credit spent meanwhile is refused on the amount with what was typed kept', { timeout: 60_000 }, async () => {
    const company = await buildCompany();
    const customer = await buildCustomer(company.organization.id, { name: 'Tamsin Oakes', email: uniqueEmail('tamsin') });
    const tent = await buildItem(company.organization.id, { name: '20x20 pole tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 20, quantityOwned: 5, rentalPriceCents: 30_000 });
    const api = await as(company.office);
    const booking = (await api.post('/api/bookings', bookingBody(customer.id, '2027-10-02', [{ itemId: tent.id, quantity: 1, unitPriceCents: 30_000 }], { taxRateBp: 0, damageWaiver: false }))).body;
    const draft = (await api.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).body as InvoiceRow;
    await api.post(`/api/invoices/${draft.id}/issue`);
    expect((await api.post('/api/payments', { method: 'cash', invoiceId: draft.id, amountCents: draft.totalCents + 2_500, keepExcessAsCredit: true })).status).toBe(201);

    const context = await browser().newContext({ viewport: { width: 1366, height: 900 } });
    const page = await context.newPage();
    await signIn(page, company.office.email, TEST_PASSWORD);
    await page.goto(`${appUrl()}/app/customers/${customer.id}`);
    await page.getByRole('heading', { level: 2, name: 'Account credit' }).waitFor();
    await expect.poll(() => amountOn(page, 'customer-credit')).toBe('$25.00');
    expect(await page.getByRole('button', { name: 'Pay credit back' }).count()).toBe(0);
    // The statement shows what is owed and, apart from it, the account credit.
    await page.getByRole('link', { name: 'Statement' }).click();
    await expect.poll(() => amountOn(page, 'statement-credit')).toBe('$25.00');

    // The balance invoice; its page offers the 25.00 of credit.
    const balance = (await api.post(`/api/bookings/${booking.id}/invoices`, { kind: 'balance' })).body as InvoiceRow;
    await api.post(`/api/invoices/${balance.id}/issue`);
    await page.goto(`${appUrl()}/app/invoices/${balance.id}`);
    await page.getByRole('button', { name: 'Pay from credit' }).click();
    const dialog = page.getByRole('dialog', { name: 'Pay from account credit' });
    expect(await dialog.getByLabel('Amount').inputValue()).toBe('25.00');
    // Someone else uses 20.00 of it while the dialog is open: the server's 409 names the amount.
    expect((await api.post(`/api/invoices/${balance.id}/apply-credit`, { amountCents: 2_000 })).status).toBe(200);
    await dialog.getByRole('button', { name: 'Pay from credit' }).click();
    await dialog.getByText('At most $5.00.').waitFor();
    expect(await dialog.getByLabel('Amount').getAttribute('aria-invalid')).toBe('true');
    expect(await dialog.getByLabel('Amount').inputValue()).toBe('25.00');
    await dialog.getByText('The customer has $5.00 of credit.').waitFor();
    await dialog.getByLabel('Amount').fill('5');
    await dialog.getByRole('button', { name: 'Pay from credit' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await expectInvoicePageMatchesApi(page, api, balance.id);
    await context.close();
  });
});
