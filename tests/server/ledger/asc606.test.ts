/**
 * ASC 606-10-55-284 to 55-286, Example 38 (Contract Liability and Receivable), Case A
 * (Cancellable Contract), reproduced as our journal entries. The facts, as printed in the
 * codification (read in Deloitte's Roadmap: Revenue Recognition, 14.2 Contract Liabilities):
 * on 1 January an entity enters into a cancellable contract to transfer a product on 31 March;
 * the customer must pay $1,000 in advance by 31 January and pays it on 1 March; the entity
 * performs on 31 March. The codification's entries:
 *   1 March   Dr Cash 1,000 / Cr Contract liability 1,000   (cash received in advance of performance)
 *   31 March  Dr Contract liability 1,000 / Cr Revenue 1,000 (the performance obligation is satisfied)
 * Case A books no receivable on 31 January because the contract is cancellable until paid. In our
 * rental terms: the deposit invoice is issued and paid on 1 March for an event on 31 March, so
 * accounts receivable nets to zero the same day and customer deposits carry the liability.
 * The year 20X9 is played by 2029.
 */
import { describe, expect, it } from 'vitest';
import { zonedTimeToInstant } from '../../../shared/dates';
import { withTransaction } from '../../../server/db';
import { accountBalances, bookingBalance, trialBalance } from '../../../server/ledger/balances';
import { recognizeDepositsDue } from '../../../server/ledger/jobs';
import { eventTiming, invoiceIssued, paymentReceived, postEntry } from '../../../server/ledger/post';
import { buildCompany, buildCustomer } from '../../factories';
import { buildLedgerBooking } from './helpers';

const CONSIDERATION = 100_000; // $1,000 — ASC 606-10-55-284

const nonZero = (tb: Awaited<ReturnType<typeof trialBalance>>) =>
  Object.fromEntries(tb.accounts.filter((a) => a.debitCents || a.creditCents).map((a) => [a.name, a.debitCents ? { dr: a.debitCents } : { cr: a.creditCents }]));

describe('ASC 606 Example 38, Case A: money received before the event is a contract liability until the event', () => {
  it('posts the 1 March receipt to customer deposits and moves it to revenue on 31 March, once', async () => {
    const { organization: org, office } = await buildCompany();
    const tz = org.timeZone;
    const customer = await buildCustomer(org.id, { name: 'Example 38 customer' });
    const booking = await buildLedgerBooking(org.id, customer.id, '2029-03-31', tz);
    const march1 = zonedTimeToInstant('2029-03-01', '10:00', tz);

    await withTransaction(async (t) => {
      const timing = eventTiming(booking.eventStart, march1, tz);
      expect(timing).toBe('before_event');
      const common = { organizationId: org.id, bookingId: booking.id, occurredAt: march1, createdById: office.id };
      await postEntry({ ...common, memo: 'Deposit invoice', ...invoiceIssued({ rentalCents: CONSIDERATION, deliveryLaborCents: 0, damageWaiverCents: 0, taxCents: 0 }, timing) }, t);
      await postEntry({ ...common, memo: 'Check 2210', ...paymentReceived(CONSIDERATION, 'check') }, t);
    });

    // Before the contract's cash date nothing is on the books (Case A: no receivable while cancellable).
    expect(nonZero(await trialBalance(org.id, '2029-02-28'))).toEqual({});

    // Between receipt and performance: Dr Cash 1,000 / Cr Contract liability 1,000; no revenue, nothing owed.
    const mid = await trialBalance(org.id, '2029-03-15');
    expect(nonZero(mid)).toEqual({ 'Cash on hand': { dr: CONSIDERATION }, 'Customer deposits': { cr: CONSIDERATION } });
    expect(mid.totalDebitCents).toBe(mid.totalCreditCents);
    expect(await bookingBalance(booking.id)).toBe(0);

    // The day before the event the job finds nothing to recognise.
    expect(await withTransaction((t) => recognizeDepositsDue(org.id, '2029-03-30', t))).toHaveLength(0);

    // On 31 March: Dr Contract liability 1,000 / Cr Revenue 1,000.
    const earned = await withTransaction((t) => recognizeDepositsDue(org.id, '2029-03-31', t));
    expect(earned).toHaveLength(1);
    expect(earned[0]).toMatchObject({ kind: 'deposit_earned', bookingId: booking.id, customerId: customer.id });
    expect(earned[0].occurredAt).toEqual(zonedTimeToInstant('2029-03-31', '00:00', tz));

    const after = await trialBalance(org.id, '2029-03-31');
    expect(nonZero(after)).toEqual({ 'Cash on hand': { dr: CONSIDERATION }, 'Rental revenue': { cr: CONSIDERATION } });
    const deposits = (await accountBalances(org.id, { at: '2029-03-31' })).find((a) => a.systemKey === 'customer_deposits')!;
    expect(deposits.balanceCents).toBe(0);
    // The liability still shows the day before: the entry is dated the event day, not the run.
    expect(nonZero(await trialBalance(org.id, '2029-03-30'))['Customer deposits']).toEqual({ cr: CONSIDERATION });

    // Idempotent: running again, that day or later, posts nothing.
    expect(await withTransaction((t) => recognizeDepositsDue(org.id, '2029-03-31', t))).toHaveLength(0);
    expect(await withTransaction((t) => recognizeDepositsDue(org.id, new Date('2029-04-02T12:00:00Z'), t))).toHaveLength(0);
  });

  it('splits recognition by the invoice\'s own parts and leaves tax and security deposits alone', async () => {
    const { organization: org } = await buildCompany();
    const customer = await buildCustomer(org.id);
    const booking = await buildLedgerBooking(org.id, customer.id, '2029-06-09', org.timeZone);
    const may = zonedTimeToInstant('2029-05-01', '09:00', org.timeZone);
    const { securityDepositHeld } = await import('../../../server/ledger/post');
    await withTransaction(async (t) => {
      const common = { organizationId: org.id, bookingId: booking.id, occurredAt: may, memo: 'x' };
      await postEntry({ ...common, ...invoiceIssued({ rentalCents: 60_000, deliveryLaborCents: 15_000, damageWaiverCents: 6_000, taxCents: 5_873 }, 'before_event') }, t);
      await postEntry({ ...common, ...securityDepositHeld(25_000, 'card') }, t);
    });
    await withTransaction((t) => recognizeDepositsDue(org.id, '2029-06-09', t));
    const tb = nonZero(await trialBalance(org.id, '2029-06-09'));
    expect(tb).toEqual({
      'Card clearing': { dr: 25_000 },
      'Accounts receivable': { dr: 86_873 },
      'Security deposits held': { cr: 25_000 },
      'Sales tax payable': { cr: 5_873 },
      'Rental revenue': { cr: 60_000 },
      'Delivery and labor revenue': { cr: 15_000 },
      'Damage waiver revenue': { cr: 6_000 },
    });
  });
});
