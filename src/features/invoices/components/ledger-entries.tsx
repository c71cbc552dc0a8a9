import { formatMoney } from '@shared/money';
import type { LedgerEntryRow } from '@shared/schemas/invoices';
import { formatZoned } from '@/lib/zoned-time';
import { kindText } from './ledger-labels';

/**
 * Each journal entry with its lines, so every balance on the panel can be traced: what was
 * debited and credited, to which account, and when.
 */
export function LedgerEntries({ entries, currency, timeZone }: { entries: readonly LedgerEntryRow[]; currency: string; timeZone: string }) {
  const money = (cents: number) => (cents ? formatMoney(cents, currency) : '');
  if (entries.length === 0) return <p className="mt-2 text-sm text-canvas-700">Nothing posted yet: entries appear when an invoice is issued or money comes in.</p>;
  return (
    <ol className="mt-3 space-y-4">
      {entries.map((entry) => {
        const title = entry.memo || kindText(entry.kind);
        const debits = entry.lines.reduce((s, l) => s + l.debitCents, 0);
        const credits = entry.lines.reduce((s, l) => s + l.creditCents, 0);
        return (
          <li key={entry.id} className="rounded-md border border-canvas-200 bg-white">
            <div className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-1 border-b border-canvas-200 px-3 py-2">
              <h4 className="font-semibold text-canvas-900">{title}</h4>
              <span className="text-sm text-canvas-700">{formatZoned(entry.occurredAt, timeZone)}</span>
            </div>
            <div className="relative overflow-x-auto">
              <table className="min-w-full text-left text-sm">
                <caption className="sr-only">
                  {title}, {formatZoned(entry.occurredAt, timeZone)}
                </caption>
                <thead className="text-canvas-700">
                  <tr>
                    <th scope="col" className="px-3 py-1.5 font-semibold">
                      Account
                    </th>
                    <th scope="col" className="px-3 py-1.5 text-right font-semibold">
                      Debit
                    </th>
                    <th scope="col" className="px-3 py-1.5 text-right font-semibold">
                      Credit
                    </th>
                  </tr>
                </thead>
                <tbody className="divide-y divide-canvas-100">
                  {entry.lines.map((line, index) => (
                    <tr key={index}>
                      <th scope="row" className="px-3 py-1.5 font-normal">
                        <span className="font-mono text-xs text-canvas-700">{line.accountCode}</span> {line.accountName}
                      </th>
                      <td className="px-3 py-1.5 text-right whitespace-nowrap tabular-nums">{money(line.debitCents)}</td>
                      <td className="px-3 py-1.5 text-right whitespace-nowrap tabular-nums">{money(line.creditCents)}</td>
                    </tr>
                  ))}
                </tbody>
                <tfoot className="border-t border-canvas-300 text-canvas-800">
                  <tr>
                    <th scope="row" className="px-3 py-1.5 text-right font-semibold">
                      Totals
                    </th>
                    <td className="px-3 py-1.5 text-right font-semibold whitespace-nowrap tabular-nums">{formatMoney(debits, currency)}</td>
                    <td className="px-3 py-1.5 text-right font-semibold whitespace-nowrap tabular-nums">{formatMoney(credits, currency)}</td>
                  </tr>
                </tfoot>
              </table>
            </div>
          </li>
        );
      })}
    </ol>
  );
}
