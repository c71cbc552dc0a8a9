import { useState } from 'react';
import { Link } from 'react-router';
import type { AgingInvoice, EntriesTrace, TracedEntry } from '@shared/schemas/reports';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { Pagination } from '@/components/ui/pagination';
import { Spinner } from '@/components/ui/spinner';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { cn } from '@/lib/cn';
import { formatCalendarDate, formatZoned } from '@/lib/zoned-time';
import { useEntries } from '../api/get-entries';
import { BookingsBehind, RequestsBehind } from './behind-lists';
import { kindText, moneyIn } from './report-format';
import type { Behind } from './trace-context';

const KIND_LABELS: Record<AgingInvoice['kind'], string> = { deposit: 'Deposit', balance: 'Balance', additional: 'Additional charges' };

/** The open invoices behind an aging figure, each a link to its page. */
function InvoicesBehind({ invoices, cents, currency }: { invoices: AgingInvoice[]; cents: number; currency: string }) {
  const money = moneyIn(currency);
  return (
    <>
      <Table caption="Invoices behind this figure">
        <THead>
          <Tr>
            <Th>Invoice</Th>
            <Th>Booking</Th>
            <Th>Due</Th>
            <Th className="text-right">Days past due</Th>
            <Th className="text-right">Balance</Th>
          </Tr>
        </THead>
        <TBody>
          {invoices.map((i) => (
            <Tr key={i.id}>
              <Th scope="row" className="py-3">
                <Link className={linkClasses} to={paths.app.invoice.getHref(i.id)}>
                  {i.number}
                </Link>
                <span className="block text-xs font-normal text-canvas-700">{KIND_LABELS[i.kind]}</span>
              </Th>
              <Td>
                <Link className={linkClasses} to={paths.app.booking.getHref(i.bookingId)}>
                  {i.bookingReference}
                </Link>
              </Td>
              <Td className="whitespace-nowrap">{formatCalendarDate(i.dueDate)}</Td>
              <Td className="text-right tabular-nums">{i.daysPastDue > 0 ? i.daysPastDue : i.daysPastDue === 0 ? 'Due today' : 'Not yet due'}</Td>
              <Td className="text-right font-semibold whitespace-nowrap tabular-nums">{money(i.balanceCents)}</Td>
            </Tr>
          ))}
        </TBody>
      </Table>
      <p className="mt-3 text-sm text-canvas-800">
        Together: <strong className="tabular-nums">{money(invoices.reduce((s, i) => s + i.balanceCents, 0))}</strong>
        {invoices.reduce((s, i) => s + i.balanceCents, 0) === cents ? ', the figure you opened.' : null}
      </p>
    </>
  );
}

