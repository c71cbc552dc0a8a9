import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { sendReminders } from '../../../server/jobs/reminders';
import { AuditLog, Organization, type User } from '../../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient, mailTo, uniqueEmail, waitForMail } from '../../support';
import { addDays } from '../../../shared/dates';

const app = createApp();
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);

describe('reminders', () => {
  it('a balance-due reminder goes out once, an overdue notice once, and none when the company turned them off', async () => {
    const c = await buildCompany();
    const email = uniqueEmail('reminded');
    const customer = await buildCustomer(c.organization.id, { name: 'Perry Lowry', email });
    const tent = await buildItem(c.organization.id, { name: 'Tent', kind: 'tent', tentType: 'pole', widthFt: 20, lengthFt: 20, quantityOwned: 5, rentalPriceCents: 35_000 });
    const office = await as(c.office);
    const booking = (await office.post('/api/bookings', bookingBody(customer.id, '2027-09-25', [{ itemId: tent.id, quantity: 1, unitPriceCents: 35_000 }]))).body;
    const inv = (await office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'balance' })).body;
    const issued = (await office.post(`/api/invoices/${inv.id}/issue`)).body;
    const due: string = issued.dueDate;
    const org = (await Organization.findByPk(c.organization.id))!;
    // Three days before the due date (the default), then again the same day: one reminder.
    expect(await sendReminders(org, addDays(due, -3))).toBe(1);
    expect(await sendReminders(org, addDays(due, -2))).toBe(0);
    await waitForMail(email, { subject: /^Reminder: .* due by/ });
    // The day after the due date: the overdue notice, once.
    expect(await sendReminders(org, addDays(due, 1))).toBe(1);
    expect(await sendReminders(org, addDays(due, 2))).toBe(0);
    await waitForMail(email, { subject: /^Overdue:/ });
    expect(await AuditLog.count({ where: { subjectId: booking.id, action: ['reminder.balance_due', 'reminder.overdue'] } })).toBe(2);

    // The owner turns reminders off; only the fields sent change, the rest of the rules stay.
    const owner = await as(c.owner);
    const before = (await owner.get('/api/organization/rules')).body;
    const put = await owner.agent.put('/api/organization/rules').set('X-CSRF-Token', owner.csrf).set('X-Forwarded-For', owner.ip)
      .send({ reminders: { ...before.reminders, balanceDue: false, overdue: false } });
    expect(put.status).toBe(200);
    expect(put.body.taxRateBp).toBe(before.taxRateBp);
    const second = (await office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'balance' })).body;
    expect(second.error?.code ?? null).toBe('nothing_to_invoice');
    const other = (await office.post('/api/bookings', bookingBody(customer.id, '2027-10-02', [{ itemId: tent.id, quantity: 1, unitPriceCents: 35_000 }]))).body;
    const inv2 = (await office.post(`/api/bookings/${other.id}/invoices`, { kind: 'balance' })).body;
    const issued2 = (await office.post(`/api/invoices/${inv2.id}/issue`)).body;
    const silent = (await Organization.findByPk(c.organization.id))!;
    expect(await sendReminders(silent, addDays(issued2.dueDate, -1))).toBe(0);
    expect(await sendReminders(silent, addDays(issued2.dueDate, 5))).toBe(0);
    expect((await mailTo(email)).filter((m) => /Reminder|Overdue/.test(m.subject))).toHaveLength(2);
  });
});
