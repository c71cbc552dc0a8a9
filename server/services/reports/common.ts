/**
 * What every report shares: the company's calendar (dates are days in its time zone), its
 * accounts by role, and one consistent snapshot of the books to read a report from.
 */
import { Op, Transaction as SequelizeTransaction } from 'sequelize';
import { addDays, dateInZone, zonedTimeToInstant } from '../../../shared/dates';
import type { EntriesTrace, LedgerCheck, ReportAccount } from '../../../shared/schemas/reports';
import { sequelize, withTransaction, type Transaction } from '../../db';
import { ensureChart, type SystemKey } from '../../ledger/chart';
import { Account, type Organization } from '../../models';

export interface ReportContext {
  organizationId: string;
  timeZone: string;
  currency: string;
  t: Transaction;
}

/**
 * Runs a report in one REPEATABLE READ, read-only transaction: the report's own sums and the
 * ledger balance it is checked against see the same committed entries, so a payment recorded
 * while the report runs can never show up as a difference. The default chart is made first (in
 * its own short transaction), so every figure has an account to point at.
 */
export async function readReport<T>(organization: Organization, work: (ctx: ReportContext) => Promise<T>): Promise<T> {
  await withTransaction((t) => ensureChart(organization.id, t));
  return sequelize.transaction({ isolationLevel: SequelizeTransaction.ISOLATION_LEVELS.REPEATABLE_READ, readOnly: true }, (t) =>
    work({ organizationId: organization.id, timeZone: organization.timeZone, currency: organization.currency, t }),
  );
}

/** Today's date in the company's zone. */
export const todayIn = (timeZone: string) => dateInZone(new Date(), timeZone);

/** The first instant of a calendar day in the company's zone. */
export const startOfDay = (date: string, timeZone: string) => zonedTimeToInstant(date, '00:00', timeZone);

/** The first instant after a calendar day in the company's zone (entries before it are "on or before" the day). */
export const endOfDay = (date: string, timeZone: string) => zonedTimeToInstant(addDays(date, 1), '00:00', timeZone);

/** Calendar days from one date to another, both included; 0 when the end comes first. */
export function daysBetweenInclusive(from: string, to: string): number {
  const days = (Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000 + 1;
  return days > 0 ? days : 0;
}

/** The last day of a month given as YYYY-MM. */
export function lastDayOfMonth(month: string): string {
  const [y, m] = month.split('-').map(Number);
  return new Date(Date.UTC(y, m, 0)).toISOString().slice(0, 10);
}

/** The months from `from` to `to` (YYYY-MM), both included. */
export function monthList(from: string, to: string): string[] {
  const out: string[] = [];
  let [y, m] = from.split('-').map(Number);
  const [ty, tm] = to.split('-').map(Number);
  while (y < ty || (y === ty && m <= tm)) {
    out.push(`${y}-${String(m).padStart(2, '0')}`);
    m += 1;
    if (m > 12) {
      m = 1;
      y += 1;
    }
  }
  return out;
}

/** The company's accounts by the role the posting rules give them. */
export async function accountsByKey(ctx: ReportContext, keys: readonly SystemKey[]): Promise<Map<SystemKey, Account>> {
  const rows = await Account.findAll({ where: { organizationId: ctx.organizationId, systemKey: { [Op.in]: [...keys] } }, transaction: ctx.t });
  const byKey = new Map(rows.map((a) => [a.systemKey as SystemKey, a]));
  const missing = keys.filter((k) => !byKey.has(k));
  // ensureChart made them; only a broken chart gets here.
  if (missing.length) throw new Error(`The chart of accounts has no account for ${missing.join(', ')}.`);
  return byKey;
}

export const reportAccount = (a: Pick<Account, 'id' | 'code' | 'name'>): ReportAccount => ({ id: a.id, code: a.code, name: a.name });

/** A trace without the keys left undefined, so it reads (and serializes) cleanly. */
export function trace(t: EntriesTrace): EntriesTrace {
  return Object.fromEntries(Object.entries(t).filter(([, v]) => v !== undefined)) as unknown as EntriesTrace;
}

export function ledgerCheck(account: Pick<Account, 'id' | 'code' | 'name'>, ledgerCents: number, reportCents: number, t: EntriesTrace): LedgerCheck {
  return { account: reportAccount(account), ledgerCents, reportCents, differenceCents: reportCents - ledgerCents, trace: trace(t) };
}

/** YYYY-MM-DD of a DATEONLY column or an instant in the zone. */
export const isoDate = (v: Date | string, timeZone: string) => (typeof v === 'string' ? v.slice(0, 10) : dateInZone(v, timeZone));
