/**
 * Closed periods and payment dates: the bookkeeper closes the books through a day (the lock date),
 * and nothing posts on or before it, whatever the path (the API, a command, a job, a raw insert);
 * a payment is received between its invoice's issue day and tomorrow. Days are the company's
 * (America/Chicago, the default), never the server's or UTC.
 */
import { Op, QueryTypes } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { addDays, dateInZone, zonedTimeToInstant } from '../../../shared/dates';
import { CSRF_HEADER } from '../../../shared/types';
import { createApp } from '../../../server/app';
import { setLockDate } from '../../../server/commands/closedPeriods';
import { issueInvoice, recordPayment } from '../../../server/commands/invoices';
import { sequelize, withTransaction } from '../../../server/db';
import { ensureChart } from '../../../server/ledger/chart';
import { recognizeDepositsDue } from '../../../server/ledger/jobs';
import { invoiceIssued, postEntry } from '../../../server/ledger/post';
import { Account, AuditLog, Invoice, JournalEntry, Payment, type User } from '../../../server/models';
import { bookingBody, buildCompany, buildCustomer, buildItem, TEST_PASSWORD } from '../../factories';
import { ApiClient } from '../../support';
import { buildLedgerBooking } from '../ledger/helpers';

const app = createApp();
const TZ = 'America/Chicago';
const as = async (user: User) => (await new ApiClient(app).init()).login(user.email, TEST_PASSWORD);
const put = (c: ApiClient, url: string, body: unknown) => c.agent.put(url).set('X-Forwarded-For', c.ip).set(CSRF_HEADER, c.csrf).send(body as object);
const today = () => dateInZone(new Date(), TZ);
const noon = (day: string) => zonedTimeToInstant(day, '12:00', TZ);
const LOCK = '/api/ledger/lock-date';

/** A company with a deposit invoice issued on `issuedOn` (through the command, so it can be back-dated), and its people signed in. */
async function companyWithInvoice(issuedOn: string) {
  const c = await buildCompany();
  const customer = await buildCustomer(c.organization.id, { name: 'Wren Halloway' });
  const tent = await buildItem(c.organization.id, { name: '20x20 frame tent', kind: 'tent', tentType: 'frame', widthFt: 20, lengthFt: 20, quantityOwned: 5, rentalPriceCents: 60_000 });
  const [office, owner, books] = await Promise.all([as(c.office), as(c.owner), as(c.bookkeeper)]);
  const booking = (await office.post('/api/bookings', bookingBody(customer.id, addDays(today(), 60), [{ itemId: tent.id, quantity: 1, unitPriceCents: 60_000 }]))).body as { id: string };
  const draft = await office.post(`/api/bookings/${booking.id}/invoices`, { kind: 'deposit' });
  expect(draft.status).toBe(201);
  const invoice = await withTransaction((t) => issueInvoice(c.office, draft.body.id, null, t, { at: noon(issuedOn), email: false }));
  return { ...c, customer, api: { office, owner, books }, booking, invoice };
}

const pay = (s: { api: { office: ApiClient }; invoice: Invoice }, receivedAt: Date, amountCents = 500) =>
  s.api.office.post('/api/payments', { method: 'check', reference: 'Check 3120', invoiceId: s.invoice.id, amountCents, receivedAt: receivedAt.toISOString() });

/** Polls (at most 400 looks) until a statement about this company's lock date waits for a lock. */
async function waitingOnLockDate(organizationId: string) {
  for (let look = 0; look < 400; look++) {
    const [row] = await sequelize.query<{ n: string }>(
      `SELECT count(*)::text AS n FROM pg_stat_activity WHERE wait_event_type = 'Lock' AND query LIKE :pattern`,
      { replacements: { pattern: `%period_locks%${organizationId}%` }, type: QueryTypes.SELECT },
    );
    if (Number(row.n) > 0) return;
    await new Promise((resolve) => setTimeout(resolve, 25));
  }
  throw new Error('Nothing waited on the lock date.');
}

