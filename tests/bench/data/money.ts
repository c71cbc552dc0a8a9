/**
 * The money of the benchmark company, made the way the app makes it, only in bulk: deposit and
 * balance invoices split from each booking's quote by the app's own `bookingBreakdown` and
 * `allocate`, numbered per year without gaps; additional-charges invoices after some events;
 * payments (some invoices paid in instalments) with their allocations; security deposits taken at
 * delivery and returned after pickup; and one balanced journal entry per money event from the
 * app's posting rules (server/ledger/rules.ts), with the deposits earned on each event day.
 */
import { addDays, dateInZone, zonedTimeToInstant } from '../../../shared/dates';
import { allocate, percentOf, subtract, sum } from '../../../shared/money';
import { INVOICE_KIND_LABELS, type InvoiceLineRow } from '../../../shared/schemas/invoices';
import type { RevenueKey } from '../../../server/ledger/chart';
import {
  depositEarned, eventTiming, invoiceIssued, paymentReceived, securityDepositHeld, securityDepositRefunded, type EntryDraft, type EntryKind,
  type InvoiceBreakdown, type LineDraft,
} from '../../../server/ledger/rules';
import type { Rand } from './catalog';
import type { BenchBooking } from './bookings';

export const INVOICE_COUNT = 40_000;
export const PAYMENT_COUNT = 60_000;

type Parts = Required<InvoiceBreakdown>;
const PARTS: (keyof Parts)[] = ['rentalCents', 'deliveryLaborCents', 'damageWaiverCents', 'damageCents', 'taxCents'];
type Method = 'cash' | 'check' | 'transfer';
const METHOD_WORDS: Record<Method, string> = { cash: 'cash', check: 'check', transfer: 'bank transfer' };

export interface BenchEntry {
  id: string;
  bookingId: string;
  customerId: string;
  occurredAt: Date;
  kind: EntryKind;
  memo: string;
  sourceType: string;
  sourceId: string;
  createdById: string | null;
  lines: LineDraft[];
}

export interface BenchInvoice {
  id: string;
  booking: BenchBooking;
  kind: 'deposit' | 'balance' | 'additional';
  number: string;
  status: 'open' | 'partly_paid' | 'paid';
  issuedAt: Date;
  issueDate: string;
  dueDate: string;
  lines: InvoiceLineRow[];
  parts: Parts;
  totalCents: number;
  paidCents: number;
  ledgerEntryId: string;
  createdById: string;
  updatedAt: Date;
}

export interface BenchPayment {
  id: string;
  booking: BenchBooking;
  method: Method;
  amountCents: number;
  reference: string;
  receivedAt: Date;
  ledgerEntryId: string;
  recordedById: string;
  allocations: { id: string; invoiceId: string; amountCents: number }[];
}

export interface BenchDepositMove {
  id: string;
  booking: BenchBooking;
  kind: 'held' | 'refunded';
  amountCents: number;
  method: Method;
  ledgerEntryId: string;
  createdById: string;
  at: Date;
}

export interface MoneyOptions {
  zone: string;
  now: Date;
  staff: string[];
  prefix: string;
  balanceDueDays: number;
  /** The app's split of a booking's quote (commands/invoices.ts `bookingBreakdown`). */
  breakdown: (b: BenchBooking) => { depositCents: number; totalCents: number; parts: Parts };
}

const LINE_TEXT: [keyof Parts, InvoiceLineRow['category'], string][] = [
  ['rentalCents', 'rental', 'rentals'], ['deliveryLaborCents', 'delivery_labor', 'delivery, set-up and fees'], ['damageWaiverCents', 'damage_waiver', 'damage waiver'],
  ['damageCents', 'damage', 'damage and missing stock'], ['taxCents', 'tax', ''],
];

