import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { Booking, FieldPhoto, Invoice, Organization, ReturnCheck, User } from '../../server/models';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { bookingBody, buildCustomer, buildItem } from '../factories';
import { ApiClient } from '../support';
import { appUrl, sharedBrowser, signIn } from './browser';

const browser = sharedBrowser();

// A 1x1 PNG (PNG specification, ISO/IEC 15948): what the phone's camera hands over in this test.
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da6364f8cf500f00038601805a347d6b0000000049454e44ae426082', 'hex');
// A phone in portrait (CSS pixels).
const PHONE = { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true, deviceScaleFactor: 2 };

async function signInOnPhone(page: Page, email: string) {
  await page.goto(`${appUrl()}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('button', { name: 'Menu' }).waitFor();
}

/** Nothing on the page is wider than the phone. */
const sideways = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);

describe('a crew member runs a stop from a phone', () => {
  it('marks the delivery, then at pickup counts what came back, records a torn sidewall with a photo, and the office bills it', { timeout: 120_000 }, async () => {
    // The demo company's office books a sidewall and chairs, with the demo crew member on it.
    const crewUser = (await User.findOne({ where: { email: 'crew@demo.test' } }))!;
    const org = (await Organization.findByPk(crewUser.organizationId))!;
    const customer = await buildCustomer(org.id, { name: 'Juniper Hollis', phone: '555-0144' });
    const wall = await buildItem(org.id, { name: 'Sidewall 7x20 (field test)', kind: 'sidewall', sectionLengthFt: 20, heightFt: 7, quantityOwned: 8, rentalPriceCents: 2_500, replacementValueCents: 35_000 });
    const chairs = await buildItem(org.id, { name: 'Folding chair (field test)', kind: 'chair', quantityOwned: 100, rentalPriceCents: 200, replacementValueCents: 2_400 });
    // The demo password signs in only on the demo server (the one the browser uses), not an app made here.
    const office = await (await new ApiClient(appUrl()).init()).login('office@demo.test', DEMO_PASSWORD);
    const created = await office.post('/api/bookings', bookingBody(customer.id, '2028-03-18', [
      { itemId: wall.id, quantity: 4, description: 'Sidewall 7x20 (field test)', unitPriceCents: 2_500 },
      { itemId: chairs.id, quantity: 50, description: 'Folding chair (field test)', unitPriceCents: 200 },
    ], { siteLine1: '8 Larkspur Lane', siteCity: 'Millbrook', siteNotes: 'Side gate is 6 ft wide.', guestCount: 50 }));
    expect(created.status).toBe(201);
    const id = created.body.id as string;
    const reference = created.body.reference as string;
    expect((await office.post(`/api/bookings/${id}/status`, { status: 'reserved' })).status).toBe(200);
    const crewPut = await office.agent.put(`/api/field/bookings/${id}/crew`).set('X-CSRF-Token', office.csrf).set('X-Forwarded-For', office.ip).send({ userIds: [crewUser.id] });
    expect(crewPut.status).toBe(200);

    const context = await browser().newContext(PHONE);
    const page = await context.newPage();
    await signInOnPhone(page, 'crew@demo.test');

    // The day sheet of the delivery day (bookingBody delivers the day before the event), from the menu.
    await page.getByRole('button', { name: 'Menu' }).click();
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Day sheets' }).click();
    await page.getByRole('heading', { level: 1, name: /^Today, / }).waitFor();
    await page.goto(`${appUrl()}/app/field/days/2028-03-17`);
    await page.getByRole('heading', { level: 1, name: /Day sheet, Friday, March 17, 2028/ }).waitFor();
    const stop = page.getByRole('article', { name: `Delivery ${reference}: Juniper Hollis` });
    await stop.getByText('Your stop').waitFor();
    expect(await stop.getByRole('link', { name: /8 Larkspur Lane, Millbrook/ }).getAttribute('href')).toMatch(/^geo:0,0\?q=8%20Larkspur%20Lane/);
    expect(await page.locator('body').innerText()).not.toMatch(/\$\d/);
    expect(await sideways(page)).toBeLessThanOrEqual(0);

    await stop.getByRole('link', { name: `Open delivery ${reference}` }).click();
    await page.getByRole('heading', { level: 1, name: `${reference}: Juniper Hollis` }).waitFor();
    await page.getByRole('button', { name: 'Mark delivered' }).click();
    await page.getByRole('button', { name: 'Mark set up' }).waitFor();
    await expect.poll(async () => (await Booking.findByPk(id))!.status).toBe('out');

    // Pickup day: the check-in.
    await page.goto(`${appUrl()}/app/field/days/2028-03-19`);
    const pickup = page.getByRole('article', { name: `Pickup ${reference}: Juniper Hollis` });
    await pickup.getByRole('link', { name: `Open pickup ${reference}` }).click();
    await page.getByRole('link', { name: 'Pickup check-in' }).click();
    await page.getByRole('heading', { level: 1, name: `Pickup check-in, ${reference}` }).waitFor();

    await page.getByLabel('Came back, Folding chair (field test)', { exact: true }).fill('48');
    await page.getByText('2 missing').waitFor();
    await page.getByLabel('Damaged, Sidewall 7x20 (field test)', { exact: true }).fill('1');
    await page.getByLabel('What is damaged, Sidewall 7x20 (field test)').fill('Torn along the top seam');
    await page.getByLabel('Photo of the damage, Sidewall 7x20 (field test)').setInputFiles({ name: 'tear.png', mimeType: 'image/png', buffer: PNG });
    await page.getByText('Photo saved.').waitFor();
    await page.getByRole('img', { name: /Damage photo/ }).waitFor();
    expect(await sideways(page)).toBeLessThanOrEqual(0);
    // A second shot taken by mistake comes off again, with the typed count kept.
    await page.getByLabel('Photo of the damage, Sidewall 7x20 (field test)').setInputFiles({ name: 'thumb.png', mimeType: 'image/png', buffer: PNG });
    await expect.poll(() => page.getByRole('img', { name: /Damage photo/ }).count()).toBe(2);
    await page.getByRole('button', { name: /^Remove Damage photo/ }).last().click();
    await page.getByRole('dialog', { name: 'Remove this photo?' }).getByRole('button', { name: 'Remove photo' }).click();
    await page.getByText(/Damage photo.* removed\./).waitFor();
    await expect.poll(() => page.getByRole('img', { name: /Damage photo/ }).count()).toBe(1);
    expect(await page.getByLabel('What is damaged, Sidewall 7x20 (field test)').inputValue()).toBe('Torn along the top seam');

    // Finishing without a count that makes sense is refused with the typed values kept.
    await page.getByLabel('Damaged, Folding chair (field test)', { exact: true }).fill('49');
    await page.getByRole('button', { name: 'Finish check-in' }).click();
    await page.getByText('At most the 48 that came back.').waitFor();
    expect(await page.getByLabel('Came back, Folding chair (field test)', { exact: true }).inputValue()).toBe('48');
    await page.getByLabel('Damaged, Folding chair (field test)', { exact: true }).fill('0');
    await page.getByRole('button', { name: 'Finish check-in' }).click();
    await page.getByText('Checked in.').waitFor();
    expect(await page.locator('body').innerText()).not.toMatch(/\$\d/);

    await expect.poll(async () => (await Booking.findByPk(id))!.status).toBe('returned');
    const check = (await ReturnCheck.findOne({ where: { bookingId: id } }))!;
    expect(check.submittedById).toBe(crewUser.id);
    expect(await FieldPhoto.count({ where: { bookingId: id, stage: 'damage' } })).toBe(1);
    await context.close();

    // The office reviews the proposed charges on the booking page and makes the invoice, with a repair amount.
    const desk = await browser().newContext({ viewport: { width: 1280, height: 900 } });
    const officePage = await desk.newPage();
    await signIn(officePage, 'office@demo.test', DEMO_PASSWORD);
    await officePage.goto(`${appUrl()}/app/bookings/${id}`);
    const charges = officePage.getByRole('group', { name: 'Proposed charges' });
    const descriptions = charges.getByRole('textbox', { name: 'Description' });
    await descriptions.first().waitFor();
    expect(await descriptions.nth(0).inputValue()).toBe('Sidewall 7x20 (field test): 1 damaged (Torn along the top seam)');
    expect(await descriptions.nth(1).inputValue()).toBe('Folding chair (field test): 2 missing');
    const amounts = charges.getByRole('textbox', { name: 'Amount' });
    // Proposed at replacement value: $350.00 for the sidewall, 2 x $24.00 for the chairs (the test catalog's values).
    expect(await amounts.nth(0).inputValue()).toBe('350.00');
    expect(await amounts.nth(1).inputValue()).toBe('48.00');
    await amounts.nth(0).fill('120.00');
    await charges.getByRole('button', { name: 'Make the additional-charges invoice' }).click();
    await officePage.getByRole('link', { name: /draft additional-charges invoice/ }).waitFor();
    const invoice = (await Invoice.findOne({ where: { bookingId: id, kind: 'additional' } }))!;
    expect(invoice.totalCents).toBe(16_800); // 120.00 + 48.00, damage recovery untaxed by default
    await desk.close();
  });
});
