/**
 * Writing the ledger: `postEntry` turns an entry draft (rules.ts) into one journal entry and its
 * lines in the caller's transaction; `reverseEntry` corrects a mistake with the mirror entry.
 * The database checks balance again at commit and refuses any UPDATE or DELETE; the checks here
 * come first so a bug reads as a sentence rather than a trigger error. No entry is dated on or
 * before the company's lock date (`assertPeriodOpen`, periods.ts; a trigger checks it again).
 */
import { Op } from 'sequelize';
import { sum } from '../../shared/money';
import type { Transaction } from '../db';
import { Account, Booking, Customer, JournalEntry, JournalLine, User } from '../models';
import { ensureChart, type SystemKey } from './chart';
import { assertPeriodOpen, openPeriodDate, periodClosedFromDatabase } from './periods';
import type { EntryKind, LineDraft } from './rules';

export * from './rules';

/** A ledger write that cannot be made as asked; the message says what is wrong. */
export class LedgerError extends Error {
  constructor(
    public code: 'unbalanced' | 'bad_line' | 'unknown_account' | 'not_found' | 'already_reversed' | 'bad_reference',
    message: string,
  ) {
    super(message);
    this.name = 'LedgerError';
  }
}

export interface PostEntryInput {
  organizationId: string;
  bookingId?: string | null;
  /** Taken from the booking when left out. */
  customerId?: string | null;
  kind: EntryKind;
  memo: string;
  /** The entry's date (on the company's calendar): never on or before the lock date (periods.ts). */
  occurredAt: Date;
  /**
   * When `occurredAt` falls in a closed period: `refuse` (409 period_closed; the default, for dates
   * a person chose), or `post_today` for entries the company did not date itself (card processor
   * events, the deposit job), which then go into the open period as of now.
   */
  whenClosed?: 'refuse' | 'post_today';
  /** What caused it: `{ type: 'invoice', id }`, `{ type: 'payment', id }` ... */
  source?: { type: string; id: string } | null;
  createdById?: string | null;
  lines: LineDraft[];
}

const MEMO_MAX = 400;

/** Throws a LedgerError unless the lines make one balanced entry of whole, one-sided amounts. */
export function assertBalanced(lines: readonly LineDraft[]): void {
  if (lines.length < 2) throw new LedgerError('unbalanced', `A journal entry needs at least two lines; got ${lines.length}.`);
  lines.forEach((l, i) => {
    const d = l.debitCents ?? 0;
    const c = l.creditCents ?? 0;
    for (const [side, v] of [['debit', d], ['credit', c]] as const) {
      if (!Number.isSafeInteger(v) || v < 0) throw new LedgerError('bad_line', `Line ${i + 1} (${l.account}): the ${side} must be whole cents, not negative; got ${v}.`);
    }
    if ((d > 0) === (c > 0)) throw new LedgerError('bad_line', `Line ${i + 1} (${l.account}) must have either a debit or a credit above zero, not ${d > 0 ? 'both' : 'neither'}.`);
    // Recognition on the event date reads these tags; an untagged deposit could never be earned.
    if (l.account === 'customer_deposits' && !l.revenueKey) throw new LedgerError('bad_line', `Line ${i + 1}: a customer-deposit line names the revenue account it becomes (revenueKey).`);
  });
  const debits = sum(lines.map((l) => l.debitCents ?? 0));
  const credits = sum(lines.map((l) => l.creditCents ?? 0));
  if (debits !== credits) {
    throw new LedgerError('unbalanced', `The entry does not balance: debits ${debits} cents, credits ${credits} cents (${lines.map((l) => `${l.account} ${l.debitCents ? `Dr ${l.debitCents}` : `Cr ${l.creditCents}`}`).join(', ')}).`);
  }
}

/** The company's accounts for these roles, creating the default chart on first use. */
async function accountIds(organizationId: string, keys: SystemKey[], t: Transaction): Promise<Map<SystemKey, string>> {
  const load = async () =>
    new Map(
      (await Account.findAll({ where: { organizationId, systemKey: { [Op.in]: keys } }, attributes: ['id', 'systemKey'], transaction: t }))
        .map((a) => [a.systemKey as SystemKey, a.id]),
    );
  let byKey = await load();
  if (keys.some((k) => !byKey.has(k))) {
    await ensureChart(organizationId, t);
    byKey = await load();
  }
  const missing = keys.filter((k) => !byKey.has(k));
  if (missing.length) throw new LedgerError('unknown_account', `No account of this company is set to receive ${missing.join(', ')}; choose one in the chart of accounts.`);
  return byKey;
}

/** The booking's customer, after checking that the booking and customer belong to the company. */
async function resolveCustomer(input: PostEntryInput, t: Transaction): Promise<string | null> {
  const { organizationId, bookingId, customerId } = input;
  if (bookingId) {
    const booking = await Booking.findOne({ where: { id: bookingId, organizationId }, attributes: ['id', 'customerId'], transaction: t });
    if (!booking) throw new LedgerError('bad_reference', `Booking ${bookingId} is not one of this company's bookings.`);
    if (customerId && customerId !== booking.customerId) throw new LedgerError('bad_reference', `Customer ${customerId} is not the customer of booking ${bookingId}.`);
    return booking.customerId;
  }
  if (customerId) {
    const customer = await Customer.findOne({ where: { id: customerId, organizationId }, attributes: ['id'], transaction: t });
    if (!customer) throw new LedgerError('bad_reference', `Customer ${customerId} is not one of this company's customers.`);
    return customerId;
  }
  return null;
}

