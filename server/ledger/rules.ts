/**
 * The posting rules: each money event becomes ONE balanced journal entry, and each rule below
 * says which accounts it touches and why. Pure functions from amounts to entry drafts, so the
 * invoice, payment and settlement commands call them with their own figures, and tests can check
 * them without a database. `postEntry` (post.ts) writes a draft.
 *
 * Sides, for readers who are not bookkeepers: assets and contra revenue grow with debits;
 * liabilities and revenue grow with credits. Accounts receivable (AR) is what customers owe us.
 */
import { dateInZone } from '../../shared/dates';
import { subtract, sum } from '../../shared/money';
import type { RevenueKey, SystemKey } from './chart';

export type EntryKind =
  | 'invoice_issued' | 'payment_received' | 'refund' | 'credit_note' | 'deposit_earned'
  | 'security_deposit_held' | 'security_deposit_refunded' | 'security_deposit_applied' | 'credit_refunded' | 'card_fee' | 'reversal';

export interface LineDraft {
  account: SystemKey;
  debitCents?: number;
  creditCents?: number;
  /** On customer-deposit lines: the revenue account this amount becomes on the event date. */
  revenueKey?: RevenueKey;
}

export interface EntryDraft { kind: EntryKind; lines: LineDraft[] }

/** An invoice's (or credit note's) amounts by where they belong; pre-tax parts after discounts. */
export interface InvoiceBreakdown {
  rentalCents: number;
  deliveryLaborCents: number;
  damageWaiverCents: number;
  /** Damage and missing stock billed after the event: always damage recovery, never a deposit. */
  damageCents?: number;
  taxCents: number;
}

/** Whether a document is dated before the event day (in the company's zone) or on/after it. */
export type EventTiming = 'before_event' | 'on_or_after_event';

/** Money, or what the customer already had with us: the held security deposit or their account credit. */
export type PaymentMethod = 'cash' | 'check' | 'transfer' | 'card' | 'security_deposit' | 'credit';

/**
 * Where money taken by each method lands. Cash and checks in hand wait in cash on hand until the
 * bank deposit (the bookkeeper's deposit entry moves them); transfers land in the bank; card
 * payments sit in card clearing until the processor pays out.
 */
export function receivingAccount(method: PaymentMethod): SystemKey {
  switch (method) {
    case 'cash':
    case 'check':
      return 'cash_on_hand';
    case 'transfer':
      return 'bank';
    case 'card':
      return 'card_clearing';
    // Paid from the held deposit: the liability goes down instead of cash coming in.
    case 'security_deposit':
      return 'security_deposits_held';
    // Paid from account credit: likewise, the credit we owe the customer goes down.
    case 'credit':
      return 'customer_credit';
  }
}

const revenueParts = (b: InvoiceBreakdown): [RevenueKey, number][] => [
  ['rental_revenue', b.rentalCents],
  ['delivery_labor_revenue', b.deliveryLaborCents],
  ['damage_waiver_revenue', b.damageWaiverCents],
];

/** Lines with a zero amount say nothing; a draft keeps only the lines that move money. */
const nonZero = (lines: LineDraft[]) => lines.filter((l) => (l.debitCents ?? 0) > 0 || (l.creditCents ?? 0) > 0);

function assertBreakdown(b: InvoiceBreakdown) {
  for (const [k, v] of Object.entries(b)) {
    if (!Number.isSafeInteger(v) || v < 0) throw new RangeError(`${k} must be whole cents and not negative; got ${v}.`);
  }
}

function assertAmount(amountCents: number) {
  if (!Number.isSafeInteger(amountCents) || amountCents <= 0) throw new RangeError(`The amount must be whole cents above zero; got ${amountCents}.`);
}

/**
 * Invoice issued. The customer now owes the total: Dr AR.
 * - Before the event nothing has been delivered yet, so the pre-tax amount is a contract liability,
 *   not revenue (ASC 606-10-45-2: consideration due before the entity performs is presented as a
 *   contract liability): Cr customer deposits, each part tagged with the revenue account it will
 *   become on the event date.
 * - On or after the event the service has been performed: Cr the revenue accounts directly.
 * Sales tax is never ours: Cr sales tax payable, due to the state when billed.
 */
