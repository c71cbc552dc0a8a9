/**
 * Revenue by account and month, a calendar year against the one before, from the ledger's lines
 * on the revenue and contra-revenue accounts: credits less debits, so refunds and allowances (the
 * contra account) read as negative and the total is net revenue. Deposits are revenue on the
 * event day (when the recognition job moves them), never when billed. Months are the company's.
 *
 * Reconciliation: each year's net total equals the change over that year of the revenue accounts'
 * balances less the contra accounts', read from balances.ts at the years' ends.
 */
import { Op, QueryTypes } from 'sequelize';
import type { EntriesTrace, RevenueAccountRow, RevenueReport } from '../../../shared/schemas/reports';
import { sequelize } from '../../db';
import { accountBalances } from '../../ledger/balances';
import { Account } from '../../models';
import { endOfDay, lastDayOfMonth, ledgerCheck, startOfDay, trace, type ReportContext } from './common';

const MONTHS = Array.from({ length: 12 }, (_, i) => String(i + 1).padStart(2, '0'));

export async function revenueReport(ctx: ReportContext, year: number): Promise<RevenueReport> {
  const last = year - 1;
  const accounts = await Account.findAll({
    where: { organizationId: ctx.organizationId, type: { [Op.in]: ['revenue', 'contra_revenue'] } },
    order: [['code', 'ASC']],
    transaction: ctx.t,
  });
  const ids = accounts.map((a) => a.id);
  const rows = ids.length
    ? await sequelize.query<{ account_id: string; month: string; net: number }>(
        `SELECT l.account_id, to_char(e.occurred_at AT TIME ZONE :tz, 'YYYY-MM') AS month, sum(l.credit_cents - l.debit_cents)::bigint AS net
           FROM journal_lines l JOIN journal_entries e ON e.id = l.entry_id
          WHERE l.organization_id = :org AND l.account_id IN (:ids) AND e.occurred_at >= :from AND e.occurred_at < :until
          GROUP BY 1, 2`,
        {
          replacements: { org: ctx.organizationId, ids, tz: ctx.timeZone, from: startOfDay(`${last}-01-01`, ctx.timeZone), until: endOfDay(`${year}-12-31`, ctx.timeZone) },
          type: QueryTypes.SELECT,
          transaction: ctx.t,
        },
      )
    : [];
  const cell = new Map(rows.map((r) => [`${r.account_id} ${r.month}`, Number(r.net)]));
  const series = (accountId: string, y: number) => MONTHS.map((m) => cell.get(`${accountId} ${y}-${m}`) ?? 0);
  const traces = (accountIds: string[], y: number): EntriesTrace[] =>
    MONTHS.map((m) => trace({ accountIds, from: `${y}-${m}-01`, to: lastDayOfMonth(`${y}-${m}`) }));
  const sum = (xs: number[]) => xs.reduce((s, x) => s + x, 0);

  const accountRows: RevenueAccountRow[] = accounts
    .map((a) => {
      const thisYear = series(a.id, year);
      const lastYear = series(a.id, last);
      return {
        account: { id: a.id, code: a.code, name: a.name, type: a.type as 'revenue' | 'contra_revenue' },
        thisYear, lastYear, thisYearTotalCents: sum(thisYear), lastYearTotalCents: sum(lastYear),
        thisYearTraces: traces([a.id], year), lastYearTraces: traces([a.id], last),
        active: a.active,
      };
    })
    // A retired account shows only while it has figures in the two years.
    .filter((r) => r.active || r.thisYear.some(Boolean) || r.lastYear.some(Boolean))
    .map(({ active: _active, ...r }) => r);
  const byMonth = (pick: (r: RevenueAccountRow) => number[]) => MONTHS.map((_, i) => sum(accountRows.map((r) => pick(r)[i])));
  const totals = {
    thisYear: byMonth((r) => r.thisYear),
    lastYear: byMonth((r) => r.lastYear),
    thisYearCents: sum(accountRows.map((r) => r.thisYearTotalCents)),
    lastYearCents: sum(accountRows.map((r) => r.lastYearTotalCents)),
    thisYearTraces: traces(ids, year),
    lastYearTraces: traces(ids, last),
  };

  // Net revenue held at a day's end by the ledger: revenue balances less contra-revenue balances.
  const netAt = async (day: string) =>
    (await accountBalances(ctx.organizationId, { at: day, transaction: ctx.t }))
      .filter((b) => b.type === 'revenue' || b.type === 'contra_revenue')
      .reduce((s, b) => s + (b.type === 'revenue' ? b.balanceCents : -b.balanceCents), 0);
  const [endLast, endPrior, endThis] = [await netAt(`${last}-12-31`), await netAt(`${last - 1}-12-31`), await netAt(`${year}-12-31`)];
  // The check covers every revenue account: it is named for the range of their codes.
  const head = { id: accounts[0]?.id ?? '', code: accounts.length > 1 ? `${accounts[0].code}–${accounts[accounts.length - 1].code}` : (accounts[0]?.code ?? ''), name: 'Revenue accounts' };
  return {
    year, timeZone: ctx.timeZone, currency: ctx.currency, accounts: accountRows, totals,
    reconciliation: {
      thisYear: ledgerCheck(head, endThis - endLast, totals.thisYearCents, { accountIds: ids, from: `${year}-01-01`, to: `${year}-12-31` }),
      lastYear: ledgerCheck(head, endLast - endPrior, totals.lastYearCents, { accountIds: ids, from: `${last}-01-01`, to: `${last}-12-31` }),
    },
  };
}
