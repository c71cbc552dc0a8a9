/** Request log lines keep secret links out: the signing, pay and calendar tokens in their paths. */
import { describe, expect, it, vi } from 'vitest';
import type { User } from '../../server/models';
import { createApp, withoutTokens } from '../../server/app';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../factories';
import { ApiClient, uniqueEmail, waitForMail } from '../support';

// The request log on, into memory: the app's own pino-http set-up, serializers and all, with
// only the destination swapped for one the test can read.
const logged = vi.hoisted(() => {
  process.env.LOG_LEVEL = 'info';
  return [] as string[];
});
vi.mock('../../server/logger', async () => {
  const { default: pino } = await import('pino');
  return { logger: pino({ level: 'info' }, { write: (line: string) => void logged.push(line) }) };
});

describe('request log paths', () => {
  it('mask long random path segments and token query values, keep record ids and ordinary paths', () => {
    const token = 'q3Zx9_Lr-T0aVb8NcD2eF4gH6iJ7kL1mN5oP0rS9tUw'; // 43 characters, as the product's links carry (32 random bytes, base64url)
    const id = '0b6f3c5e-2a41-4d7e-9c1a-7f2e8d9b4a10';
    const mac = 'Zk3_pQ8rT1vW5xY9aB2cD4eF6gH7iJ0k'; // 32 characters, as a pay link's HMAC
    expect(withoutTokens(`/api/sign/${token}/consent`)).toBe('/api/sign/[token]/consent');
    expect(withoutTokens(`/api/field/calendar/${token}.ics`)).toBe('/api/field/calendar/[token]');
    expect(withoutTokens(`/api/pay/${token}`)).toBe('/api/pay/[token]');
    // Pay links: the invoice id goes with the HMAC, in both the old and the current shape.
    expect(withoutTokens(`/api/pay/${id}.${mac}`)).toBe('/api/pay/[token]');
    expect(withoutTokens(`/api/pay/${id}.0.20800.${mac}/documents/${id}/pdf`)).toBe(`/api/pay/[token]/documents/${id}/pdf`);
    expect(withoutTokens(`/api/bookings/${id}/history`)).toBe(`/api/bookings/${id}/history`);
    expect(withoutTokens('/api/exports/paid-invoices.csv?from=2027-01-01')).toBe('/api/exports/paid-invoices.csv?from=2027-01-01');
    expect(withoutTokens('/api/bookings?from=2026-06-01T05%3A00%3A00.000Z&page=1')).toBe('/api/bookings?from=2026-06-01T05%3A00%3A00.000Z&page=1');
    expect(withoutTokens(`/api/portal/session?token=${token}&next=/portal`)).toBe('/api/portal/session?token=[hidden]&next=/portal');
  });
});

describe('the request log', () => {
  it('writes a pay link’s request with the whole token masked: neither the invoice id nor the HMAC', async () => {
    const app = createApp();
    const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
    // A pay link as a customer gets one: an issued invoice's e-mail.
    const c = await buildCompany();
    const email = uniqueEmail('logged');
    const customer = await buildCustomer(c.organization.id, { name: 'Bertil Quennell', email });
    const chairs = await buildItem(c.organization.id, { name: 'White folding chair', kind: 'chair', quantityOwned: 100, rentalPriceCents: 250 });
    const office = await as(c.office);
    const booking = (await office.post('/api/bookings', bookingBody(customer.id, '2027-08-14', [{ itemId: chairs.id, quantity: 40, unitPriceCents: 250 }], { taxRateBp: 0, damageWaiver: false }))).body;
    const draft = (await office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' })).body;
    const invoice = (await office.post(`/api/invoices/${draft.id}/issue`)).body as { id: string; number: string; documentId: string };
    const mail = await waitForMail(email, { subject: new RegExp(invoice.number) });
    const token = mail.text.match(/\/pay\/([A-Za-z0-9._-]+)/)![1];
    const pieces = token.split('.');
    expect(pieces[0]).toBe(invoice.id);
    const mac = pieces[pieces.length - 1];

    const customerBrowser = await new ApiClient(app).init();
    expect((await customerBrowser.get(`/api/pay/${token}`)).status).toBe(200);
    expect((await customerBrowser.get(`/api/pay/${token}/documents/${invoice.documentId}/pdf`)).status).toBe(200);

    // pino-http writes when the response has finished; look a few times.
    const payLines = () => logged.map((l) => JSON.parse(l) as { req?: { url: string }; res?: { statusCode: number } }).filter((l) => l.req?.url.startsWith('/api/pay/'));
    for (let i = 0; i < 50 && payLines().length < 2; i++) await new Promise((r) => setTimeout(r, 20));
    expect(payLines().map((l) => [l.req!.url, l.res!.statusCode])).toEqual([
      ['/api/pay/[token]', 200],
      [`/api/pay/[token]/documents/${invoice.documentId}/pdf`, 200],
    ]);
    const raw = logged.filter((l) => l.includes('/api/pay/'));
    for (const line of raw) {
      expect(line).not.toContain(invoice.id);
      for (const piece of pieces.slice(1)) if (piece.length > 8) expect(line).not.toContain(piece);
    }
    // Nowhere in the log, whatever the request.
    expect(logged.filter((l) => l.includes(mac))).toEqual([]);
  });
});