/** The invoice's lines as `createInvoice` writes them (commands/invoices.ts linesFor). */
function invoiceLines(p: Parts, label: string, reference: string): InvoiceLineRow[] {
  return LINE_TEXT.map(([k, category, what]) => ({ description: category === 'tax' ? 'Sales tax' : `${label}: ${what}, booking ${reference}`, category, amountCents: p[k] })).filter((l) => l.amountCents > 0);
}

const minutes = (d: Date, m: number) => new Date(d.getTime() + m * 60_000);

export function benchMoney(rand: Rand, newId: () => string, bookings: BenchBooking[], o: MoneyOptions) {
  const pick = <T,>(xs: readonly T[]) => xs[Math.floor(rand() * xs.length)];
  const method = (): Method => (rand() < 0.5 ? 'check' : rand() < 0.7 ? 'transfer' : 'cash');
  const reference = (m: Method) => (m === 'check' ? `Check ${1000 + Math.floor(rand() * 8999)}` : m === 'transfer' ? `Transfer ${100000 + Math.floor(rand() * 899999)}` : '');
  const notAfterNow = (d: Date) => (d > o.now ? minutes(o.now, -1 - Math.floor(rand() * 600)) : d);
  const invoices: BenchInvoice[] = [];
  /** Planned instalments per invoice: when the customer pays, and the share of what is owed. */
  const planned = new Map<string, { at: Date; share: number }[]>();

  const addInvoice = (b: BenchBooking, kind: BenchInvoice['kind'], parts: Parts, issuedAt: Date) => {
    const issueDate = dateInZone(issuedAt, o.zone);
    const balanceDue = addDays(b.eventDay, -o.balanceDueDays);
    const inv: BenchInvoice = {
      id: newId(), booking: b, kind, number: '', status: 'open', issuedAt, issueDate,
      dueDate: kind === 'deposit' || balanceDue < issueDate ? issueDate : balanceDue,
      lines: invoiceLines(parts, INVOICE_KIND_LABELS[kind], b.reference), parts, totalCents: sum(PARTS.map((k) => parts[k])),
      paidCents: 0, ledgerEntryId: newId(), createdById: pick(o.staff), updatedAt: issuedAt,
    };
    invoices.push(inv);
    return inv;
  };
  const pays = (inv: BenchInvoice, at: Date, share = 1) => planned.set(inv.id, [...(planned.get(inv.id) ?? []), { at: notAfterNow(at), share }]);

  for (const b of bookings) {
    const q = o.breakdown(b);
    b.totalCents = q.totalCents;
    if (!['reserved', 'out', 'returned', 'closed'].includes(b.status) || q.totalCents === 0) continue;
    const held = b.status !== 'reserved';
    // The deposit: the quote's share of every part (createInvoice's split, to the cent).
    const depositAt = notAfterNow(minutes(b.reservedAt, 5));
    const dep = allocate(Math.min(q.depositCents, q.totalCents), PARTS.map((k) => q.parts[k]));
    const depositParts = Object.fromEntries(PARTS.map((k, i) => [k, dep[i]])) as unknown as Parts;
    const deposit = addInvoice(b, 'deposit', depositParts, depositAt);
    if (held || rand() < 0.75) pays(deposit, minutes(depositAt, Math.floor(rand() * 5 * 1440)));
    const balanceAt = new Date(Math.max(zonedTimeToInstant(addDays(b.eventDay, -14), '10:00', o.zone).getTime(), depositAt.getTime() + 86_400_000));
    const rest = Object.fromEntries(PARTS.map((k) => [k, subtract(q.parts[k], depositParts[k])])) as unknown as Parts;
    if (sum(PARTS.map((k) => rest[k])) > 0 && balanceAt < o.now && balanceAt < b.eventStart) {
      const balance = addInvoice(b, 'balance', rest, balanceAt);
      const paidBy = minutes(b.eventStart, -(1 + Math.floor(rand() * 10)) * 1440);
      if (b.status === 'closed' || (held && rand() < 0.85)) pays(balance, paidBy > balanceAt ? paidBy : minutes(balanceAt, 120));
    }
  }

  // Damage, late returns and cleaning billed after some events, until the books hold 40,000 invoices.
  const closed = bookings.filter((b) => b.status === 'closed' && b.totalCents > 0);
  if (invoices.length > INVOICE_COUNT) throw new Error(`The plan has ${invoices.length} invoices before additional charges; more than ${INVOICE_COUNT}.`);
  while (invoices.length < INVOICE_COUNT) {
    const b = pick(closed);
    const at = notAfterNow(minutes(b.pickupEnd, (1 + Math.floor(rand() * 5)) * 1440));
    const amount = 2_500 + Math.floor(rand() * 120) * 500;
    const kind = pick(['damage', 'damage', 'late_return', 'cleaning'] as const);
    const taxed = kind !== 'damage';
    const tax = taxed ? percentOf(amount, b.taxRateBp) : 0;
    const parts: Parts = {
      rentalCents: kind === 'late_return' ? amount : 0, deliveryLaborCents: kind === 'cleaning' ? amount : 0, damageWaiverCents: 0,
      damageCents: kind === 'damage' ? amount : 0, taxCents: b.customer.taxExempt ? 0 : tax,
    };
    const inv = addInvoice(b, 'additional', parts, at);
    pays(inv, minutes(at, (3 + Math.floor(rand() * 20)) * 1440));
  }

  // Numbers: one series per calendar year, in the order the invoices were issued (no gaps).
  invoices.sort((a, c) => a.issuedAt.getTime() - c.issuedAt.getTime());
  const counters = new Map<number, number>();
  for (const inv of invoices) {
    const year = Number(inv.issueDate.slice(0, 4));
    const n = (counters.get(year) ?? 0) + 1;
    counters.set(year, n);
    inv.number = `${o.prefix}-${year}-${String(n).padStart(4, '0')}`;
  }

  // Some customers pay in two or three instalments, until the books hold 60,000 payments.
  const payable = invoices.filter((i) => planned.has(i.id) && i.totalCents >= 10_000);
  let count = [...planned.values()].reduce((n, p) => n + p.length, 0);
  while (count < PAYMENT_COUNT) {
    const inv = pick(payable);
    const slots = planned.get(inv.id)!;
    if (slots.length >= 3) continue;
    const last = slots[slots.length - 1];
    const first = notAfterNow(new Date(inv.issuedAt.getTime() + rand() * Math.max(3_600_000, last.at.getTime() - inv.issuedAt.getTime())));
    planned.set(inv.id, [{ at: first, share: 1 }, ...slots]);
    count++;
  }

  const payments: BenchPayment[] = [];
  for (const inv of invoices) {
    const slots = (planned.get(inv.id) ?? []).sort((a, c) => a.at.getTime() - c.at.getTime());
    if (!slots.length) continue;
    // Instalments: roughly even parts whose sum is the total (allocate's split, to the cent).
    const amounts = allocate(inv.totalCents, slots.map(() => 80 + Math.floor(rand() * 40)));
    slots.forEach((slot, i) => {
      const m = method();
      const at = slot.at < inv.issuedAt ? minutes(inv.issuedAt, 30) : slot.at;
      payments.push({
        id: newId(), booking: inv.booking, method: m, amountCents: amounts[i], reference: reference(m), receivedAt: at, ledgerEntryId: newId(),
        recordedById: pick(o.staff), allocations: [{ id: newId(), invoiceId: inv.id, amountCents: amounts[i] }],
      });
      inv.paidCents += amounts[i];
      inv.updatedAt = at > inv.updatedAt ? at : inv.updatedAt;
    });
    inv.status = inv.paidCents >= inv.totalCents ? 'paid' : inv.paidCents > 0 ? 'partly_paid' : 'open';
  }
  if (payments.length !== PAYMENT_COUNT) throw new Error(`Planned ${payments.length} payments, not ${PAYMENT_COUNT}.`);

  // Security deposits: taken at delivery, returned a few days after pickup once closed.
  const moves: BenchDepositMove[] = [];
  for (const b of bookings) {
    if (b.securityDepositCents <= 0 || !['out', 'returned', 'closed'].includes(b.status)) continue;
    const m = method();
    const move = (kind: BenchDepositMove['kind'], at: Date) =>
      moves.push({ id: newId(), booking: b, kind, amountCents: b.securityDepositCents, method: m, ledgerEntryId: newId(), createdById: pick(o.staff), at: notAfterNow(at) });
    move('held', b.deliveryStart);
    if (b.status === 'closed') move('refunded', minutes(b.pickupEnd, (2 + Math.floor(rand() * 5)) * 1440));
  }

  return { invoices, payments, moves, counters, entries: entriesFor(newId, bookings, invoices, payments, moves, o) };
}

