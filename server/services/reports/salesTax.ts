/**
 * Sales tax by month and rate, from the ledger's lines on sales tax payable. Tax is owed to the
 * state when billed (the posting rules credit the account at issue), so "collected" here means
 * billed, on the accrual basis the books are kept on: credits are tax on invoices issued, debits
 * the tax given back by credit notes and voids. The month is the entry's day in the company's zone.
 *
 * The rate is the booking's tax rate: invoices do not store a rate of their own, and every tax
 * amount on a booking's invoices is worked at the booking's rate. A rate edited after invoicing
 * therefore shows the new rate; the amounts are still the ones billed.
 *
 * Reconciliation: the report's net total equals the net credit movement of sales tax payable over
 * the same days, read from balances.ts at the period's two ends.
 */
import { QueryTypes } from 'sequelize';
import { addDays } from '../../../shared/dates';
import type { SalesTaxReport, SalesTaxRow } from '../../../shared/schemas/reports';
import { sequelize } from '../../db';
import { accountBalances } from '../../ledger/balances';
import { accountsByKey, endOfDay, lastDayOfMonth, ledgerCheck, monthList, startOfDay, trace, type ReportContext } from './common';

export async function salesTaxReport(ctx: ReportContext, fromMonth: string, toMonth: string): Promise<SalesTaxReport> {
  const account = (await accountsByKey(ctx, ['sales_tax_payable'])).get('sales_tax_payable')!;
  const firstDay = `${fromMonth}-01`;
  const lastDay = lastDayOfMonth(toMonth);
  const rows = await sequelize.query<{ month: string; rate: number; billed: number; returned: number; invoices: number }>(
    `SELECT to_char(e.occurred_at AT TIME ZONE :tz, 'YYYY-MM') AS month,
            coalesce(b.tax_rate_bp, 0) AS rate,
            sum(l.credit_cents)::bigint AS billed,
            sum(l.debit_cents)::bigint AS returned,
            count(DISTINCT e.source_id) FILTER (WHERE e.source_type = 'invoice')::int AS invoices
       FROM journal_lines l
       JOIN journal_entries e ON e.id = l.entry_id
       LEFT JOIN bookings b ON b.id = e.booking_id
      WHERE l.organization_id = :org AND l.account_id = :account AND e.occurred_at >= :from AND e.occurred_at < :until
      GROUP BY 1, 2
      ORDER BY 1, 2`,
    {
      replacements: { org: ctx.organizationId, account: account.id, tz: ctx.timeZone, from: startOfDay(firstDay, ctx.timeZone), until: endOfDay(lastDay, ctx.timeZone) },
      type: QueryTypes.SELECT,
      transaction: ctx.t,
    },
  );
  const monthTrace = (month: string, taxRateBp?: number) =>
    trace({ accountIds: [account.id], from: `${month}-01`, to: lastDayOfMonth(month), taxRateBp });
  const out: SalesTaxRow[] = rows.map((r) => {
    const billedCents = Number(r.billed);
    const returnedCents = Number(r.returned);
    const taxRateBp = Number(r.rate);
    return { month: r.month, taxRateBp, billedCents, returnedCents, netCents: billedCents - returnedCents, invoiceCount: Number(r.invoices), trace: monthTrace(r.month, taxRateBp) };
  });
  const months = monthList(fromMonth, toMonth).map((month) => ({
    month,
    netCents: out.filter((r) => r.month === month).reduce((s, r) => s + r.netCents, 0),
    trace: monthTrace(month),
  }));
  const billedCents = out.reduce((s, r) => s + r.billedCents, 0);
  const returnedCents = out.reduce((s, r) => s + r.returnedCents, 0);
  const netCents = billedCents - returnedCents;

  // The ledger's own balances at the two ends of the period, in the same snapshot.
  const balanceOn = async (day: string) => (await accountBalances(ctx.organizationId, { at: day, transaction: ctx.t })).find((a) => a.accountId === account.id)!.balanceCents;
  const movement = (await balanceOn(lastDay)) - (await balanceOn(addDays(firstDay, -1)));
  return {
    from: fromMonth, to: toMonth, timeZone: ctx.timeZone, currency: ctx.currency, rows: out, months, billedCents, returnedCents, netCents,
    reconciliation: ledgerCheck(account, movement, netCents, { accountIds: [account.id], from: firstDay, to: lastDay }),
  };
}