describe('the lock date', () => {
  it('401 -> 400 -> 403 -> success: the bookkeeper closes and moves it forward, only the owner moves it back; every change is in the audit trail', async () => {
    const c = await buildCompany();
    const other = await buildCompany();
    const t0 = today();
    const anonymous = await new ApiClient(app).init();
    expect((await anonymous.get(LOCK)).status).toBe(401);
    expect((await put(anonymous, LOCK, { closedThrough: addDays(t0, -30) })).status).toBe(401);

    const books = await as(c.bookkeeper);
    const notADay = await put(books, LOCK, { closedThrough: '2026-02-30' });
    expect([notADay.status, Object.keys(notADay.body.error.fields)]).toEqual([400, ['closedThrough']]);
    // Today is never closed: its money is still coming in.
    const todayRefused = await put(books, LOCK, { closedThrough: t0 });
    expect(todayRefused.status).toBe(400);
    expect(todayRefused.body.error.fields.closedThrough).toContain(addDays(t0, -1));
    expect((await put(books, LOCK, { closedThrough: addDays(t0, 30) })).status).toBe(400);

    for (const who of [c.office, c.crew]) {
      const client = await as(who);
      expect((await client.get(LOCK)).status).toBe(403);
      expect((await put(client, LOCK, { closedThrough: addDays(t0, -30) })).status).toBe(403);
    }

    const [d1, d2] = [addDays(t0, -40), addDays(t0, -10)];
    const closed = await put(books, LOCK, { closedThrough: d1 });
    expect(closed.status).toBe(200);
    expect(closed.body).toMatchObject({ closedThrough: d1, closedBy: c.bookkeeper.name, latestClosable: addDays(t0, -1), can: { close: true, reopen: false } });
    expect((await put(books, LOCK, { closedThrough: d2 })).body.closedThrough).toBe(d2);
    // Back, or cleared: the owner's call; the message names the date the books are closed through.
    for (const back of [d1, null]) {
      const refused = await put(books, LOCK, { closedThrough: back });
      expect(refused.status).toBe(403);
      expect(refused.body.error.message).toContain(d2);
    }
    expect((await books.get(LOCK)).body.closedThrough).toBe(d2);

    // Each company has its own: B's bookkeeper closing B's books leaves A's as they are.
    const otherBooks = await as(other.bookkeeper);
    expect((await otherBooks.get(LOCK)).body.closedThrough).toBeNull();
    expect((await put(otherBooks, LOCK, { closedThrough: addDays(t0, -2) })).status).toBe(200);
    expect((await books.get(LOCK)).body.closedThrough).toBe(d2);

    const owner = await as(c.owner);
    const reopened = await put(owner, LOCK, { closedThrough: d1 });
    expect([reopened.status, reopened.body.closedThrough, reopened.body.can]).toEqual([200, d1, { close: true, reopen: true }]);
    // The same date again changes nothing and leaves no row in the trail.
    expect((await put(owner, LOCK, { closedThrough: d1 })).status).toBe(200);
    expect((await put(owner, LOCK, { closedThrough: null })).body.closedThrough).toBeNull();

    const trail = await AuditLog.findAll({ where: { organizationId: c.organization.id, action: { [Op.like]: 'books.%' } }, order: [['createdAt', 'ASC'], ['id', 'ASC']] });
    expect(trail.map((a) => [a.action, a.actorUserId, a.data])).toEqual([
      ['books.closed', c.bookkeeper.id, { from: null, to: d1 }],
      ['books.closed', c.bookkeeper.id, { from: d1, to: d2 }],
      ['books.reopened', c.owner.id, { from: d2, to: d1 }],
      ['books.reopened', c.owner.id, { from: d1, to: null }],
    ]);
  });
});

