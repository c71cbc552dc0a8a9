import type { LedgerCheck } from '@shared/schemas/reports';
import { EntriesFigure } from './figure-button';
import { moneyIn } from './report-format';
import { useTrace } from './trace-context';

/**
 * Whether the report's total agrees with the ledger, in a sentence, with the account's entries one
 * click away. A difference is shown, never hidden: it means an entry outside the posting rules.
 */
/** `measure` names what the ledger figure is: "balance at the end of Dec 2, 2026", "credits less debits in 2027". */
export function LedgerCheckNote({ check, measure, testId }: { check: LedgerCheck; measure: string; testId?: string }) {
  const { currency } = useTrace();
  const money = moneyIn(currency);
  const account = `${check.account.code} ${check.account.name}`;
  if (check.differenceCents === 0) {
    return (
      <p className="mt-3 rounded-md border border-pine-200 bg-pine-50 px-3 py-2 text-sm text-pine-900" data-testid={testId}>
        <span aria-hidden="true">✓ </span>Agrees with the ledger: {account}, {measure}:{' '}
        <EntriesFigure cents={check.ledgerCents} trace={check.trace} what={`${account}, ${measure}`} testId={testId ? `${testId}-ledger` : undefined} />.
      </p>
    );
  }
  return (
    <p role="alert" className="mt-3 rounded-md border border-rust-200 bg-rust-50 px-3 py-2 text-sm text-rust-800" data-testid={testId}>
      Does not agree with the ledger: this report says {money(check.reportCents)}; {account}, {measure}:{' '}
      <EntriesFigure cents={check.ledgerCents} trace={check.trace} what={`${account}, ${measure}`} />, a difference of {money(check.differenceCents)}. An entry was
      posted outside the usual rules; ask your bookkeeper to look at the account’s entries.
    </p>
  );
}
