/**
 * Property tests over random sequences of money events on three bookings of two customers:
 * every entry balances, the trial balance's columns are equal, and each booking's balance is
 * invoiced - credited - paid + refunded (a security deposit applied to an invoice counts as paid).
 * Overpayments and credit notes beyond what is owed go to the customer's account credit, which
 * later pays invoices or is paid back; it never goes below zero and always equals its events.
 * Each run gets a company of its own.
 */
import fc from 'fast-check';
import { QueryTypes } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { addDays, zonedTimeToInstant } from '../../../shared/dates';
import { sequelize, withTransaction } from '../../../server/db';
import { accountBalances, bookingBalance, customerCreditCents, customerStatement, paidCents, securityDepositHeldCents, trialBalance } from '../../../server/ledger/balances';
import { ensureChart } from '../../../server/ledger/chart';
import { recognizeDepositsDue } from '../../../server/ledger/jobs';
import {
  creditNote, creditRefunded, eventTiming, invoiceIssued, paymentReceived, postEntry, refundIssued, reverseEntry,
  securityDepositApplied, securityDepositHeld, securityDepositRefunded, type EntryDraft, type InvoiceBreakdown, type PaymentMethod,
} from '../../../server/ledger/post';
import { buildCompany, buildCustomer } from '../../factories';
import { buildLedgerBooking } from './helpers';

const EVENT_DATES = ['2030-05-05', '2030-05-10', '2030-05-15'];
const FIRST_DAY = '2030-05-01';

const b = fc.integer({ min: 0, max: 2 });
const advance = fc.integer({ min: 0, max: 3 });
const method = fc.constantFrom<PaymentMethod>('cash', 'check', 'transfer', 'card');
const pct = fc.integer({ min: 1, max: 100 });
const breakdown = (scale: number) =>
  fc.record({
    rentalCents: fc.integer({ min: 1, max: 60_000 * scale }),
    deliveryLaborCents: fc.integer({ min: 0, max: 20_000 * scale }),
    damageWaiverCents: fc.integer({ min: 0, max: 5_000 * scale }),
    damageCents: fc.integer({ min: 0, max: 8_000 * scale }),
    taxCents: fc.integer({ min: 0, max: 6_000 * scale }),
  });

const op = fc.oneof(
  fc.record({ type: fc.constant('invoice' as const), b, advance, breakdown: breakdown(1) }),
  fc.record({ type: fc.constant('payment' as const), b, advance, amount: fc.integer({ min: 1, max: 80_000 }), method, keep: fc.integer({ min: 0, max: 100 }) }),
  fc.record({ type: fc.constant('refund' as const), b, advance, pct, method }),
  fc.record({ type: fc.constant('credit' as const), b, advance, breakdown: breakdown(0.25), keep: fc.integer({ min: 0, max: 100 }) }),
  fc.record({ type: fc.constant('useCredit' as const), b, advance, pct }),
  fc.record({ type: fc.constant('payCreditBack' as const), b, advance, pct, method }),
  fc.record({ type: fc.constant('sdHeld' as const), b, advance, amount: fc.integer({ min: 1, max: 50_000 }), method }),
  fc.record({ type: fc.constant('sdRefund' as const), b, advance, pct, method }),
  fc.record({ type: fc.constant('sdApply' as const), b, advance, pct, to: fc.constantFrom<'damage' | 'invoice'>('damage', 'invoice') }),
  fc.record({ type: fc.constant('reverse' as const), b, advance, pick: fc.nat() }),
  fc.record({ type: fc.constant('recognize' as const), b, advance }),
);

/** Per booking; `credit` is the customer's account credit that arose on (or was used on) this booking. */
interface Tally { invoiced: number; credited: number; paid: number; refunded: number; sdHeld: number; preTax: number; tax: number; damage: number; credit: number }
const zero = (): Tally => ({ invoiced: 0, credited: 0, paid: 0, refunded: 0, sdHeld: 0, preTax: 0, tax: 0, damage: 0, credit: 0 });
const preTaxOf = (x: InvoiceBreakdown) => x.rentalCents + x.deliveryLaborCents + x.damageWaiverCents;
const damageOf = (x: InvoiceBreakdown) => x.damageCents ?? 0;
/** Bookings 0 and 1 are Alder's, booking 2 is Birch's. */
const CUSTOMER_OF = [0, 0, 1];
// Test-side sums of small integers: exact, and independent of the code under test.
const share = (cents: number, p: number) => Math.max(1, Math.floor((cents * p) / 100));