async function writeEntry(input: PostEntryInput & { reversesId?: string | null }, t: Transaction): Promise<JournalEntry> {
  if (!t) throw new LedgerError('bad_reference', 'Journal entries are written inside the transaction of the event they record.');
  assertBalanced(input.lines);
  const occurredAt =
    input.whenClosed === 'post_today'
      ? await openPeriodDate(input.organizationId, input.occurredAt, t)
      : (await assertPeriodOpen(input.organizationId, input.occurredAt, t), input.occurredAt);
  const customerId = await resolveCustomer(input, t);
  const ids = await accountIds(input.organizationId, [...new Set(input.lines.map((l) => l.account))], t);
  const entry = await JournalEntry.create(
    {
      organizationId: input.organizationId,
      bookingId: input.bookingId ?? null,
      customerId,
      occurredAt,
      kind: input.kind,
      memo: input.memo.slice(0, MEMO_MAX),
      sourceType: input.source?.type ?? null,
      sourceId: input.source?.id ?? null,
      reversesId: input.reversesId ?? null,
      createdById: input.createdById ?? null,
    },
    { transaction: t },
  ).catch(asPeriodClosed);
  const lines = await JournalLine.bulkCreate(
    input.lines.map((l, position) => ({
      organizationId: input.organizationId,
      entryId: entry.id,
      position,
      accountId: ids.get(l.account)!,
      debitCents: l.debitCents ?? 0,
      creditCents: l.creditCents ?? 0,
      revenueKey: l.revenueKey ?? null,
    })),
    { transaction: t },
  );
  entry.lines = lines;
  return entry;
}

/** The database's own refusal of an entry in a closed period (its trigger) reads as the same 409. */
function asPeriodClosed(err: unknown): never {
  throw periodClosedFromDatabase(err) ?? err;
}

/**
 * Writes one balanced journal entry in `t` (the event's own transaction). Usually called with a
 * rule's draft spread in: `postEntry({ organizationId, bookingId, memo, occurredAt, ...invoiceIssued(b, timing) }, t)`.
 */
export function postEntry(input: PostEntryInput, t: Transaction): Promise<JournalEntry> {
  return writeEntry({ ...input, reversesId: null }, t);
}

/**
 * Corrects an entry by posting its mirror (every debit becomes a credit and the other way round)
 * as a `reversal` entry that points at it. The original stays as it was. An entry is reversed at
 * most once (a unique index backs this check), and a reversal is not itself reversed: post the
 * original event again instead.
 */
export async function reverseEntry(entryId: string, reason: string, actorId: string | null, t: Transaction): Promise<JournalEntry> {
  if (!reason.trim()) throw new LedgerError('bad_line', 'Say why the entry is being reversed.');
  // Locked so two reversals of the same entry queue up and the second sees the first.
  const entry = await JournalEntry.findByPk(entryId, { transaction: t, lock: t.LOCK.UPDATE });
  if (!entry) throw new LedgerError('not_found', `Journal entry ${entryId} was not found.`);
  if (entry.kind === 'reversal') throw new LedgerError('already_reversed', 'A reversal is not reversed; post the original event again instead.');
  const earlier = await JournalEntry.findOne({ where: { reversesId: entry.id }, attributes: ['id'], transaction: t });
  if (earlier) throw new LedgerError('already_reversed', `Journal entry ${entryId} was already reversed by entry ${earlier.id}.`);
  if (actorId && !(await User.findOne({ where: { id: actorId, organizationId: entry.organizationId }, attributes: ['id'], transaction: t }))) {
    throw new LedgerError('bad_reference', `User ${actorId} is not a user of this company.`);
  }
  const lines = await JournalLine.findAll({ where: { entryId: entry.id }, order: [['position', 'ASC']], transaction: t });
  return writeMirror(entry, lines, reason.trim(), actorId, t);
}

/** The mirror lines go to the same accounts by id (a renamed or re-keyed account is still the one posted to). */
async function writeMirror(entry: JournalEntry, lines: JournalLine[], reason: string, actorId: string | null, t: Transaction) {
  // Dated now, in the open period, even when the original is in a closed one: that is where a
  // correction of a closed period goes.
  const now = new Date();
  await assertPeriodOpen(entry.organizationId, now, t);
  const reversal = await JournalEntry.create(
    {
      organizationId: entry.organizationId,
      bookingId: entry.bookingId,
      customerId: entry.customerId,
      occurredAt: now,
      kind: 'reversal',
      memo: `Reverses ${entry.kind.replace(/_/g, ' ')}: ${reason}`.slice(0, MEMO_MAX),
      sourceType: entry.sourceType,
      sourceId: entry.sourceId,
      reversesId: entry.id,
      createdById: actorId,
    },
    { transaction: t },
  ).catch(asPeriodClosed);
  reversal.lines = await JournalLine.bulkCreate(
    lines.map((l) => ({
      organizationId: entry.organizationId,
      entryId: reversal.id,
      position: l.position,
      accountId: l.accountId,
      debitCents: l.creditCents,
      creditCents: l.debitCents,
      revenueKey: l.revenueKey,
    })),
    { transaction: t },
  );
  return reversal;
}