function EntryCard({ entry, currency, timeZone }: { entry: TracedEntry; currency: string; timeZone: string }) {
  const money = (c: number) => (c ? moneyIn(currency)(c) : '');
  const title = entry.memo || kindText(entry.kind);
  return (
    <li className="rounded-md border border-canvas-200 bg-white">
      <div className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-1 border-b border-canvas-200 px-3 py-2">
        <h3 className="font-semibold text-canvas-900">{title}</h3>
        <span className="text-sm text-canvas-700">{formatZoned(entry.occurredAt, timeZone)}</span>
      </div>
      <p className="flex flex-wrap gap-x-4 gap-y-1 px-3 pt-2 text-sm text-canvas-800">
        {entry.invoice ? (
          <Link className={linkClasses} to={paths.app.invoice.getHref(entry.invoice.id)}>
            Invoice {entry.invoice.number ?? '(draft)'}
          </Link>
        ) : null}
        {entry.booking ? (
          <Link className={linkClasses} to={paths.app.booking.getHref(entry.booking.id)}>
            Booking {entry.booking.reference}
          </Link>
        ) : null}
        {entry.customer ? (
          <Link className={linkClasses} to={paths.app.customerStatement.getHref(entry.customer.id)}>
            Statement for {entry.customer.name}
          </Link>
        ) : null}
      </p>
      <div className="relative overflow-x-auto px-1 pb-2">
        <table className="min-w-full text-left text-sm">
          <caption className="sr-only">Lines of {title}</caption>
          <thead className="text-canvas-700">
            <tr>
              <th scope="col" className="px-2 py-1.5 font-semibold">
                Account
              </th>
              <th scope="col" className="px-2 py-1.5 text-right font-semibold">
                Debit
              </th>
              <th scope="col" className="px-2 py-1.5 text-right font-semibold">
                Credit
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-canvas-100">
            {entry.lines.map((l, i) => (
              <tr key={i} className={cn(l.traced ? 'bg-pine-50 font-semibold text-canvas-900' : 'text-canvas-700')}>
                <th scope="row" className="px-2 py-1.5 font-normal">
                  <span className="font-mono text-xs">{l.accountCode}</span> {l.accountName}
                  {l.traced ? <span className="sr-only"> (this figure’s account)</span> : null}
                </th>
                <td className="px-2 py-1.5 text-right whitespace-nowrap tabular-nums">{money(l.debitCents)}</td>
                <td className="px-2 py-1.5 text-right whitespace-nowrap tabular-nums">{money(l.creditCents)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="border-t border-canvas-200 px-3 py-2 text-right text-sm">
        Adds to the figure: <strong className="tabular-nums">{moneyIn(currency)(entry.effectCents)}</strong>
      </p>
    </li>
  );
}

function EntriesBehind({ trace, cents, currency, timeZone }: { trace: EntriesTrace; cents: number; currency: string; timeZone: string }) {
  const [page, setPage] = useState(1);
  const entries = useEntries(trace, page);
  if (entries.isPending) return <Spinner label="Loading the entries…" />;
  if (entries.isError) {
    return (
      <Alert tone="danger" title="The entries could not be loaded.">
        {errorMessage(entries.error)}{' '}
        <Button variant="secondary" size="sm" onClick={() => void entries.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }
  const e = entries.data;
  const period = trace.from || trace.to ? `${trace.from ? `from ${formatCalendarDate(trace.from)} ` : ''}${trace.to ? `to ${formatCalendarDate(trace.to)}` : ''}`.trim() : 'all dates';
  return (
    <>
      <p className="text-sm text-canvas-800">
        {e.accounts.map((a) => `${a.code} ${a.name}`).join(', ')}, {period}
        {trace.taxRateBp !== undefined ? `, taxed at ${trace.taxRateBp / 100}%` : ''}. {e.side === 'credit' ? 'Credits less debits.' : 'Debits less credits.'}
      </p>
      {e.total === 0 ? (
        <p className="mt-3 text-sm text-canvas-700">No entries: nothing was posted to this account for this figure.</p>
      ) : (
        <ol className="mt-3 space-y-3">
          {e.entries.map((entry) => (
            <EntryCard key={entry.id} entry={entry} currency={currency} timeZone={timeZone} />
          ))}
        </ol>
      )}
      <Pagination page={page} pageSize={50} total={e.total} onPageChange={setPage} label="Pages of entries" />
      <p className="mt-3 text-sm text-canvas-800" data-testid="entries-total">
        {e.total} {e.total === 1 ? 'entry' : 'entries'}, adding up to <strong className="tabular-nums">{moneyIn(currency)(e.totalCents)}</strong>
        {e.totalCents === cents ? ', the figure you opened.' : '.'}
      </p>
    </>
  );
}

const TITLES: Record<Behind['kind'], string> = { entries: 'Entries behind', invoices: 'Invoices behind', bookings: 'Bookings behind', requests: 'Requests behind' };

/** The drawer that lists what is behind a figure: its journal entries or its invoices. */
export function BehindDialog({ behind, currency, timeZone, onClose }: { behind: Behind | null; currency: string; timeZone: string; onClose: () => void }) {
  return (
    <Dialog
      open={behind !== null}
      wide
      title={behind ? `${TITLES[behind.kind]}: ${behind.title}` : ''}
      onClose={onClose}
      footer={
        <Button variant="secondary" onClick={onClose}>
          Close
        </Button>
      }
    >
      {behind?.kind === 'entries' ? (
        <EntriesBehind key={JSON.stringify(behind.trace)} trace={behind.trace} cents={behind.cents} currency={currency} timeZone={timeZone} />
      ) : behind?.kind === 'invoices' ? (
        <InvoicesBehind invoices={behind.invoices} cents={behind.cents} currency={currency} />
      ) : behind?.kind === 'bookings' ? (
        <BookingsBehind itemId={behind.itemId} from={behind.from} to={behind.to} currency={currency} />
      ) : behind?.kind === 'requests' ? (
        <RequestsBehind requests={behind.requests} timeZone={timeZone} />
      ) : null}
    </Dialog>
  );
}
