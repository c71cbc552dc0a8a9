import { Link } from 'react-router';
import { Bar, BarChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { StockItemRow, StockReport } from '@shared/schemas/reports';
import { Badge } from '@/components/ui/badge';
import { EmptyState } from '@/components/ui/empty-state';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { formatCalendarDate } from '@/lib/zoned-time';
import { ChartFigure } from './chart-figure';
import { CHART_COLORS, moneyIn, utilizationText } from './report-format';
import { useTrace } from './trace-context';

const CHART_ITEMS = 12;

function Payback({ row, money }: { row: StockItemRow; money: (c: number) => string }) {
  if (row.payback === 'no_cost') return <span className="text-canvas-700">No purchase cost entered</span>;
  if (row.payback === 'paid_back') {
    return (
      <span className="whitespace-nowrap">
        <Badge tone="positive">Paid back</Badge>
        <span className="block text-xs text-canvas-700">on {formatCalendarDate(row.paidForItselfOn)}</span>
      </span>
    );
  }
  return (
    <span className="whitespace-nowrap">
      <Badge tone="caution">Not yet</Badge>
      <span className="block text-xs text-canvas-700">{money(row.costCents - row.revenueToDateCents)} to go</span>
    </span>
  );
}

/** A figure made of bookings: opens the bookings with their days out, revenue and invoices. */
function BookingsFigure({ row, text, what, from, to }: { row: StockItemRow; text: string; what: string; from: string; to: string }) {
  const { open } = useTrace();
  if (row.bookingCount === 0) return <span className="tabular-nums">{text}</span>;
  return (
    <button
      type="button"
      className="font-semibold tabular-nums text-pine-700 underline decoration-dotted underline-offset-4 hover:text-pine-900 hover:decoration-solid"
      aria-label={`${text}, ${what}: show the bookings behind it`}
      onClick={() => open({ kind: 'bookings', title: row.item.name, itemId: row.item.id, from, to })}
    >
      {text}
    </button>
  );
}

/** Per item: days out against days owned, rental revenue against purchase cost, and the day it paid for itself. */
export function StockReportView({ report: r }: { report: StockReport }) {
  const money = moneyIn(r.currency);
  const ranked = [...r.items].filter((i) => i.utilizationBp !== null).sort((a, b) => (b.utilizationBp ?? 0) - (a.utilizationBp ?? 0));
  const data = ranked.slice(0, CHART_ITEMS).map((i) => ({ name: i.item.name, pct: (i.utilizationBp ?? 0) / 100 }));
  const period = `${formatCalendarDate(r.from)} to ${formatCalendarDate(r.to)}`;
  const summary = ranked.length
    ? `From ${period}, ${ranked[0].item.name} was out most (${utilizationText(ranked[0].utilizationBp)} of its days owned)${ranked.length > 1 ? ` and ${ranked[ranked.length - 1].item.name} least (${utilizationText(ranked[ranked.length - 1].utilizationBp)})` : ''}.`
    : `Nothing was owned from ${period}.`;

  return (
    <section aria-labelledby="stock-heading" className="space-y-4">
      <div>
        <h2 id="stock-heading" className="text-xl font-semibold text-canvas-900">
          Stock utilization and payback
        </h2>
        <p className="mt-1 max-w-prose text-sm text-canvas-700">
          Days out count each unit on reserved, out, returned and closed bookings from the delivery day to the pickup day; days owned count the units you own from the
          day the item was added (or first delivered, if earlier). Revenue is the rental billed on each booking’s invoices less credit notes, shared among its rental
          lines by their amounts after discounts, on the event day. An item has paid for itself once that revenue reaches its purchase cost times the units owned.
        </p>
      </div>
      {r.items.length === 0 ? (
        <EmptyState title="No stock to report on">Items in your catalog show here once they are owned or rented.</EmptyState>
      ) : (
        <>
          {data.length ? (
            <ChartFigure title={`Share of days out, ${period}`} summary={summary} height={Math.max(160, data.length * 32 + 40)}>
              <ResponsiveContainer width="100%" height="100%">
                <BarChart data={data} layout="vertical" margin={{ top: 4, right: 16, bottom: 4, left: 8 }}>
                  <CartesianGrid horizontal={false} stroke={CHART_COLORS.grid} />
                  <XAxis type="number" domain={[0, 100]} tickFormatter={(v: number) => `${v}%`} tick={{ fill: CHART_COLORS.text, fontSize: 12 }} />
                  <YAxis type="category" dataKey="name" width={170} tick={{ fill: CHART_COLORS.text, fontSize: 12 }} />
                  <Tooltip formatter={(v) => `${Number(v).toFixed(2)}%`} />
                  <Bar dataKey="pct" name="Days out of days owned" fill={CHART_COLORS.pine} isAnimationActive={false} />
                </BarChart>
              </ResponsiveContainer>
            </ChartFigure>
          ) : null}
          <Table caption={`Stock utilization and payback, ${period}`}>
            <THead>
              <Tr>
                <Th>Item</Th>
                <Th className="text-right">Owned</Th>
                <Th className="text-right">Days out</Th>
                <Th className="text-right">Days owned</Th>
                <Th className="text-right">Utilization</Th>
                <Th className="text-right">Revenue in period</Th>
                <Th className="text-right">Revenue to date</Th>
                <Th className="text-right">Cost</Th>
                <Th>Paid for itself</Th>
              </Tr>
            </THead>
            <TBody>
              {r.items.map((row) => (
                <Tr key={row.item.id}>
                  <Th scope="row" className="py-3">
                    <Link className={linkClasses} to={paths.app.catalogItem.getHref(row.item.id)}>
                      {row.item.name}
                    </Link>
                  </Th>
                  <Td className="text-right tabular-nums">{row.item.quantityOwned}</Td>
                  <Td className="text-right whitespace-nowrap">
                    <BookingsFigure row={row} text={String(row.daysOut)} what={`unit-days out, ${row.item.name}`} from={r.from} to={r.to} />
                  </Td>
                  <Td className="text-right tabular-nums">{row.daysOwned}</Td>
                  <Td className="text-right tabular-nums">{utilizationText(row.utilizationBp)}</Td>
                  <Td className="text-right whitespace-nowrap">
                    <BookingsFigure row={row} text={money(row.revenueInPeriodCents)} what={`rental revenue in the period, ${row.item.name}`} from={r.from} to={r.to} />
                  </Td>
                  <Td className="text-right whitespace-nowrap tabular-nums">{money(row.revenueToDateCents)}</Td>
                  <Td className="text-right whitespace-nowrap tabular-nums">{money(row.costCents)}</Td>
                  <Td>
                    <Payback row={row} money={money} />
                  </Td>
                </Tr>
              ))}
            </TBody>
          </Table>
        </>
      )}
    </section>
  );
}
