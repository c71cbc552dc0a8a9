import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { Invoice, ReturnCheck } from '../../../server/models';
import { as as signIn, booking, fieldCompany } from './fieldCompany';

const app = createApp();
const as = (user: Parameters<typeof signIn>[1]) => signIn(app, user);

describe('damage and missing items become proposed charges for the office', () => {
  it('a damaged sidewall and missing chairs: proposed at replacement value, edited to a repair amount, invoiced once, paid from the security deposit', async () => {
    const c = await fieldCompany();
    const office = await as(c.office);
    const a = await booking(office, c.customer.id, '2027-06-12', [
      { itemId: c.wall.id, quantity: 4, description: 'Sidewall 7x20' },
      { itemId: c.chairs.id, quantity: 50, description: 'White folding chair' },
    ], { securityDepositCents: 50_000 });
    const crew = await as(c.crew);
    await crew.post(`/api/field/bookings/${a.id}/marks`, { mark: 'delivered' });

    // Before the check-in is finished there is nothing to charge, and the crew never reaches this.
    expect((await crew.get(`/api/field/bookings/${a.id}/charges`)).status).toBe(403);
    const early = await office.get(`/api/field/bookings/${a.id}/charges`);
    expect(early.body).toMatchObject({ submittedAt: null, lines: [], invoice: null, can: { createInvoice: false } });
    expect((await office.post(`/api/field/bookings/${a.id}/charges`, { lines: [{ key: c.wall.id, charge: 'damage', description: 'x', amountCents: 100 }] })).status).toBe(409);

    const done = await crew.agent.put(`/api/field/bookings/${a.id}/return-check`).set('X-CSRF-Token', crew.csrf).set('X-Forwarded-For', crew.ip).send({
      submit: true,
      lines: [{ key: c.wall.id, returned: 4, damaged: 1, notes: 'Torn along the top seam' }, { key: c.chairs.id, returned: 48 }],
    });
    expect(done.status).toBe(200);

    const proposed = await office.get(`/api/field/bookings/${a.id}/charges`);
    expect(proposed.status).toBe(200);
    // Replacement values from the test catalog: sidewall $350.00, chair $24.00.
    expect(proposed.body.lines).toEqual([
      expect.objectContaining({ key: c.wall.id, damaged: 1, missing: 0, replacementValueCents: 35_000, proposed: [{ charge: 'damage', quantity: 1, description: 'Sidewall 7x20: 1 damaged (Torn along the top seam)', amountCents: 35_000 }] }),
      expect.objectContaining({ key: c.chairs.id, damaged: 0, missing: 2, proposed: [{ charge: 'missing', quantity: 2, description: 'White folding chair: 2 missing', amountCents: 4_800 }] }), // 2 x $24.00
    ]);
    expect(proposed.body.can.createInvoice).toBe(true);

    // 400: charges must match the check-in; nothing is made.
    const bad = await office.post(`/api/field/bookings/${a.id}/charges`, { lines: [{ key: c.wall.id, charge: 'missing', description: 'Sidewall', amountCents: 100 }, { key: 'nope', charge: 'damage', description: 'x', amountCents: 0 }] });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['lines.1.amountCents']);
    const mismatch = await office.post(`/api/field/bookings/${a.id}/charges`, { lines: [{ key: c.wall.id, charge: 'missing', description: 'Sidewall', amountCents: 100 }] });
    expect(mismatch.status).toBe(400);
    expect(mismatch.body.error.fields['lines.0.charge']).toMatch(/missing/);
    expect(await Invoice.count({ where: { bookingId: a.id, kind: 'additional' } })).toBe(0);

    // The office puts the repair at $120.00 instead of the replacement value.
    const made = await office.post(`/api/field/bookings/${a.id}/charges`, {
      lines: [
        { key: c.wall.id, charge: 'damage', description: 'Sidewall 7x20: 1 damaged (Torn along the top seam)', amountCents: 12_000 },
        { key: c.chairs.id, charge: 'missing', description: 'White folding chair: 2 missing', amountCents: 4_800 },
      ],
    });
    expect(made.status).toBe(201);
    expect(made.body.invoice).toMatchObject({ status: 'draft', number: null, totalCents: 16_800 }); // 120.00 + 48.00; damage recovery untaxed by default
    expect(made.body.can.createInvoice).toBe(false);
    expect((await ReturnCheck.findOne({ where: { bookingId: a.id } }))!.chargesInvoiceId).toBe(made.body.invoice.id);
    const again = await office.post(`/api/field/bookings/${a.id}/charges`, { lines: [{ key: c.wall.id, charge: 'damage', description: 'again', amountCents: 100 }] });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('already_invoiced');

    // The office issues it and settles it from the security deposit.
    const invoice = (await office.get(`/api/invoices/${made.body.invoice.id}`)).body;
    expect(invoice.kind).toBe('additional');
    expect(invoice.lines.filter((l: { category: string }) => l.category === 'damage')).toHaveLength(2);
    expect((await office.post(`/api/invoices/${invoice.id}/issue`)).status).toBe(200);
    expect((await office.post(`/api/bookings/${a.id}/security-deposit`, { action: 'collect', amountCents: 50_000, method: 'cash' })).status).toBe(201);
    const applied = await office.post(`/api/bookings/${a.id}/security-deposit`, { action: 'apply', invoiceId: invoice.id, amountCents: 16_800, reason: 'Damage and missing items' });
    expect(applied.status).toBe(201);
    expect(applied.body.heldCents).toBe(33_200); // 500.00 - 168.00
    expect((await office.get(`/api/invoices/${invoice.id}`)).body).toMatchObject({ status: 'paid', balanceCents: 0 });
    expect((await office.get(`/api/field/bookings/${a.id}/charges`)).body).toMatchObject({ invoice: { status: 'paid' }, securityDepositHeldCents: 33_200 });
  });
});