export function invoiceIssued(b: InvoiceBreakdown, timing: EventTiming): EntryDraft {
  assertBreakdown(b);
  const damage = b.damageCents ?? 0;
  const total = sum([b.rentalCents, b.deliveryLaborCents, b.damageWaiverCents, damage, b.taxCents]);
  const sides: LineDraft[] = revenueParts(b).map(([key, cents]) =>
    timing === 'before_event' ? { account: 'customer_deposits', creditCents: cents, revenueKey: key } : { account: key, creditCents: cents },
  );
  return {
    kind: 'invoice_issued',
    lines: nonZero([
      { account: 'accounts_receivable', debitCents: total },
      ...sides,
      // Damage is billed for harm already done: income when billed, whatever the event date.
      { account: 'damage_recovery', creditCents: damage },
      { account: 'sales_tax_payable', creditCents: b.taxCents },
    ]),
  };
}

/**
 * Credit note: the mirror of the invoice's revenue or deposit side, reducing what the customer
 * owes (Cr AR), with the tax given back (Dr sales tax payable).
 * - Before the event the amount is still a customer deposit: Dr customer deposits (tagged), so
 *   less becomes revenue on the event date.
 * - On or after the event: Dr refunds and allowances (contra revenue) rather than the revenue
 *   accounts themselves, so the books show gross revenue and what was given back separately.
 * Either way net revenue ends the same once the event date has passed. A damage part always goes
 * to refunds and allowances: damage recovery was income when billed.
 *
 * `toCreditCents`: the part the invoice had no balance left for (it was paid). The customer is
 * owed that money: Cr customer credit instead of AR, so AR never shows a debt paid twice.
 */
export function creditNote(b: InvoiceBreakdown, timing: EventTiming, toCreditCents = 0): EntryDraft {
  assertBreakdown(b);
  const damage = b.damageCents ?? 0;
  const preTax = sum([b.rentalCents, b.deliveryLaborCents, b.damageWaiverCents, damage]);
  const total = sum([preTax, b.taxCents]);
  if (!Number.isSafeInteger(toCreditCents) || toCreditCents < 0 || toCreditCents > total) throw new RangeError(`The credit part must be whole cents between 0 and ${total}; got ${toCreditCents}.`);
  const sides: LineDraft[] =
    timing === 'before_event'
      ? [...revenueParts(b).map(([key, cents]): LineDraft => ({ account: 'customer_deposits', debitCents: cents, revenueKey: key })), { account: 'refunds', debitCents: damage }]
      : [{ account: 'refunds', debitCents: preTax }];
  return {
    kind: 'credit_note',
    lines: nonZero([
      ...sides,
      { account: 'sales_tax_payable', debitCents: b.taxCents },
      { account: 'accounts_receivable', creditCents: subtract(total, toCreditCents) },
      { account: 'customer_credit', creditCents: toCreditCents },
    ]),
  };
}

/**
 * Payment received: the money arrives (Dr cash, bank or card clearing; or the held deposit or
 * account credit goes down) and the customer owes that much less (Cr AR). `toCreditCents`, the
 * part of an overpayment kept for the customer, is not owed by them: Cr customer credit.
 */
export function paymentReceived(amountCents: number, method: PaymentMethod, toCreditCents = 0): EntryDraft {
  assertAmount(amountCents);
  if (!Number.isSafeInteger(toCreditCents) || toCreditCents < 0 || toCreditCents > amountCents) throw new RangeError(`The credit part must be whole cents between 0 and ${amountCents}; got ${toCreditCents}.`);
  if (toCreditCents > 0 && method === 'credit') throw new RangeError('Account credit cannot overpay into account credit.');
  return {
    kind: 'payment_received',
    lines: nonZero([
      { account: receivingAccount(method), debitCents: amountCents },
      { account: 'accounts_receivable', creditCents: subtract(amountCents, toCreditCents) },
      { account: 'customer_credit', creditCents: toCreditCents },
    ]),
  };
}

/**
 * The card processor's fee on a card payment: the processor pays out the payment less its fee, so
 * card clearing holds that much less (Cr card clearing) and the fee is a cost of doing business
 * (Dr card processing fees, an expense). It never touches AR: the customer paid the whole amount.
 */
export function cardFeeCharged(feeCents: number): EntryDraft {
  assertAmount(feeCents);
  return {
    kind: 'card_fee',
    lines: [{ account: 'card_processing_fees', debitCents: feeCents }, { account: 'card_clearing', creditCents: feeCents }],
  };
}

