/**
 * Balances are sums over the ledger, done by PostgreSQL: nothing here loops over journal lines.
 * Amounts come back as whole cents; a debit-normal account (asset, expense, contra revenue) has a
 * positive balance when its debits exceed its credits, a credit-normal one the other way round.
 */
import { QueryTypes } from 'sequelize';
import { addDays, zonedTimeToInstant } from '../../shared/dates';
import { subtract, sum } from '../../shared/money';
import { sequelize, type Transaction } from '../db';
import { Organization } from '../models';
import type { AccountType } from '../models/Account';

type Opts = { transaction?: Transaction };

export interface AccountBalance {
  accountId: string;
  code: string;
  name: string;
  type: AccountType;
  systemKey: string | null;
  active: boolean;
  debitCents: number;
  creditCents: number;
  /** On the account's normal side: what a bookkeeper calls its balance. */
  balanceCents: number;
}

const DEBIT_NORMAL: readonly AccountType[] = ['asset', 'expense', 'contra_revenue'];

/**
 * The end of `at`: a YYYY-MM-DD date means the whole of that day in the company's zone (the trial
 * balance "at 15 March" includes everything dated 15 March there); a Date means that instant.
 */
async function cutoff(organizationId: string, at: Date | string | undefined, t?: Transaction): Promise<{ sql: string; until: Date | null }> {
  if (at === undefined) return { sql: '', until: null };
  if (at instanceof Date) return { sql: 'AND e.occurred_at <= :until', until: at };
  if (!/^\d{4}-\d{2}-\d{2}$/.test(at)) throw new RangeError(`A ledger date is YYYY-MM-DD; got "${at}".`);
  const org = await Organization.findByPk(organizationId, { attributes: ['timeZone'], transaction: t });
  if (!org) throw new RangeError(`Organization ${organizationId} was not found.`);
  return { sql: 'AND e.occurred_at < :until', until: zonedTimeToInstant(addDays(at, 1), '00:00', org.timeZone) };
}

/** Every account of the company with its summed debits and credits, up to `at` when given. */
export async function accountBalances(organizationId: string, opts: { at?: Date | string } & Opts = {}): Promise<AccountBalance[]> {
  const { sql, until } = await cutoff(organizationId, opts.at, opts.transaction);
  const rows = await sequelize.query<{ id: string; code: string; name: string; type: AccountType; system_key: string | null; active: boolean; debit: string | number; credit: string | number }>(
    `SELECT a.id, a.code, a.name, a.type, a.system_key, a.active,
            coalesce(sum(x.debit_cents), 0)::bigint AS debit, coalesce(sum(x.credit_cents), 0)::bigint AS credit
       FROM accounts a
       LEFT JOIN (SELECT l.account_id, l.debit_cents, l.credit_cents
                    FROM journal_lines l JOIN journal_entries e ON e.id = l.entry_id
                   WHERE l.organization_id = :org ${sql}) x ON x.account_id = a.id
      WHERE a.organization_id = :org
      GROUP BY a.id
      ORDER BY a.code`,
    { replacements: { org: organizationId, until }, type: QueryTypes.SELECT, transaction: opts.transaction },
  );
  return rows.map((r) => {
    const debitCents = Number(r.debit);
    const creditCents = Number(r.credit);
    const net = subtract(debitCents, creditCents);
    return {
      accountId: r.id, code: r.code, name: r.name, type: r.type, systemKey: r.system_key, active: r.active,
      debitCents, creditCents,
      balanceCents: DEBIT_NORMAL.includes(r.type) ? net : subtract(0, net),
    };
  });
}

export interface TrialBalance {
  accounts: { code: string; name: string; debitCents: number; creditCents: number }[];
  totalDebitCents: number;
  totalCreditCents: number;
}

/**
 * The trial balance at the end of `at`: each account's net balance in the debit or the credit
 * column. The columns' totals are equal whenever every entry balances. Inactive accounts show
 * only while they still carry a balance.
 */
export async function trialBalance(organizationId: string, at: Date | string, opts: Opts = {}): Promise<TrialBalance> {
  const rows = await accountBalances(organizationId, { at, transaction: opts.transaction });
  const accounts = rows
    .map((r) => {
      const net = subtract(r.debitCents, r.creditCents);
      return { active: r.active, code: r.code, name: r.name, debitCents: net > 0 ? net : 0, creditCents: net < 0 ? subtract(0, net) : 0 };
    })
    .filter((r) => r.active || r.debitCents || r.creditCents)
    .map(({ active: _active, ...r }) => r);
  return {
    accounts,
    totalDebitCents: sum(accounts.map((a) => a.debitCents)),
    totalCreditCents: sum(accounts.map((a) => a.creditCents)),
  };
}

async function scalar(sql: string, replacements: Record<string, unknown>, t?: Transaction): Promise<number> {
  const [row] = await sequelize.query<{ cents: string | number }>(sql, { replacements, type: QueryTypes.SELECT, transaction: t });
  return Number(row.cents);
}

