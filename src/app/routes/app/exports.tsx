import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { EXPORT_KINDS, ExportRangeQuery } from '@shared/schemas/exports';
import { Alert } from '@/components/ui/alert';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { Pagination } from '@/components/ui/pagination';
import { Spinner } from '@/components/ui/spinner';
import { errorMessage } from '@/lib/api';
import { zonedDate } from '@/lib/zoned-time';
import { lockDateQueryOptions } from '@/features/books/api/get-lock-date';
import { ClosedBooksPanel } from '@/features/books/components/closed-books-panel';
import { exportHistoryQueryOptions, useExportHistory } from '@/features/exports/api/get-export-history';
import { ExportCard } from '@/features/exports/components/export-card';
import { ExportHistoryTable } from '@/features/exports/components/export-history-table';
import { ExportRangeFields } from '@/features/exports/components/export-range-fields';
import { quickRange, type DateRange } from '@/features/exports/components/date-ranges';
import { organizationQueryOptions, useOrganization } from '@/features/organization/api/get-organization';
import { requireArea } from '../../guards';

const PAGE_SIZE = 20;

const pageOf = (params: URLSearchParams) => {
  const page = Number(params.get('page') ?? '1');
  return Number.isInteger(page) && page > 0 ? page : 1;
};

// The bookkeeper's and the owner's (the server answers 403 to others): the history comes with the page.
export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'exports');
  // The company's time zone decides what "today" and "last month" are.
  await queryClient.ensureQueryData(organizationQueryOptions()).catch(() => null);
  void queryClient.prefetchQuery(exportHistoryQueryOptions(pageOf(new URL(request.url).searchParams), PAGE_SIZE));
  void queryClient.prefetchQuery(lockDateQueryOptions());
  return null;
};

/** The dates' problems in words, keyed by field, from the same schema the server checks with. */
function rangeErrors(range: DateRange): Partial<Record<'from' | 'to', string>> {
  const result = ExportRangeQuery.safeParse(range);
  if (result.success) return {};
  const errors: Partial<Record<'from' | 'to', string>> = {};
  for (const issue of result.error.issues) {
    const key = issue.path[0] as 'from' | 'to';
    errors[key] ??= issue.message;
  }
  return errors;
}

export default function ExportsRoute() {
  const [params, setParams] = useSearchParams();
  const organization = useOrganization();
  const timeZone = organization.data?.timeZone ?? 'UTC';
  const today = zonedDate(new Date(), timeZone);
  // Closing last month is the usual errand: it is the first range offered.
  const [range, setRange] = useState<DateRange>(() => {
    const from = params.get('from');
    const to = params.get('to');
    return from && to ? { from, to } : quickRange('lastMonth', zonedDate(new Date(), timeZone));
  });
  const [showErrors, setShowErrors] = useState(false);
  const errors = rangeErrors(range);
  const valid = Object.keys(errors).length === 0;
  const page = pageOf(params);
  const history = useExportHistory(page, PAGE_SIZE);

  const change = (next: DateRange) => {
    setRange(next);
    setShowErrors(true);
    if (Object.keys(rangeErrors(next)).length === 0) {
      setParams(
        (prev) => {
          const out = new URLSearchParams(prev);
          out.set('from', next.from);
          out.set('to', next.to);
          return out;
        },
        { replace: true },
      );
    }
  };

  return (
    <>
      <PageHeader
        title="Exports"
        description="Files for your own books: paid invoices, invoice lines, payments, the general journal and the trial balance as CSV, and the invoices themselves as PDFs or UBL e-invoices. Pick the dates, then download what you need."
      />

      <form className="mb-6 rounded-lg border border-canvas-200 bg-white p-4 shadow-sm sm:p-6" onSubmit={(e) => e.preventDefault()} aria-label="Export dates">
        <ExportRangeFields value={range} onChange={change} errors={showErrors ? errors : {}} today={today} timeZoneLabel={timeZone} />
        {showErrors && !valid ? (
          <Alert tone="danger" className="mt-4">
            Fix the dates above, then download.
          </Alert>
        ) : null}
      </form>

      <ClosedBooksPanel timeZone={timeZone} />

      <div className="grid gap-4 lg:grid-cols-2">
        {EXPORT_KINDS.map((kind) => (
          <ExportCard key={kind} kind={kind} range={valid ? range : null} onInvalidRange={() => setShowErrors(true)} />
        ))}
      </div>

      <section aria-labelledby="export-history" className="mt-10">
        <div className="mb-3 flex items-center gap-3">
          <h2 id="export-history" className="text-xl font-semibold text-canvas-900">
            History
          </h2>
          {history.isFetching && !history.isPending ? <Spinner label="Updating…" /> : null}
        </div>
        {history.isPending ? (
          <Spinner label="Loading the history…" />
        ) : history.isError ? (
          <Alert tone="danger" title="The history could not be loaded.">
            {errorMessage(history.error)}
          </Alert>
        ) : history.data.data.length === 0 ? (
          <EmptyState title="Nothing exported yet.">Each download is listed here: who ran it, for which dates, and how it ended.</EmptyState>
        ) : (
          <>
            <ExportHistoryTable runs={history.data.data} timeZone={timeZone} />
            <Pagination
              label="History pages"
              page={page}
              pageSize={PAGE_SIZE}
              total={history.data.total}
              onPageChange={(next) =>
                setParams(
                  (prev) => {
                    const out = new URLSearchParams(prev);
                    if (next > 1) out.set('page', String(next));
                    else out.delete('page');
                    return out;
                  },
                  { replace: true },
                )
              }
            />
          </>
        )}
      </section>
    </>
  );
}