/** Account credit paid back to the customer: the credit goes (Dr customer credit) with the money (Cr cash, bank or card clearing). */
export function creditRefunded(amountCents: number, method: 'cash' | 'check' | 'transfer' | 'card'): EntryDraft {
  assertAmount(amountCents);
  return {
    kind: 'credit_refunded',
    lines: [{ account: 'customer_credit', debitCents: amountCents }, { account: receivingAccount(method), creditCents: amountCents }],
  };
}

/**
 * Refund: money goes back out (Cr cash, bank or card clearing) and the debit goes to AR, not to
 * the refunds account. Why: a refund undoes a payment, it does not by itself reduce what was
 * earned. When the customer is owed money because a credit note lowered the bill, that credit
 * note already reduced revenue (or deposits) and left AR in credit; the refund brings AR back to
 * zero. A refund with no credit note leaves the customer owing again, which is the truth. Booking
 * balance therefore = invoiced - credited - paid + refunded. The caller must never refund more than
 * `paidCents` (balances.ts).
 */
export function refundIssued(amountCents: number, method: PaymentMethod): EntryDraft {
  assertAmount(amountCents);
  return {
    kind: 'refund',
    lines: [{ account: 'accounts_receivable', debitCents: amountCents }, { account: receivingAccount(method), creditCents: amountCents }],
  };
}

/**
 * Deposit earned on the event date: the performance obligation is satisfied when the event takes
 * place (ASC 606-10-25-23, and 606-10-55-284 Example 38 Case A), so the contract liability becomes
 * revenue: Dr customer deposits / Cr each revenue account, by the amounts the invoices tagged (the
 * invoices' own proportions, to the cent). A negative amount (credit notes before the event that
 * exceeded a part) posts the other way round.
 */
export function depositEarned(heldByRevenue: Partial<Record<RevenueKey, number>>): EntryDraft {
  const lines: LineDraft[] = [];
  for (const [key, cents] of Object.entries(heldByRevenue) as [RevenueKey, number][]) {
    if (!cents) continue;
    if (cents > 0) lines.push({ account: 'customer_deposits', debitCents: cents, revenueKey: key }, { account: key, creditCents: cents });
    else lines.push({ account: key, debitCents: subtract(0, cents) }, { account: 'customer_deposits', creditCents: subtract(0, cents), revenueKey: key });
  }
  return { kind: 'deposit_earned', lines };
}

/** Security deposit taken: the money is in (Dr cash/bank/card clearing) but still the customer's (Cr security deposits held). Never revenue while held. */
export function securityDepositHeld(amountCents: number, method: PaymentMethod): EntryDraft {
  assertAmount(amountCents);
  return {
    kind: 'security_deposit_held',
    lines: [{ account: receivingAccount(method), debitCents: amountCents }, { account: 'security_deposits_held', creditCents: amountCents }],
  };
}

/** Security deposit given back after pickup: the liability goes (Dr security deposits held) with the money (Cr cash/bank/card clearing). */
export function securityDepositRefunded(amountCents: number, method: PaymentMethod): EntryDraft {
  assertAmount(amountCents);
  return {
    kind: 'security_deposit_refunded',
    lines: [{ account: 'security_deposits_held', debitCents: amountCents }, { account: receivingAccount(method), creditCents: amountCents }],
  };
}

/**
 * Security deposit kept for damage: the liability is settled (Dr security deposits held) and the
 * amount is income at last, as damage recovery (Cr damage recovery). When the damage is billed on
 * an additional-charges invoice instead, `to: 'invoice'` applies the deposit as a payment of that
 * invoice (Cr AR), and the invoice carries the damage recovery.
 */
export function securityDepositApplied(amountCents: number, to: 'damage' | 'invoice' = 'damage'): EntryDraft {
  assertAmount(amountCents);
  return {
    kind: 'security_deposit_applied',
    lines: [
      { account: 'security_deposits_held', debitCents: amountCents },
      { account: to === 'damage' ? 'damage_recovery' : 'accounts_receivable', creditCents: amountCents },
    ],
  };
}

/**
 * Before or on/after the event, by calendar day in the company's zone: an invoice dated the
 * evening before a morning event is still billed in advance.
 */
export function eventTiming(eventStart: Date, at: Date, timeZone: string): EventTiming {
  return dateInZone(at, timeZone) < dateInZone(eventStart, timeZone) ? 'before_event' : 'on_or_after_event';
}