describe('nothing posts into a closed period', () => {
  it('a payment dated in it is refused with 409 period_closed naming the day and the field; the first open day is fine', async () => {
    const t0 = today();
    const s = await companyWithInvoice(addDays(t0, -20));
    const closedThrough = addDays(t0, -5);
    expect((await put(s.api.books, LOCK, { closedThrough })).status).toBe(200);

    for (const day of [addDays(t0, -6), closedThrough]) {
      const refused = await pay(s, noon(day));
      expect(refused.status).toBe(409);
      expect(refused.body.error).toMatchObject({ code: 'period_closed', fields: { receivedAt: expect.stringContaining(closedThrough) } });
      expect(refused.body.error.message).toContain(`closed through ${closedThrough}`);
      expect(refused.body.closedThrough).toBe(closedThrough);
    }
    // 23:30 on the lock date in Chicago is already the next day in UTC: still the closed day.
    expect((await pay(s, zonedTimeToInstant(closedThrough, '23:30', TZ))).status).toBe(409);
    expect(await Payment.count({ where: { organizationId: s.organization.id } })).toBe(0);

    const open = await pay(s, zonedTimeToInstant(addDays(closedThrough, 1), '00:30', TZ));
    expect(open.status).toBe(201);
    const entry = (await JournalEntry.findOne({ where: { sourceType: 'payment', sourceId: open.body.id } }))!;
    expect(dateInZone(entry.occurredAt, TZ)).toBe(addDays(closedThrough, 1));
  });

  it('an invoice issued after the close is dated today; one dated back into it is refused; a void of an invoice in it posts its reversal today', async () => {
    const t0 = today();
    const s = await companyWithInvoice(addDays(t0, -20));
    expect((await put(s.api.books, LOCK, { closedThrough: addDays(t0, -1) })).status).toBe(200);

    const draft = await s.api.office.post(`/api/bookings/${s.booking.id}/invoices`, { kind: 'balance' });
    const issued = await s.api.office.post(`/api/invoices/${draft.body.id}/issue`);
    expect([issued.status, issued.body.issueDate]).toEqual([200, t0]);
    const issuedEntry = (await JournalEntry.findOne({ where: { sourceType: 'invoice', sourceId: draft.body.id } }))!;
    expect(dateInZone(issuedEntry.occurredAt, TZ)).toBe(t0);

    const late = await s.api.office.post(`/api/bookings/${s.booking.id}/invoices`, { kind: 'additional', lines: [{ charge: 'cleaning', description: 'Mud on the sidewalls', amountCents: 4_000 }] });
    await expect(withTransaction((t) => issueInvoice(s.office, late.body.id, null, t, { at: noon(addDays(t0, -3)), email: false }))).rejects.toMatchObject({
      status: 409,
      code: 'period_closed',
    });
    expect((await Invoice.findByPk(late.body.id))!.status).toBe('draft');

    // The first invoice was issued in the closed period: its void is a reversal dated today.
    const voided = await s.api.owner.post(`/api/invoices/${s.invoice.id}/void`, { reason: 'Booked twice' });
    expect(voided.status).toBe(200);
    const reversal = (await JournalEntry.findOne({ where: { reversesId: s.invoice.ledgerEntryId } }))!;
    expect(dateInZone(reversal.occurredAt, TZ)).toBe(t0);
  });

  it('entries nobody dated go into the open period: deposits of an event in a closed period are recognised today, not refused', async () => {
    const t0 = today();
    const { organization: org, bookkeeper } = await buildCompany();
    const customer = await buildCustomer(org.id);
    const booking = await buildLedgerBooking(org.id, customer.id, addDays(t0, -10), TZ);
    await withTransaction((t) =>
      postEntry({ organizationId: org.id, bookingId: booking.id, occurredAt: noon(addDays(t0, -30)), memo: 'Deposit invoice', ...invoiceIssued({ rentalCents: 30_000, deliveryLaborCents: 5_000, damageWaiverCents: 0, taxCents: 0 }, 'before_event') }, t),
    );
    // The hourly job did not run on the event day; the month is closed before it does.
    await withTransaction((t) => setLockDate(bookkeeper, addDays(t0, -1), null, t));
    const posted = await withTransaction((t) => recognizeDepositsDue(org.id, t0, t));
    expect(posted).toHaveLength(1);
    expect(dateInZone(posted[0].occurredAt, TZ)).toBe(t0);
  });

  it('the database refuses an entry dated in it that did not come through postEntry, by the company’s calendar', async () => {
    const t0 = today();
    const { organization: org, bookkeeper } = await buildCompany();
    await withTransaction((t) => ensureChart(org.id, t));
    const accounts = Object.fromEntries((await Account.findAll({ where: { organizationId: org.id } })).map((a) => [a.systemKey!, a.id]));
    const closedThrough = addDays(t0, -3);
    await withTransaction((t) => setLockDate(bookkeeper, closedThrough, null, t));
    const insertRaw = (at: Date) =>
      withTransaction(async (t) => {
        const [{ id }] = await sequelize.query<{ id: string }>(
          `INSERT INTO journal_entries (organization_id, occurred_at, kind, memo) VALUES (:org, :at, 'payment_received', 'raw') RETURNING id`,
          { replacements: { org: org.id, at }, type: QueryTypes.SELECT, transaction: t },
        );
        for (const [account, d, c] of [[accounts.cash_on_hand, 1_000, 0], [accounts.accounts_receivable, 0, 1_000]] as const) {
          await sequelize.query(`INSERT INTO journal_lines (organization_id, entry_id, account_id, debit_cents, credit_cents) VALUES (:org, :id, :account, :d, :c)`, {
            replacements: { org: org.id, id, account, d, c }, transaction: t,
          });
        }
        return id;
      });
    // 23:30 on the lock date in Chicago: the next day in UTC, the lock date on the company's calendar.
    await expect(insertRaw(zonedTimeToInstant(closedThrough, '23:30', TZ))).rejects.toThrow(`period_closed: the books are closed through ${closedThrough}`);
    await expect(insertRaw(zonedTimeToInstant(addDays(closedThrough, 1), '00:30', TZ))).resolves.toEqual(expect.any(String));
    expect(await JournalEntry.count({ where: { organizationId: org.id } })).toBe(1);
  });
});