/** What the customer owes on the booking: its accounts receivable (negative when we owe them). */
export function bookingBalance(bookingId: string, opts: Opts = {}): Promise<number> {
  return scalar(
    `SELECT coalesce(sum(l.debit_cents - l.credit_cents), 0)::bigint AS cents
       FROM journal_entries e JOIN journal_lines l ON l.entry_id = e.id JOIN accounts a ON a.id = l.account_id
      WHERE e.booking_id = :id AND a.system_key = 'accounts_receivable'`,
    { id: bookingId },
    opts.transaction,
  );
}

/**
 * What the customer has paid on the booking and not had back: payments (and security deposits
 * applied to an invoice) less refunds, each net of its reversals. A refund must not exceed it;
 * callers lock the booking first so two refunds cannot both pass.
 */
export function paidCents(bookingId: string, opts: Opts = {}): Promise<number> {
  return scalar(
    `SELECT coalesce(sum(l.credit_cents - l.debit_cents), 0)::bigint AS cents
       FROM journal_entries e
       JOIN journal_lines l ON l.entry_id = e.id
       JOIN accounts a ON a.id = l.account_id
       LEFT JOIN journal_entries r ON r.id = e.reverses_id
      WHERE e.booking_id = :id AND a.system_key = 'accounts_receivable'
        AND coalesce(r.kind, e.kind) IN ('payment_received', 'refund', 'security_deposit_applied')`,
    { id: bookingId },
    opts.transaction,
  );
}

/** The customer's account credit (overpayments, credit notes on paid invoices), across all their bookings. */
export function customerCreditCents(customerId: string, opts: Opts = {}): Promise<number> {
  return scalar(
    `SELECT coalesce(sum(l.credit_cents - l.debit_cents), 0)::bigint AS cents
       FROM journal_entries e JOIN journal_lines l ON l.entry_id = e.id JOIN accounts a ON a.id = l.account_id
      WHERE e.customer_id = :id AND a.system_key = 'customer_credit'`,
    { id: customerId },
    opts.transaction,
  );
}

/** The refundable security deposit still held for the booking. */
export function securityDepositHeldCents(bookingId: string, opts: Opts = {}): Promise<number> {
  return scalar(
    `SELECT coalesce(sum(l.credit_cents - l.debit_cents), 0)::bigint AS cents
       FROM journal_entries e JOIN journal_lines l ON l.entry_id = e.id JOIN accounts a ON a.id = l.account_id
      WHERE e.booking_id = :id AND a.system_key = 'security_deposits_held'`,
    { id: bookingId },
    opts.transaction,
  );
}

export interface StatementLine {
  entryId: string;
  occurredAt: Date;
  kind: string;
  memo: string;
  bookingId: string | null;
  bookingReference: string | null;
  reversesId: string | null;
  /** The entry's effect on what the customer owes: debits raise it, credits lower it. */
  debitCents: number;
  creditCents: number;
  /** What the customer owed after this entry. */
  balanceCents: number;
}

/**
 * Every entry of the customer's, oldest first, with its effect on their accounts receivable and
 * the running balance (a window sum in SQL). Entries that do not touch receivables (deposits
 * earned, security deposits) are listed with zero effect so the statement explains everything.
 */
export async function customerStatement(customerId: string, opts: Opts = {}): Promise<{ lines: StatementLine[]; balanceCents: number }> {
  const rows = await sequelize.query<{
    id: string; occurred_at: Date; kind: string; memo: string; booking_id: string | null; reference: string | null; reverses_id: string | null;
    debit: string | number; credit: string | number; balance: string | number;
  }>(
    `SELECT e.id, e.occurred_at, e.kind, e.memo, e.booking_id, b.reference, e.reverses_id,
            coalesce(sum(l.debit_cents) FILTER (WHERE a.system_key = 'accounts_receivable'), 0)::bigint AS debit,
            coalesce(sum(l.credit_cents) FILTER (WHERE a.system_key = 'accounts_receivable'), 0)::bigint AS credit,
            (sum(coalesce(sum(l.debit_cents - l.credit_cents) FILTER (WHERE a.system_key = 'accounts_receivable'), 0))
              OVER (ORDER BY e.occurred_at, e.created_at, e.id))::bigint AS balance
       FROM journal_entries e
       JOIN journal_lines l ON l.entry_id = e.id
       JOIN accounts a ON a.id = l.account_id
       LEFT JOIN bookings b ON b.id = e.booking_id
      WHERE e.customer_id = :id
      GROUP BY e.id, b.reference
      ORDER BY e.occurred_at, e.created_at, e.id`,
    { replacements: { id: customerId }, type: QueryTypes.SELECT, transaction: opts.transaction },
  );
  const lines = rows.map((r) => ({
    entryId: r.id, occurredAt: new Date(r.occurred_at), kind: r.kind, memo: r.memo, bookingId: r.booking_id, bookingReference: r.reference,
    reversesId: r.reverses_id, debitCents: Number(r.debit), creditCents: Number(r.credit), balanceCents: Number(r.balance),
  }));
  return { lines, balanceCents: lines.length ? lines[lines.length - 1].balanceCents : 0 };
}
