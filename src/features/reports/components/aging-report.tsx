import { Link } from 'react-router';
import { Bar, BarChart, CartesianGrid, Cell, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { AGING_BUCKET_DESCRIPTIONS, AGING_BUCKET_LABELS, AGING_BUCKETS, type AgingBucket } from '@shared/aging';
import type { AgingReport } from '@shared/schemas/reports';
import { EmptyState } from '@/components/ui/empty-state';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { formatCalendarDate } from '@/lib/zoned-time';
import { ChartFigure } from './chart-figure';
import { InvoicesFigure } from './figure-button';
import { LedgerCheckNote } from './ledger-check';
import { CHART_COLORS, compactMoney, moneyIn } from './report-format';

/** Short enough to sit under a bar; the axis says what they count. */
const AXIS_LABELS: Record<AgingBucket, string> = { current: 'Current', days1to30: '1–30', days31to60: '31–60', days61to90: '61–90', over90: '90+' };

const BUCKET_COLORS: Record<AgingBucket, string> = {
  current: CHART_COLORS.pineMid,
  days1to30: CHART_COLORS.ochre,
  days31to60: CHART_COLORS.copper,
  days61to90: CHART_COLORS.rust,
  over90: CHART_COLORS.rustDark,
};

/** Who owes what, and how late: open invoices by customer and days past due, with the total checked against accounts receivable. */
export function AgingReportView({ report: r }: { report: AgingReport }) {
  const money = moneyIn(r.currency);
  const invoices = r.customers.flatMap((c) => c.invoices);
  const late = AGING_BUCKETS.filter((b) => b !== 'current').reduce((s, b) => s + r.totals[b], 0);
  const data = AGING_BUCKETS.map((b) => ({ bucket: AXIS_LABELS[b], key: b, cents: r.totals[b] }));
  const summary =
    r.totalCents === 0
      ? `Nothing is owed on ${formatCalendarDate(r.at)}.`
      : `${money(r.totalCents)} owed on ${formatCalendarDate(r.at)}, ${money(late)} of it past due: ${AGING_BUCKETS.filter((b) => r.totals[b] !== 0)
          .map((b) => `${money(r.totals[b])} ${AGING_BUCKET_DESCRIPTIONS[b]}`)
          .join(', ')}.`;

  return (
    <section aria-labelledby="aging-heading" className="space-y-4">
      <div>
        <h2 id="aging-heading" className="text-xl font-semibold text-canvas-900">
          Receivables aging
        </h2>
        <p className="mt-1 max-w-prose text-sm text-canvas-700">
          What customers owe on {formatCalendarDate(r.at)} by how many days past its due date each invoice is, in your company’s calendar. Balances are totals less
          what was paid and credited by the end of that day.
        </p>
      </div>
      {r.customers.length === 0 ? (
        <EmptyState title={`Nobody owes anything on ${formatCalendarDate(r.at)}`}>Invoices with a balance show here once they are issued.</EmptyState>
      ) : (
        <>
          <ChartFigure title="Owed by days past due" summary={summary} height={220}>
            <ResponsiveContainer width="100%" height="100%">
              <BarChart data={data} margin={{ top: 8, right: 8, bottom: 8, left: 8 }}>
                <CartesianGrid vertical={false} stroke={CHART_COLORS.grid} />
                <XAxis
                  dataKey="bucket"
                  tick={{ fill: CHART_COLORS.text, fontSize: 12 }}
                  interval={0}
                  label={{ value: 'Days past due', position: 'insideBottom', offset: -4, fill: CHART_COLORS.text, fontSize: 12 }}
                  height={40}
                />
                <YAxis tickFormatter={(v: number) => compactMoney(v, r.currency)} tick={{ fill: CHART_COLORS.text, fontSize: 12 }} width={56} />
                <Tooltip formatter={(v) => money(Number(v))} />
                <Bar dataKey="cents" name="Owed" isAnimationActive={false}>
                  {data.map((d) => (
                    <Cell key={d.key} fill={BUCKET_COLORS[d.key]} />
                  ))}
                </Bar>
              </BarChart>
            </ResponsiveContainer>
          </ChartFigure>
          <Table caption={`Receivables aging by customer on ${formatCalendarDate(r.at)}`}>
            <THead>
              <Tr>
                <Th>Customer</Th>
                {AGING_BUCKETS.map((b) => (
                  <Th key={b} className="text-right">
                    {AGING_BUCKET_LABELS[b]}
                  </Th>
                ))}
                <Th className="text-right">Total</Th>
              </Tr>
            </THead>
            <TBody>
              {r.customers.map((c) => (
                <Tr key={c.customer.id}>
                  <Th scope="row" className="py-3">
                    <Link className={linkClasses} to={paths.app.customerStatement.getHref(c.customer.id)}>
                      {c.customer.name}
                    </Link>
                  </Th>
                  {AGING_BUCKETS.map((b) => (
                    <Td key={b} className="text-right whitespace-nowrap">
                      <InvoicesFigure
                        cents={c.buckets[b]}
                        invoices={c.invoices.filter((i) => i.bucket === b)}
                        what={`${c.customer.name}, ${AGING_BUCKET_DESCRIPTIONS[b]}`}
                      />
                    </Td>
                  ))}
                  <Td className="text-right whitespace-nowrap">
                    <InvoicesFigure cents={c.totalCents} invoices={c.invoices} what={`${c.customer.name}, everything owed`} />
                  </Td>
                </Tr>
              ))}
            </TBody>
            <tfoot className="border-t-2 border-canvas-300 bg-canvas-50">
              <Tr>
                <Th scope="row" className="py-3">
                  All customers
                </Th>
                {AGING_BUCKETS.map((b) => (
                  <Td key={b} className="text-right whitespace-nowrap">
                    <InvoicesFigure cents={r.totals[b]} invoices={invoices.filter((i) => i.bucket === b)} what={`all customers, ${AGING_BUCKET_DESCRIPTIONS[b]}`} />
                  </Td>
                ))}
                <Td className="text-right whitespace-nowrap">
                  <InvoicesFigure cents={r.totalCents} invoices={invoices} what="everything owed" testId="aging-total" />
                </Td>
              </Tr>
            </tfoot>
          </Table>
        </>
      )}
      <LedgerCheckNote check={r.reconciliation} measure={`balance at the end of ${formatCalendarDate(r.at)}`} testId="aging-check" />
    </section>
  );
}
