import { describe, expect, it } from 'vitest';
import { zonedTimeToInstant } from '../../../shared/dates';
import { withTransaction } from '../../../server/db';
import { recognizeDepositsDue } from '../../../server/ledger/jobs';
import {
  assertBalanced, cardFeeCharged, creditNote, depositEarned, eventTiming, invoiceIssued, paymentReceived, postEntry, receivingAccount, refundIssued,
  securityDepositApplied, type EntryDraft,
} from '../../../server/ledger/post';
import { Booking, JournalEntry, Organization } from '../../../server/models';
import { buildCompany, buildCustomer } from '../../factories';
import { buildLedgerBooking } from './helpers';

const show = (d: EntryDraft) => d.lines.map((l) => `${l.account}${l.revenueKey ? `(${l.revenueKey})` : ''} ${l.debitCents ? `Dr ${l.debitCents}` : `Cr ${l.creditCents}`}`);
const bill = { rentalCents: 50_000, deliveryLaborCents: 12_500, damageWaiverCents: 0, taxCents: 4_531 };

describe('posting rules', () => {
  it('bill before the event into customer deposits, and on or after it into revenue; tax is always payable', () => {
    expect(show(invoiceIssued(bill, 'before_event'))).toEqual([
      'accounts_receivable Dr 67031', 'customer_deposits(rental_revenue) Cr 50000', 'customer_deposits(delivery_labor_revenue) Cr 12500', 'sales_tax_payable Cr 4531',
    ]);
    expect(show(invoiceIssued(bill, 'on_or_after_event'))).toEqual([
      'accounts_receivable Dr 67031', 'rental_revenue Cr 50000', 'delivery_labor_revenue Cr 12500', 'sales_tax_payable Cr 4531',
    ]);
    expect(() => invoiceIssued({ ...bill, taxCents: -1 }, 'before_event')).toThrow(/taxCents must be whole cents/);
  });

  it('credit a bill back out of deposits before the event and into refunds and allowances after it', () => {
    const small = { rentalCents: 5_000, deliveryLaborCents: 0, damageWaiverCents: 1_000, taxCents: 435 };
    expect(show(creditNote(small, 'before_event'))).toEqual([
      'customer_deposits(rental_revenue) Dr 5000', 'customer_deposits(damage_waiver_revenue) Dr 1000', 'sales_tax_payable Dr 435', 'accounts_receivable Cr 6435',
    ]);
    expect(show(creditNote(small, 'on_or_after_event'))).toEqual(['refunds Dr 6000', 'sales_tax_payable Dr 435', 'accounts_receivable Cr 6435']);
  });

  it('land money by method, refund through receivables, and settle security deposits without revenue while held', () => {
    expect(['cash', 'check', 'transfer', 'card'].map((m) => receivingAccount(m as 'cash'))).toEqual(['cash_on_hand', 'cash_on_hand', 'bank', 'card_clearing']);
    expect(show(paymentReceived(10_000, 'transfer'))).toEqual(['bank Dr 10000', 'accounts_receivable Cr 10000']);
    expect(show(refundIssued(2_500, 'card'))).toEqual(['accounts_receivable Dr 2500', 'card_clearing Cr 2500']);
    expect(show(securityDepositApplied(4_000))).toEqual(['security_deposits_held Dr 4000', 'damage_recovery Cr 4000']);
    expect(show(securityDepositApplied(4_000, 'invoice'))).toEqual(['security_deposits_held Dr 4000', 'accounts_receivable Cr 4000']);
    expect(() => paymentReceived(0, 'cash')).toThrow(/above zero/);
    expect(() => paymentReceived(10.5, 'cash')).toThrow(/whole cents/);
  });

  it('book the card processor\'s fee as an expense out of card clearing, never through receivables', () => {
    const fee = cardFeeCharged(321);
    expect(fee.kind).toBe('card_fee');
    expect(show(fee)).toEqual(['card_processing_fees Dr 321', 'card_clearing Cr 321']);
    expect(() => assertBalanced(fee.lines)).not.toThrow();
    expect(() => cardFeeCharged(0)).toThrow(/above zero/);
  });

  it('earn deposits part by part, the other way round for a part credited below zero', () => {
    expect(show(depositEarned({ rental_revenue: 30_000, delivery_labor_revenue: -200 }))).toEqual([
      'customer_deposits(rental_revenue) Dr 30000', 'rental_revenue Cr 30000',
      'delivery_labor_revenue Dr 200', 'customer_deposits(delivery_labor_revenue) Cr 200',
    ]);
    expect(depositEarned({}).lines).toEqual([]);
    for (const d of [invoiceIssued(bill, 'before_event'), creditNote(bill, 'on_or_after_event'), depositEarned({ rental_revenue: 7, damage_waiver_revenue: -3 })]) {
      expect(() => assertBalanced(d.lines)).not.toThrow();
    }
  });

  it('decide before or after by calendar day in the company\'s zone', () => {
    const event = zonedTimeToInstant('2029-07-04', '09:00', 'America/Denver');
    expect(eventTiming(event, zonedTimeToInstant('2029-07-03', '23:30', 'America/Denver'), 'America/Denver')).toBe('before_event');
    expect(eventTiming(event, zonedTimeToInstant('2029-07-04', '00:10', 'America/Denver'), 'America/Denver')).toBe('on_or_after_event');
  });
});

describe('recognizeDepositsDue', () => {
  it('uses the company\'s zone for the event date, skips cancelled bookings, and posts once when two runs race', async () => {
    const { organization: org } = await buildCompany();
    await Organization.update({ timeZone: 'America/Los_Angeles' }, { where: { id: org.id } });
    const customer = await buildCustomer(org.id);
    // 21:00 on 31 March in Los Angeles is already 1 April in UTC: it is still the 31st's event.
    const late = await buildLedgerBooking(org.id, customer.id, '2029-03-31', 'America/Los_Angeles');
    await late.update({ eventStart: zonedTimeToInstant('2029-03-31', '21:00', 'America/Los_Angeles') });
    const cancelled = await buildLedgerBooking(org.id, customer.id, '2029-03-20', 'America/Los_Angeles');
    await Booking.update({ status: 'cancelled' }, { where: { id: cancelled.id } });
    const at = zonedTimeToInstant('2029-03-01', '12:00', 'America/Los_Angeles');
    await withTransaction(async (t) => {
      for (const b of [late, cancelled]) {
        await postEntry({ organizationId: org.id, bookingId: b.id, occurredAt: at, memo: 'deposit invoice', ...invoiceIssued({ rentalCents: 20_000, deliveryLaborCents: 5_000, damageWaiverCents: 1_000, taxCents: 0 }, 'before_event') }, t);
      }
    });
    expect(await withTransaction((t) => recognizeDepositsDue(org.id, '2029-03-30', t))).toHaveLength(0);
    const runs = await Promise.all([
      withTransaction((t) => recognizeDepositsDue(org.id, '2029-03-31', t)),
      withTransaction((t) => recognizeDepositsDue(org.id, '2029-03-31', t)),
    ]);
    expect(runs.map((r) => r.length).sort()).toEqual([0, 1]);
    expect(await JournalEntry.count({ where: { organizationId: org.id, kind: 'deposit_earned' } })).toBe(1);
    expect(await JournalEntry.count({ where: { bookingId: cancelled.id, kind: 'deposit_earned' } })).toBe(0);
  });
});
