import type { SalesTaxReport } from '@shared/schemas/reports';
import { EmptyState } from '@/components/ui/empty-state';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { formatCalendarDate } from '@/lib/zoned-time';
import { EntriesFigure } from './figure-button';
import { LedgerCheckNote } from './ledger-check';
import { monthText, moneyIn, percentFromBp } from './report-format';

/** Sales tax billed by month and rate, less what credit notes and voids gave back, checked against sales tax payable. */
export function SalesTaxReportView({ report: r }: { report: SalesTaxReport }) {
  const money = moneyIn(r.currency);
  const span = r.from === r.to ? monthText(r.from, true) : `${monthText(r.from, true)} to ${monthText(r.to, true)}`;
  const lastDay = r.reconciliation.trace.to ?? '';
  return (
    <section aria-labelledby="tax-heading" className="space-y-4">
      <div>
        <h2 id="tax-heading" className="text-xl font-semibold text-canvas-900">
          Sales tax collected
        </h2>
        <p className="mt-1 max-w-prose text-sm text-canvas-700">
          Tax billed on invoices issued in each month, by the booking’s rate, less the tax given back by credit notes and voided invoices: what is owed to the state
          for {span}, as the books record it when billed. A net figure opens its entries, each with a link to its invoice or credit note.
        </p>
      </div>
      {r.rows.length === 0 ? (
        <EmptyState title={`No sales tax billed in ${span}`}>Taxed invoices issued in these months show here.</EmptyState>
      ) : (
        <Table caption={`Sales tax by month and rate, ${span}`}>
          <THead>
            <Tr>
              <Th>Month</Th>
              <Th className="text-right">Rate</Th>
              <Th className="text-right">Billed</Th>
              <Th className="text-right">Given back</Th>
              <Th className="text-right">Net</Th>
              <Th className="text-right">Invoices and credit notes</Th>
            </Tr>
          </THead>
          <TBody>
            {r.rows.map((row) => (
              <Tr key={`${row.month} ${row.taxRateBp}`}>
                <Th scope="row" className="py-3 whitespace-nowrap">
                  {monthText(row.month, true)}
                </Th>
                <Td className="text-right tabular-nums">{percentFromBp(row.taxRateBp)}</Td>
                <Td className="text-right whitespace-nowrap tabular-nums">{money(row.billedCents)}</Td>
                <Td className="text-right whitespace-nowrap tabular-nums">{row.returnedCents ? money(-row.returnedCents) : money(0)}</Td>
                <Td className="text-right whitespace-nowrap">
                  <EntriesFigure cents={row.netCents} trace={row.trace} what={`sales tax at ${percentFromBp(row.taxRateBp)}, ${monthText(row.month, true)}`} />
                </Td>
                <Td className="text-right tabular-nums">{row.invoiceCount}</Td>
              </Tr>
            ))}
          </TBody>
          <tfoot className="border-t-2 border-canvas-300 bg-canvas-50">
            <Tr>
              <Th scope="row" className="py-3" colSpan={2}>
                Total
              </Th>
              <Td className="text-right font-semibold whitespace-nowrap tabular-nums">{money(r.billedCents)}</Td>
              <Td className="text-right font-semibold whitespace-nowrap tabular-nums">{money(-r.returnedCents)}</Td>
              <Td className="text-right whitespace-nowrap">
                <EntriesFigure cents={r.netCents} trace={r.reconciliation.trace} what={`sales tax, ${span}`} testId="tax-total" />
              </Td>
              <Td />
            </Tr>
          </tfoot>
        </Table>
      )}
      <LedgerCheckNote check={r.reconciliation} measure={`credits less debits to ${formatCalendarDate(lastDay)} since the start of ${monthText(r.from, true)}`} testId="tax-check" />
    </section>
  );
}
