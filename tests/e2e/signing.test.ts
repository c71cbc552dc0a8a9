import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { Booking, Document } from '../../server/models';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { uniqueEmail, waitForMail } from '../support';
import { appUrl, sharedBrowser, signIn } from './browser';

const browser = sharedBrowser();

/** Calls the API as the signed-in page's user (cookies and CSRF header included). */
async function api(page: Page, method: 'GET' | 'POST', path: string, data?: unknown) {
  const csrf = (await page.context().cookies()).find((c) => c.name === 'guyline_csrf')?.value ?? '';
  const res = await page.request.fetch(`${appUrl()}${path}`, { method, data: data as object, headers: { 'X-CSRF-Token': csrf } });
  expect(res.ok(), `${method} ${path}: ${res.status()} ${await res.text()}`).toBe(true);
  return res.json();
}

describe('a customer signs the rental agreement on a phone', () => {
  it('opens the link from the mail, consents, initials, draws a signature and signs; the booking is reserved', { timeout: 120_000 }, async () => {
    const office = await browser().newContext({ viewport: { width: 1366, height: 900 } });
    const desk = await office.newPage();
    await signIn(desk, 'office@demo.test', DEMO_PASSWORD);
    const email = uniqueEmail('phone-signer');
    const customer = await api(desk, 'POST', '/api/customers', { name: 'Tamsin Oakes', email });
    const tent = (await api(desk, 'GET', '/api/items?q=20x20%20pole')).data[0];
    const at = (d: number, t: string) => new Date(Date.UTC(2027, 9, d, ...t.split(':').map(Number) as [number, number])).toISOString();
    const booking = await api(desk, 'POST', '/api/bookings', {
      customerId: customer.id,
      eventStart: at(9, '19:00'), eventEnd: at(10, '03:00'), deliveryStart: at(8, '13:00'), deliveryEnd: at(8, '17:00'),
      pickupStart: at(10, '14:00'), pickupEnd: at(10, '18:00'), guestCount: 40,
      lines: [{ itemId: tent.id, description: tent.name, quantity: 1, unitPriceCents: tent.rentalPriceCents }],
    });
    const doc = await api(desk, 'POST', `/api/bookings/${booking.id}/agreement`);

    // The office sends it for signature from the booking page.
    await desk.goto(`${appUrl()}/app/bookings/${booking.id}`);
    await desk.getByRole('button', { name: `Send for signature Rental agreement ${doc.number}, version 1` }).click();
    await desk.getByRole('button', { name: 'E-mail the signing link' }).click();
    const mail = await waitForMail(email, { subject: /sign your rental agreement/i });
    const link = mail.text.match(/https?:\/\/\S+\/sign\/[A-Za-z0-9_-]+/)![0];

    // The customer, on a phone-sized screen, with no account.
    const phone = await browser().newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: false });
    const page = await phone.newPage();
    await page.goto(link);
    await page.getByRole('heading', { level: 1, name: 'Sign your rental agreement' }).waitFor();
    const popup = phone.waitForEvent('page', { timeout: 5_000 }).catch(() => null);
    await page.getByRole('link', { name: 'Open the agreement as a PDF' }).click();
    await (await popup)?.close();
    await page.getByRole('checkbox', { name: /I have opened the PDF and I agree/ }).check();
    await page.getByRole('button', { name: 'I agree' }).click();

    const initials = page.getByRole('textbox', { name: /^Initials for / });
    while ((await initials.count()) === 0) {
      await page.getByRole('button', { name: /^Continue to/ }).first().click();
    }
    for (const box of await initials.all()) await box.fill('TO');
    const name = page.getByRole('textbox', { name: 'Full legal name' });
    while ((await name.count()) === 0) {
      await page.getByRole('button', { name: /^Continue to/ }).first().click();
    }
    await name.fill('Tamsin Oakes');

    // A signature drawn with the mouse.
    const pad = page.getByRole('img', { name: 'Signature drawing pad' });
    await pad.scrollIntoViewIfNeeded();
    const box = (await pad.boundingBox())!;
    await page.mouse.move(box.x + 20, box.y + box.height * 0.6);
    await page.mouse.down();
    for (let i = 1; i <= 12; i++) await page.mouse.move(box.x + 20 + i * 18, box.y + box.height * (0.6 + 0.25 * Math.sin(i)), { steps: 3 });
    await page.mouse.up();

    await page.getByRole('button', { name: 'Sign the agreement' }).click();
    await page.getByRole('button', { name: 'Download your signed copy' }).waitFor({ timeout: 30_000 });

    // The office now sees the booking reserved, with the signed copy on file.
    expect((await Booking.findByPk(booking.id))!.status).toBe('reserved');
    const signed = await Document.findOne({ where: { bookingId: booking.id, kind: 'signed_agreement' } });
    expect(signed).not.toBeNull();
    await desk.reload();
    await desk.getByText(/Reserved/).first().waitFor();
    await phone.close();
    await office.close();
  });
});
