import type { UseQueryResult } from '@tanstack/react-query';
import { useMemo, useState, type ReactNode } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { PageSpinner, Spinner } from '@/components/ui/spinner';
import { errorMessage, isApiError } from '@/lib/api';
import { BehindDialog } from './behind-dialog';
import { TraceContext, type Behind } from './trace-context';

/**
 * One report's states: loading, an error with Try again, and the report itself with the drawer
 * its figures open. A 400 is the query's fault and is shown by the form, which keeps the last
 * figures on screen.
 */
export function ReportFrame<T extends { currency?: string; timeZone: string }>({
  query,
  loadingLabel,
  children,
}: {
  query: UseQueryResult<T>;
  loadingLabel: string;
  children: (data: T) => ReactNode;
}) {
  const [behind, setBehind] = useState<Behind | null>(null);
  const data = query.data;
  const currency = data?.currency ?? 'USD';
  const timeZone = data?.timeZone ?? 'UTC';
  const context = useMemo(() => ({ currency, timeZone, open: setBehind }), [currency, timeZone]);

  if (query.isPending) return <PageSpinner label={loadingLabel} />;
  if (!data) {
    return (
      <Alert tone="danger" title="The report could not be loaded.">
        <p>{errorMessage(query.error)}</p>
        <Button className="mt-2" variant="secondary" size="sm" onClick={() => void query.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }
  return (
    <TraceContext.Provider value={context}>
      <div className="mb-2 flex min-h-6 items-center text-sm text-canvas-700" aria-live="polite">
        {query.isFetching ? <Spinner label="Updating…" /> : null}
        {query.isError && !(isApiError(query.error) && query.error.status === 400) ? (
          <span className="font-semibold text-rust-700">These figures may be out of date: {errorMessage(query.error)}</span>
        ) : null}
      </div>
      {children(data)}
      <BehindDialog behind={behind} currency={currency} timeZone={timeZone} onClose={() => setBehind(null)} />
    </TraceContext.Provider>
  );
}
