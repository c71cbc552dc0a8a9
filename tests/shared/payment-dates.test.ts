/**
 * The schemas the payment dialog and the closed-books panel check with before sending, the same
 * rules the server applies: a payment is received between its invoices' issue day and tomorrow, and
 * the books close through yesterday at the latest, both on the company's calendar.
 */
import { describe, expect, it } from 'vitest';
import { zonedTimeToInstant } from '../../shared/dates';
import { lockDateRequestOn } from '../../shared/schemas/books';
import { recordPaymentRequestFor } from '../../shared/schemas/invoices';

const TZ = 'America/Chicago';
const A = '00000000-0000-4000-8000-00000000000a';
const B = '00000000-0000-4000-8000-00000000000b';
const issued: Record<string, string> = { [A]: '2027-03-02', [B]: '2027-03-09' };
const schema = recordPaymentRequestFor({ issueDateOf: (id) => issued[id], today: '2027-03-10', timeZone: TZ });
const at = (day: string, time: string) => zonedTimeToInstant(day, time, TZ).toISOString();
const problem = (body: Record<string, unknown>) => {
  const r = schema.safeParse({ method: 'cash', ...body });
  return r.success ? null : (r.error.issues.find((i) => i.path[0] === 'receivedAt')?.message ?? null);
};

describe('recordPaymentRequestFor', () => {
  it('takes the issue day through tomorrow, by the company’s calendar', () => {
    const one = (receivedAt: string) => problem({ invoiceId: A, amountCents: 100, receivedAt });
    // 23:59 on 1 March in Chicago is 2 March in UTC: still the day before the issue day.
    expect(one(at('2027-03-01', '23:59'))).toBe('The invoice was issued on 2027-03-02: enter a day on or after it.');
    expect(one(at('2027-03-02', '00:01'))).toBeNull();
    expect(one(at('2027-03-11', '23:59'))).toBeNull();
    expect(one(at('2027-03-12', '00:01'))).toBe('Enter a day no later than tomorrow (2027-03-11): the day the money came in.');
  });

  it('in a split, the latest issue day of the invoices paid counts', () => {
    const split = (receivedAt: string) => problem({ allocations: [{ invoiceId: A, amountCents: 100 }, { invoiceId: B, amountCents: 100 }], receivedAt });
    expect(split(at('2027-03-05', '12:00'))).toBe('The invoice was issued on 2027-03-09: enter a day on or after it.');
    expect(split(at('2027-03-09', '12:00'))).toBeNull();
  });
});

describe('lockDateRequestOn', () => {
  it('closes through yesterday at the latest; null reopens', () => {
    const on = lockDateRequestOn('2027-03-10');
    expect(on.safeParse({ closedThrough: '2027-03-09' }).success).toBe(true);
    expect(on.safeParse({ closedThrough: null }).success).toBe(true);
    const today = on.safeParse({ closedThrough: '2027-03-10' });
    expect(today.success ? null : today.error.issues[0]).toMatchObject({ path: ['closedThrough'], message: expect.stringContaining('2027-03-09') });
    expect(on.safeParse({ closedThrough: '2027-02-30' }).success).toBe(false);
  });
});