describe('ledger properties', () => {
  it('every entry balances, the trial balance sums to zero, and booking balances follow the events', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(op, { minLength: 1, maxLength: 24 }), async (ops) => {
        const { organization: org, owner } = await buildCompany();
        const tz = org.timeZone;
        await withTransaction((t) => ensureChart(org.id, t));
        const [alder, birch] = [await buildCustomer(org.id, { name: 'Alder' }), await buildCustomer(org.id, { name: 'Birch' })];
        const bookings = [
          await buildLedgerBooking(org.id, alder.id, EVENT_DATES[0], tz),
          await buildLedgerBooking(org.id, alder.id, EVENT_DATES[1], tz),
          await buildLedgerBooking(org.id, birch.id, EVENT_DATES[2], tz),
        ];
        const tallies = bookings.map(zero);
        const creditOf = (i: number) => tallies.reduce((sum, t, k) => (CUSTOMER_OF[k] === CUSTOMER_OF[i] ? sum + t.credit : sum), 0);
        // Reversible entries with their effect on the tallies.
        const reversible: { id: string; b: number; effect: Partial<Tally>; reversed: boolean }[] = [];
        let posted = 0;
        let day = FIRST_DAY;

        const post = async (i: number, draft: EntryDraft, effect: Partial<Tally>, canReverse: boolean) => {
          const at = zonedTimeToInstant(day, '10:00', tz);
          const entry = await withTransaction((t) => postEntry({ organizationId: org.id, bookingId: bookings[i].id, occurredAt: at, memo: draft.kind, createdById: owner.id, ...draft }, t));
          for (const [k, v] of Object.entries(effect) as [keyof Tally, number][]) tallies[i][k] += v;
          if (canReverse) reversible.push({ id: entry.id, b: i, effect, reversed: false });
          posted += 1;
        };

        for (const o of ops) {
          day = addDays(day, o.advance);
          const i = o.b;
          const tally = tallies[i];
          const timing = eventTiming(bookings[i].eventStart, zonedTimeToInstant(day, '10:00', tz), tz);
          switch (o.type) {
            case 'invoice': {
              const total = preTaxOf(o.breakdown) + damageOf(o.breakdown) + o.breakdown.taxCents;
              await post(i, invoiceIssued(o.breakdown, timing), { invoiced: total, preTax: preTaxOf(o.breakdown), damage: damageOf(o.breakdown), tax: o.breakdown.taxCents }, true);
              break;
            }
            case 'credit': {
              // A credit note's damage part goes to refunds and allowances, like the rest after the event.
              const preTax = preTaxOf(o.breakdown) + damageOf(o.breakdown);
              const total = preTax + o.breakdown.taxCents;
              const kept = Math.floor((total * o.keep) / 100);
              await post(i, creditNote(o.breakdown, timing, kept), { credited: total - kept, credit: kept, preTax: -preTax, tax: -o.breakdown.taxCents }, true);
              break;
            }
            case 'payment': {
              const kept = Math.floor((o.amount * o.keep) / 100);
              await post(i, paymentReceived(o.amount, o.method, kept), { paid: o.amount - kept, credit: kept }, true);
              break;
            }
            case 'useCredit': {
              const available = creditOf(i);
              expect(await customerCreditCents(bookings[i].customerId)).toBe(available);
              if (available <= 0) break; // the caller refuses: no credit to use
              const amount = share(available, o.pct);
              await post(i, paymentReceived(amount, 'credit'), { paid: amount, credit: -amount }, true);
              break;
            }
            case 'payCreditBack': {
              const available = creditOf(i);
              if (available <= 0) break;
              const amount = share(available, o.pct);
              await post(i, creditRefunded(amount, o.method as 'cash'), { credit: -amount }, false);
              break;
            }
            case 'refund': {
              const paid = await paidCents(bookings[i].id);
              expect(paid).toBe(tally.paid - tally.refunded);
              if (paid <= 0) break; // the caller refuses: nothing left to refund
              await post(i, refundIssued(share(paid, o.pct), o.method), { refunded: share(paid, o.pct) }, false);
              break;
            }
            case 'sdHeld':
              await post(i, securityDepositHeld(o.amount, o.method), { sdHeld: o.amount }, false);
              break;
            case 'sdRefund':
              if (tally.sdHeld <= 0) break;
              await post(i, securityDepositRefunded(share(tally.sdHeld, o.pct), o.method), { sdHeld: -share(tally.sdHeld, o.pct) }, false);
              break;
            case 'sdApply': {
              if (tally.sdHeld <= 0) break;
              const amount = share(tally.sdHeld, o.pct);
              await post(i, securityDepositApplied(amount, o.to), o.to === 'invoice' ? { sdHeld: -amount, paid: amount } : { sdHeld: -amount, damage: amount }, false);
              break;
            }
            case 'reverse': {
              const open = reversible.filter((r) => !r.reversed);
              if (!open.length) break;
              const r = open[o.pick % open.length];
              const t2 = tallies[r.b];
              // A payment reversal that would leave more refunded than paid is refused by the caller,
              // and so is one that would take back account credit already used.
              if (r.effect.paid && t2.paid - r.effect.paid < t2.refunded) break;
              if ((r.effect.credit ?? 0) > 0 && creditOf(r.b) - r.effect.credit! < 0) break;
              await withTransaction((t) => reverseEntry(r.id, 'Entered in error', owner.id, t));
              for (const [k, v] of Object.entries(r.effect) as [keyof Tally, number][]) t2[k] -= v;
              r.reversed = true;
              posted += 1;
              break;
            }
            case 'recognize':
              posted += (await withTransaction((t) => recognizeDepositsDue(org.id, day, t))).length;
              break;
          }
        }
        // The daily job after the last event: every deposit is earned.
        posted += (await withTransaction((t) => recognizeDepositsDue(org.id, addDays(EVENT_DATES[2], 1), t))).length;

        // Every entry balances and has two lines or more (the database made sure; the sums say so too).
        const unbalanced = await sequelize.query(
          `SELECT l.entry_id FROM journal_lines l WHERE l.organization_id = :org GROUP BY l.entry_id
            HAVING sum(l.debit_cents) <> sum(l.credit_cents) OR count(*) < 2`,
          { replacements: { org: org.id }, type: QueryTypes.SELECT },
        );
        expect(unbalanced).toEqual([]);
        const [{ n }] = await sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM journal_entries WHERE organization_id = :org`, { replacements: { org: org.id }, type: QueryTypes.SELECT });
        expect(Number(n)).toBe(posted);

        // The trial balance sums to zero.
        const tb = await trialBalance(org.id, '2031-01-01');
        expect(tb.totalDebitCents).toBe(tb.totalCreditCents);

        // Each booking's balance, what was paid, and the security deposit still held.
        for (const [i, booking] of bookings.entries()) {
          const t = tallies[i];
          expect(await bookingBalance(booking.id)).toBe(t.invoiced - t.credited - t.paid + t.refunded);
          expect(await paidCents(booking.id)).toBe(t.paid - t.refunded);
          expect(await securityDepositHeldCents(booking.id)).toBe(t.sdHeld);
        }
        // A customer's statement ends at the sum of their bookings' balances.
        const owed = (k: number) => tallies[k].invoiced - tallies[k].credited - tallies[k].paid + tallies[k].refunded;
        expect((await customerStatement(alder.id)).balanceCents).toBe(owed(0) + owed(1));
        expect((await customerStatement(birch.id)).balanceCents).toBe(owed(2));
        // Account credit: per customer, never negative, and the liability account holds it all.
        expect(await customerCreditCents(alder.id)).toBe(creditOf(0));
        expect(await customerCreditCents(birch.id)).toBe(creditOf(2));
        expect(creditOf(0)).toBeGreaterThanOrEqual(0);
        expect(creditOf(2)).toBeGreaterThanOrEqual(0);

        // After every event date: no deposit is still a liability; net revenue and tax follow the documents.
        const bal = Object.fromEntries((await accountBalances(org.id)).map((a) => [a.systemKey, a.balanceCents]));
        const sumOf = (k: keyof Tally) => tallies.reduce((s, x) => s + x[k], 0);
        expect(bal.customer_deposits).toBe(0);
        expect(bal.rental_revenue + bal.delivery_labor_revenue + bal.damage_waiver_revenue - bal.refunds).toBe(sumOf('preTax'));
        expect(bal.sales_tax_payable).toBe(sumOf('tax'));
        expect(bal.security_deposits_held).toBe(sumOf('sdHeld'));
        expect(bal.damage_recovery).toBe(sumOf('damage'));
        expect(bal.customer_credit ?? 0).toBe(sumOf('credit'));
      }),
      { numRuns: 50, seed: 20_261_201 },
    );
  }, 240_000);

  it('a customer statement runs entry by entry', async () => {
    const { organization: org } = await buildCompany();
    const customer = await buildCustomer(org.id);
    const booking = await buildLedgerBooking(org.id, customer.id, '2030-07-04', org.timeZone);
    const at = (d: string) => zonedTimeToInstant(d, '10:00', org.timeZone);
    const common = { organizationId: org.id, bookingId: booking.id, memo: 'x' };
    await withTransaction(async (t) => {
      await postEntry({ ...common, occurredAt: at('2030-06-01'), ...invoiceIssued({ rentalCents: 40_000, deliveryLaborCents: 10_000, damageWaiverCents: 0, taxCents: 3_625 }, 'before_event') }, t);
      await postEntry({ ...common, occurredAt: at('2030-06-02'), ...paymentReceived(20_000, 'card') }, t);
      await postEntry({ ...common, occurredAt: at('2030-06-03'), ...securityDepositHeld(15_000, 'card') }, t);
      await postEntry({ ...common, occurredAt: at('2030-06-20'), ...paymentReceived(33_625, 'transfer') }, t);
    });
    const s = await customerStatement(customer.id);
    expect(s.lines.map((l) => [l.kind, l.debitCents, l.creditCents, l.balanceCents])).toEqual([
      ['invoice_issued', 53_625, 0, 53_625],
      ['payment_received', 0, 20_000, 33_625],
      ['security_deposit_held', 0, 0, 33_625],
      ['payment_received', 0, 33_625, 0],
    ]);
    expect(s.lines[0].bookingReference).toBe(booking.reference);
    expect(s.balanceCents).toBe(0);
  });
});
