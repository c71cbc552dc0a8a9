import { Link } from 'react-router';
import type { ShortfallItemRow, ShortfallsReport } from '@shared/schemas/reports';
import { EmptyState } from '@/components/ui/empty-state';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { formatCalendarDate } from '@/lib/zoned-time';
import { useTrace } from './trace-context';

function RequestsFigure({ row }: { row: ShortfallItemRow }) {
  const { open } = useTrace();
  const text = `${row.count}`;
  return (
    <button
      type="button"
      className="font-semibold tabular-nums text-pine-700 underline decoration-dotted underline-offset-4 hover:text-pine-900 hover:decoration-solid"
      aria-label={`${row.count} ${row.count === 1 ? 'request' : 'requests'} refused for ${row.item.name}: show them`}
      onClick={() => open({ kind: 'requests', title: row.item.name, requests: row.requests })}
    >
      {text}
    </button>
  );
}

/** What to buy next: the requests the stock could not meet, by item, most often short first. */
export function ShortfallsReportView({ report: r }: { report: ShortfallsReport }) {
  const period = `${formatCalendarDate(r.from)} to ${formatCalendarDate(r.to)}`;
  return (
    <section aria-labelledby="shortfalls-heading" className="space-y-4">
      <div>
        <h2 id="shortfalls-heading" className="text-xl font-semibold text-canvas-900">
          Shortfalls: what to buy next
        </h2>
        <p className="mt-1 max-w-prose text-sm text-canvas-700">
          Every time a booking asked for more than was free, by the day the stock was wanted ({period}). Buying the largest shortfall would have met each of those
          requests on its own; requests on the same days add up.
        </p>
      </div>
      {r.items.length === 0 ? (
        <EmptyState title={`The stock met every request from ${period}`}>When a reservation is refused for want of stock, it shows here.</EmptyState>
      ) : (
        <Table caption={`Shortfalls by item, ${period}`}>
          <THead>
            <Tr>
              <Th>Item</Th>
              <Th className="text-right">Owned</Th>
              <Th className="text-right">Times short</Th>
              <Th className="text-right">Bookings</Th>
              <Th className="text-right">Units short, all requests</Th>
              <Th className="text-right">Largest shortfall</Th>
              <Th>Wanted</Th>
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
                <Td className="text-right">
                  <RequestsFigure row={row} />
                </Td>
                <Td className="text-right tabular-nums">{row.bookingCount}</Td>
                <Td className="text-right tabular-nums">{row.totalShort}</Td>
                <Td className="text-right font-semibold tabular-nums">{row.largestShort}</Td>
                <Td className="whitespace-nowrap">
                  {row.firstDate === row.lastDate ? formatCalendarDate(row.firstDate) : `${formatCalendarDate(row.firstDate)} – ${formatCalendarDate(row.lastDate)}`}
                </Td>
              </Tr>
            ))}
          </TBody>
        </Table>
      )}
    </section>
  );
}
