import { describe, expect, it } from 'vitest';
import { Booking } from '../../server/models';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { appUrl, sharedBrowser, signIn } from './browser';

const browser = sharedBrowser();

describe('the office takes an enquiry, sizes it, prices it and reserves it', () => {
  it('from a new customer to a reserved booking in the browser', { timeout: 90_000 }, async () => {
    const context = await browser().newContext({ viewport: { width: 1366, height: 900 } });
    const page = await context.newPage();
    await signIn(page, 'office@demo.test', DEMO_PASSWORD);
    await page.goto(`${appUrl()}/app/bookings/new`);
    await page.getByRole('heading', { level: 1, name: 'New booking' }).waitFor();

    // The enquiry: a new customer, the date and the guests.
    await page.getByRole('button', { name: 'New customer' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Customer name').fill('Odette Quarry');
    await dialog.getByLabel('E-mail').fill('odette.quarry@example.test');
    await dialog.getByRole('button', { name: 'Create customer' }).click();
    await dialog.waitFor({ state: 'detached' });

    await page.getByLabel('Event starts').fill('2027-08-14T14:00');
    await page.getByLabel('Event ends').fill('2027-08-14T22:00');
    await page.getByLabel('Delivery from').fill('2027-08-13T08:00');
    await page.getByLabel('Delivery until').fill('2027-08-13T12:00');
    await page.getByLabel('Pickup from').fill('2027-08-15T09:00');
    await page.getByLabel('Pickup until').fill('2027-08-15T13:00');
    await page.getByLabel('Site address line 1').fill('12 Fox Run');
    await page.getByLabel('Guest count').fill('40');

    // Size it: the planner picks a tent from the demo stock and adds its lines.
    await page.getByRole('button', { name: 'Plan the tent' }).click();
    await page.getByRole('button', { name: /Add these lines for 20x20 pole tent/ }).click();
    await expect.poll(() => page.getByLabel(/^Quantity, line \d+$/).count()).toBeGreaterThanOrEqual(3);

    // Price it: the live quote shows a total.
    await expect.poll(async () => (await page.getByTestId('quote-total').innerText()).trim()).toMatch(/^\$[\d,]+\.\d\d$/);
    expect(await page.getByTestId('quote-total').innerText()).not.toBe('$0.00');

    await page.getByRole('button', { name: 'Create booking' }).click();
    const heading = page.getByRole('heading', { level: 1, name: /^Booking B-\d+$/ });
    await heading.waitFor();
    const reference = (await heading.innerText()).replace('Booking ', '');

    // Reserve it.
    await page.getByRole('button', { name: 'Reserve stock' }).click();
    await expect.poll(async () => (await Booking.findOne({ where: { reference } }))?.status, { timeout: 10_000 }).toBe('reserved');
    const booking = (await Booking.findOne({ where: { reference } }))!;
    expect(booking.guestCount).toBe(40);
    expect(booking.totalCents).toBeGreaterThan(0);
    await context.close();
  });
});
