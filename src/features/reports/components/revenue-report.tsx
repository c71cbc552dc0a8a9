import { useState } from 'react';
import { Bar, BarChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { RevenueReport } from '@shared/schemas/reports';
import { Chip } from '@/components/ui/chip';
import { EmptyState } from '@/components/ui/empty-state';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { cn } from '@/lib/cn';
import { ChartFigure } from './chart-figure';
import { EntriesFigure } from './figure-button';
import { LedgerCheckNote } from './ledger-check';
import { CHART_COLORS, compactMoney, longMonth, moneyIn, shortMonth } from './report-format';

const MONTHS = Array.from({ length: 12 }, (_, i) => i);

/** Net revenue by month and account, a year against the one before, with both years checked against the revenue accounts. */
export function RevenueReportView({ report: r }: { report: RevenueReport }) {
  const money = moneyIn(r.currency);
  const last = r.year - 1;
  const [shown, setShown] = useState<'this' | 'last'>('this');
  const data = MONTHS.map((m) => ({ month: shortMonth(m), thisYear: r.totals.thisYear[m], lastYear: r.totals.lastYear[m] }));
  const change = r.totals.thisYearCents - r.totals.lastYearCents;
  const best = MONTHS.reduce((b, m) => (r.totals.thisYear[m] > r.totals.thisYear[b] ? m : b), 0);
  const summary = `Net revenue ${money(r.totals.thisYearCents)} in ${r.year} against ${money(r.totals.lastYearCents)} in ${last}, ${change >= 0 ? 'up' : 'down'} ${money(Math.abs(change))}${r.totals.thisYearCents > 0 ? `; the best month of ${r.year} was ${longMonth(best)} at ${money(r.totals.thisYear[best])}` : ''}.`;
  const year = shown === 'this' ? r.year : last;

  return (
    <section aria-labelledby="revenue-heading" className="space-y-4">
      <div>
        <h2 id="revenue-heading" className="text-xl font-semibold text-canvas-900">
          Revenue by month, {r.year} against {last}
        </h2>
        <p className="mt-1 max-w-prose text-sm text-canvas-700">
          What the ledger’s revenue accounts earned each month, less refunds and allowances: deposits count on the event day, not when billed. Months are your company’s
          calendar months.
        </p>
      </div>
      <div className="grid gap-4 xl:grid-cols-[minmax(0,1fr)_minmax(0,24rem)] xl:items-start">
        {r.totals.thisYearCents === 0 && r.totals.lastYearCents === 0 && data.every((d) => d.thisYear === 0 && d.lastYear === 0) ? (
          <EmptyState title={`No revenue in ${r.year} or ${last} yet`}>
            Revenue shows once an event has taken place (deposits move to revenue on the event day) or an invoice is issued after it.
          </EmptyState>
        ) : (
          <ChartFigure title={`Net revenue, ${r.year} and ${last}`} summary={summary} height={280}>
            <ResponsiveContainer width="100%" height="100%">
              <BarChart data={data} margin={{ top: 8, right: 8, bottom: 8, left: 8 }}>
                <CartesianGrid vertical={false} stroke={CHART_COLORS.grid} />
                <XAxis dataKey="month" tick={{ fill: CHART_COLORS.text, fontSize: 12 }} />
                <YAxis tickFormatter={(v: number) => compactMoney(v, r.currency)} tick={{ fill: CHART_COLORS.text, fontSize: 12 }} width={56} />
                <Tooltip formatter={(v) => money(Number(v))} />
                <Legend />
                <Bar dataKey="lastYear" name={String(last)} fill={CHART_COLORS.canvas} isAnimationActive={false} />
                <Bar dataKey="thisYear" name={String(r.year)} fill={CHART_COLORS.pine} isAnimationActive={false} />
              </BarChart>
            </ResponsiveContainer>
          </ChartFigure>
        )}
        <Table caption={`Net revenue by month, ${r.year} against ${last}`}>
          <THead>
            <Tr>
              <Th>Month</Th>
              <Th className="text-right">{r.year}</Th>
              <Th className="text-right">{last}</Th>
            </Tr>
          </THead>
          <TBody>
            {MONTHS.map((m) => (
              <Tr key={m}>
                <Th scope="row" className="py-2">
                  {longMonth(m)}
                </Th>
                <Td className="py-2 text-right whitespace-nowrap">
                  <EntriesFigure cents={r.totals.thisYear[m]} trace={r.totals.thisYearTraces[m]} what={`net revenue, ${longMonth(m)} ${r.year}`} />
                </Td>
                <Td className="py-2 text-right whitespace-nowrap">
                  <EntriesFigure cents={r.totals.lastYear[m]} trace={r.totals.lastYearTraces[m]} what={`net revenue, ${longMonth(m)} ${last}`} />
                </Td>
              </Tr>
            ))}
          </TBody>
          <tfoot className="border-t-2 border-canvas-300 bg-canvas-50">
            <Tr>
              <Th scope="row" className="py-3">
                Year
              </Th>
              <Td className="text-right font-semibold whitespace-nowrap tabular-nums" data-testid="revenue-this-year">
                {money(r.totals.thisYearCents)}
              </Td>
              <Td className="text-right font-semibold whitespace-nowrap tabular-nums">{money(r.totals.lastYearCents)}</Td>
            </Tr>
          </tfoot>
        </Table>
      </div>

      <section aria-labelledby="revenue-accounts-heading" className="space-y-2">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <h3 id="revenue-accounts-heading" className="text-lg font-semibold text-canvas-900">
            By account and month, {year}
          </h3>
          <div role="group" aria-label="Year shown by account" className="flex gap-2">
            <Chip pressed={shown === 'this'} onClick={() => setShown('this')}>
              {r.year}
            </Chip>
            <Chip pressed={shown === 'last'} onClick={() => setShown('last')}>
              {last}
            </Chip>
          </div>
        </div>
        {r.accounts.every((a) => (shown === 'this' ? a.thisYear : a.lastYear).every((v) => v === 0)) ? (
          <p className="rounded-md border border-dashed border-canvas-300 bg-canvas-50 px-4 py-3 text-sm text-canvas-700">
            Nothing was posted to the revenue accounts in {year}.
          </p>
        ) : (
          <Table caption={`Revenue by account and month, ${year}`}>
            <THead>
              <Tr>
                <Th>Account</Th>
                {MONTHS.map((m) => (
                  <Th key={m} className="text-right">
                    <abbr title={longMonth(m)} className="no-underline">
                      {shortMonth(m)}
                    </abbr>
                  </Th>
                ))}
                <Th className="text-right">{year}</Th>
              </Tr>
            </THead>
            <TBody>
              {r.accounts.map((a) => {
                const values = shown === 'this' ? a.thisYear : a.lastYear;
                const traces = shown === 'this' ? a.thisYearTraces : a.lastYearTraces;
                return (
                  <Tr key={a.account.id}>
                    <Th scope="row" className="py-2">
                      <span className="font-mono text-xs text-canvas-700">{a.account.code}</span> {a.account.name}
                    </Th>
                    {MONTHS.map((m) => (
                      <Td key={m} className={cn('py-2 text-right whitespace-nowrap', values[m] === 0 && 'text-canvas-600')}>
                        {values[m] === 0 ? (
                          <span className="tabular-nums">{money(0)}</span>
                        ) : (
                          <EntriesFigure cents={values[m]} trace={traces[m]} what={`${a.account.name}, ${longMonth(m)} ${year}`} />
                        )}
                      </Td>
                    ))}
                    <Td className="py-2 text-right font-semibold whitespace-nowrap tabular-nums">{money(shown === 'this' ? a.thisYearTotalCents : a.lastYearTotalCents)}</Td>
                  </Tr>
                );
              })}
            </TBody>
          </Table>
        )}
      </section>
      <LedgerCheckNote check={r.reconciliation.thisYear} measure={`revenue less refunds and allowances in ${r.year}`} testId="revenue-check" />
      <LedgerCheckNote check={r.reconciliation.lastYear} measure={`revenue less refunds and allowances in ${last}`} />
    </section>
  );
}