describe('posting and closing take turns', () => {
  it('a closing waits for a payment being recorded (which then stands), and a payment waits for a closing under way (and is then refused)', async () => {
    const t0 = today();
    const paidOn = noon(addDays(t0, -5));
    const closedThrough = addDays(t0, -2);

    // A payment in the period, still being recorded, when the bookkeeper closes it.
    const a = await companyWithInvoice(addDays(t0, -20));
    const posting = await sequelize.transaction();
    let closing: Promise<{ status: number; body: { closedThrough: string | null } }>;
    try {
      await recordPayment(
        a.office, { method: 'cash', reference: '', receivedAt: paidOn, allocations: [{ invoiceId: a.invoice.id, amountCents: 500 }], fieldFor: () => 'amountCents', email: false }, null, posting,
      );
      closing = put(a.api.books, LOCK, { closedThrough }).then((r) => r);
      await waitingOnLockDate(a.organization.id);
      await posting.commit();
    } catch (err) {
      await posting.rollback();
      throw err;
    }
    expect((await closing).body.closedThrough).toBe(closedThrough);
    const payment = (await Payment.findOne({ where: { organizationId: a.organization.id } }))!;
    expect(dateInZone((await JournalEntry.findByPk(payment.ledgerEntryId!))!.occurredAt, TZ)).toBe(addDays(t0, -5));

    // A closing under way when the office records a payment in the period.
    const b = await companyWithInvoice(addDays(t0, -20));
    const closingTx = await sequelize.transaction();
    let paying: Promise<{ status: number; body: { error?: { code: string } } }>;
    try {
      await setLockDate(b.bookkeeper, closedThrough, null, closingTx);
      paying = pay(b, paidOn);
      await waitingOnLockDate(b.organization.id);
      await closingTx.commit();
    } catch (err) {
      await closingTx.rollback();
      throw err;
    }
    const refused = await paying;
    expect([refused.status, refused.body.error?.code]).toEqual([409, 'period_closed']);
    expect(await Payment.count({ where: { organizationId: b.organization.id } })).toBe(0);
  }, 60_000);
});

describe('a payment’s received day', () => {
  it('is between the invoice’s issue day and tomorrow, on the company’s calendar; outside, a 400 naming receivedAt', async () => {
    const t0 = today();
    const issuedOn = addDays(t0, -3);
    const s = await companyWithInvoice(issuedOn);
    const startOfIssueDay = zonedTimeToInstant(issuedOn, '00:00', TZ).getTime();
    // A minute before the issue day starts in Chicago (already that day in UTC): refused.
    const before = await pay(s, new Date(startOfIssueDay - 60_000));
    expect(before.status).toBe(400);
    expect(before.body.error.fields).toEqual({ receivedAt: expect.stringContaining(issuedOn) });
    const dayAfterTomorrow = await pay(s, noon(addDays(t0, 2)));
    expect(dayAfterTomorrow.status).toBe(400);
    expect(dayAfterTomorrow.body.error.fields).toEqual({ receivedAt: expect.stringContaining(addDays(t0, 1)) });
    expect(await Payment.count({ where: { organizationId: s.organization.id } })).toBe(0);

    expect((await pay(s, new Date(startOfIssueDay + 60_000))).status).toBe(201);
    expect((await pay(s, zonedTimeToInstant(addDays(t0, 1), '23:00', TZ))).status).toBe(201);
  });
});
