import type { AgingInvoice, EntriesTrace } from '@shared/schemas/reports';
import { cn } from '@/lib/cn';
import { moneyIn } from './report-format';
import { useTrace } from './trace-context';

const figureClasses = 'font-semibold tabular-nums text-pine-700 underline decoration-dotted underline-offset-4 hover:text-pine-900 hover:decoration-solid';

/**
 * A figure that opens what is behind it: the journal entries of its trace. Its accessible name
 * says the amount and what it is, so "$1,250.00, rental revenue, March 2027" reads whole.
 */
export function EntriesFigure({ cents, trace, what, className, testId }: { cents: number; trace: EntriesTrace; what: string; className?: string; testId?: string }) {
  const { currency, open } = useTrace();
  const text = moneyIn(currency)(cents);
  return (
    <button
      type="button"
      className={cn(figureClasses, className)}
      aria-label={`${text}, ${what}: show the entries behind it`}
      data-testid={testId}
      onClick={() => open({ kind: 'entries', title: what, trace, cents })}
    >
      {text}
    </button>
  );
}

/** A figure summed from invoices: opens the list of them, each a link to its page. */
export function InvoicesFigure({ cents, invoices, what, className, testId }: { cents: number; invoices: AgingInvoice[]; what: string; className?: string; testId?: string }) {
  const { currency, open } = useTrace();
  const text = moneyIn(currency)(cents);
  if (invoices.length === 0) return <span className={cn('tabular-nums text-canvas-600', className)}>{text}</span>;
  return (
    <button
      type="button"
      className={cn(figureClasses, className)}
      aria-label={`${text}, ${what}: show the ${invoices.length === 1 ? 'invoice' : `${invoices.length} invoices`} behind it`}
      data-testid={testId}
      onClick={() => open({ kind: 'invoices', title: what, invoices, cents })}
    >
      {text}
    </button>
  );
}