/** One entry per money event, from the app's posting rules; then the deposits earned on each event day. */
function entriesFor(newId: () => string, bookings: BenchBooking[], invoices: BenchInvoice[], payments: BenchPayment[], moves: BenchDepositMove[], o: MoneyOptions): BenchEntry[] {
  const entries: BenchEntry[] = [];
  const add = (id: string, b: BenchBooking, at: Date, memo: string, source: [string, string], by: string | null, draft: EntryDraft) =>
    entries.push({ id, bookingId: b.id, customerId: b.customer.id, occurredAt: at, kind: draft.kind, memo, sourceType: source[0], sourceId: source[1], createdById: by, lines: draft.lines });
  const deposits = new Map<string, Map<RevenueKey, number>>();
  for (const inv of invoices) {
    const draft = invoiceIssued(inv.parts, eventTiming(inv.booking.eventStart, inv.issuedAt, o.zone));
    add(inv.ledgerEntryId, inv.booking, inv.issuedAt, `${INVOICE_KIND_LABELS[inv.kind]} ${inv.number}`, ['invoice', inv.id], inv.createdById, draft);
    for (const l of draft.lines) {
      if (l.account !== 'customer_deposits') continue;
      const held = deposits.get(inv.booking.id) ?? new Map<RevenueKey, number>();
      held.set(l.revenueKey!, (held.get(l.revenueKey!) ?? 0) + (l.creditCents ?? 0));
      deposits.set(inv.booking.id, held);
    }
  }
  for (const p of payments) {
    add(p.ledgerEntryId, p.booking, p.receivedAt, `Payment from ${METHOD_WORDS[p.method]}${p.reference ? ` (${p.reference})` : ''}`, ['payment', p.id], p.recordedById, paymentReceived(p.amountCents, p.method));
  }
  for (const m of moves) {
    const draft = m.kind === 'held' ? securityDepositHeld(m.amountCents, m.method) : securityDepositRefunded(m.amountCents, m.method);
    add(m.ledgerEntryId, m.booking, m.at, m.kind === 'held' ? 'Security deposit received' : 'Security deposit returned', ['booking', m.booking.id], m.createdById, draft);
  }
  // What the hourly recognize-deposits job would have posted: every event day up to today.
  const today = dateInZone(o.now, o.zone);
  const latest = new Map<string, number>();
  for (const e of entries) if (e.kind === 'invoice_issued') latest.set(e.bookingId, Math.max(latest.get(e.bookingId) ?? 0, e.occurredAt.getTime()));
  for (const b of bookings) {
    const held = deposits.get(b.id);
    if (!held || b.eventDay > today) continue;
    const draft = depositEarned(Object.fromEntries(held));
    if (!draft.lines.length) continue;
    const eventDay = zonedTimeToInstant(b.eventDay, '00:00', o.zone).getTime();
    add(newId(), b, new Date(Math.max(eventDay, latest.get(b.id) ?? 0)), `Deposits earned: booking ${b.reference}, event on ${b.eventDay}`, ['booking', b.id], null, draft);
  }
  return entries.sort((a, c) => a.occurredAt.getTime() - c.occurredAt.getTime());
}
