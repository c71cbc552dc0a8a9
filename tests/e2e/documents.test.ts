import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { Booking, Customer, Document, Organization } from '../../server/models';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { readFile } from '../../server/services/storage';
import { waitForMail } from '../support';
import { appUrl, sharedBrowser, signIn } from './browser';

const browser = sharedBrowser();

describe('the office issues a rental agreement and e-mails it', () => {
  it('creates the agreement on a booking, previews it and sends it; the customer gets the stored PDF', { timeout: 90_000 }, async () => {
    const demo = (await Organization.findOne({ where: { name: 'Foxglove Tent & Table' } }))!;
    // A quoted booking of the demo season that no other test touches.
    const booking = (await Booking.findOne({
      where: { organizationId: demo.id, status: 'quoted' },
      include: [{ model: Customer, as: 'customer' }],
      order: [['eventStart', 'ASC']],
    })) as Booking & { customer: Customer };
    const context = await browser().newContext({ viewport: { width: 1366, height: 900 } });
    const page = await context.newPage();
    await signIn(page, 'office@demo.test', DEMO_PASSWORD);
    await page.goto(`${appUrl()}/app/bookings/${booking.id}`);
    await page.getByRole('heading', { level: 2, name: 'Documents' }).waitFor();

    await page.getByRole('button', { name: 'Create rental agreement' }).click();
    const name = `Rental agreement RA-${booking.reference}, version 1`;
    await page.getByRole('listitem', { name }).waitFor();

    await page.getByRole('button', { name: `Preview ${name}` }).click();
    await page.locator(`iframe[title="Preview of RA-${booking.reference}"]`).waitFor();

    await page.getByRole('button', { name: `Send to customer ${name}` }).click();
    const to = page.getByLabel('Send to (e-mail)');
    expect(await to.inputValue()).toBe(booking.customer.email);
    await page.getByRole('button', { name: 'Send e-mail', exact: true }).dblclick();
    await page.getByText(/^Sent at/).first().waitFor({ timeout: 20_000 });

    const mail = await waitForMail(booking.customer.email, { subject: /agreement/i });
    const doc = (await Document.findOne({ where: { bookingId: booking.id, kind: 'rental_agreement', version: 1 } }))!;
    const stored = (await readFile(demo.id, doc.fileId))!;
    expect(mail.attachments[0].sha256).toBe(createHash('sha256').update(stored.data).digest('hex'));
    expect(mail.attachments[0].sha256).toBe(doc.sha256);
    await context.close();
  });
});
