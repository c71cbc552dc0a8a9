import type { QueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { INVOICE_STATUSES, INVOICE_STATUS_LABELS } from '@shared/schemas/invoices';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Chip } from '@/components/ui/chip';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { Pagination } from '@/components/ui/pagination';
import { PageSpinner, Spinner } from '@/components/ui/spinner';
import { TextField } from '@/components/ui/text-field';
import { errorMessage } from '@/lib/api';
import { useDebounced } from '@/lib/use-debounced';
import { useMe } from '@/features/auth/api/get-me';
import { useInvoices, type InvoiceStatusFilter, type InvoicesFilter } from '@/features/invoices/api/get-invoices';
import { InvoicesTable } from '@/features/invoices/components/invoices-table';
import { useOrganization } from '@/features/organization/api/get-organization';
import { requireArea } from '../../../guards';

const PAGE_SIZE = 50;

/** The chips, in the order an invoice lives; Overdue cuts across open and partly paid. */
const STATUS_CHIPS: readonly { value: InvoiceStatusFilter; label: string }[] = [
  ...INVOICE_STATUSES.map((value) => ({ value, label: INVOICE_STATUS_LABELS[value] })),
  { value: 'overdue', label: 'Overdue' },
];
const CHIP_VALUES = STATUS_CHIPS.map((c) => c.value as string);

interface ListParams {
  status: InvoiceStatusFilter[];
  q: string;
  page: number;
}

function paramsFrom(params: URLSearchParams): ListParams {
  const status = (params.get('status') ?? '').split(',').filter((s): s is InvoiceStatusFilter => CHIP_VALUES.includes(s));
  const page = Number(params.get('page') ?? '1');
  return { status, q: params.get('q') ?? '', page: Number.isInteger(page) && page > 0 ? page : 1 };
}

const toFilter = (p: ListParams): InvoicesFilter => ({
  status: p.status.length ? p.status : undefined,
  q: p.q.trim() || undefined,
  page: p.page,
  pageSize: PAGE_SIZE,
});

export const clientLoader = (queryClient: QueryClient) => ({ request }: LoaderFunctionArgs) => requireArea(queryClient, request, 'invoices').then(() => null);

export default function InvoicesRoute() {
  const [params, setParams] = useSearchParams();
  const p = paramsFrom(params);
  const invoices = useInvoices(toFilter(p));
  const organization = useOrganization();
  const timeZone = organization.data?.timeZone ?? 'UTC';
  const { data: me } = useMe();
  const [search, setSearch] = useState(p.q);
  const settled = useDebounced(search.trim(), 300);

  const change = (next: Partial<Record<'status' | 'q' | 'page', string>>) => {
    setParams(
      (prev) => {
        const out = new URLSearchParams(prev);
        for (const [key, value] of Object.entries(next)) (value ? out.set(key, value) : out.delete(key));
        if (!('page' in next)) out.delete('page');
        return out;
      },
      { replace: true },
    );
  };

  useEffect(() => {
    if (settled !== p.q.trim()) change({ q: settled });
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [settled]);

  const toggle = (s: InvoiceStatusFilter) => {
    const next = p.status.includes(s) ? p.status.filter((x) => x !== s) : [...p.status, s];
    change({ status: STATUS_CHIPS.map((c) => c.value).filter((x) => next.includes(x)).join(',') });
  };

  const rows = invoices.data?.data ?? [];
  const filtered = p.status.length > 0 || p.q;

  return (
    <>
      <PageHeader title="Invoices" description="Every booking’s invoices (deposit, balance and additional charges) and credit notes: what was paid or credited on them and what is still owed." />

      <form role="search" aria-label="Filter invoices" className="mb-4 space-y-4" onSubmit={(e) => e.preventDefault()}>
        <fieldset>
          <legend className="mb-2 text-sm font-semibold text-canvas-800">Status</legend>
          <div className="flex flex-wrap gap-2">
            {STATUS_CHIPS.map((c) => (
              <Chip key={c.value} pressed={p.status.includes(c.value)} onClick={() => toggle(c.value)}>
                {c.label}
              </Chip>
            ))}
          </div>
        </fieldset>
        <div className="grid gap-4 sm:grid-cols-[minmax(0,28rem)_auto] sm:items-end">
          <TextField label="Search" type="search" placeholder="Number, customer or booking" value={search} onChange={(e) => setSearch(e.target.value)} />
          {filtered ? (
            <Button
              variant="ghost"
              className="justify-self-start"
              onClick={() => {
                setSearch('');
                setParams({}, { replace: true });
              }}
            >
              Clear filters
            </Button>
          ) : null}
        </div>
      </form>

      <div className="mb-2 flex min-h-6 items-center gap-3 text-sm text-canvas-700" aria-live="polite">
        {invoices.data ? `${invoices.data.total} ${invoices.data.total === 1 ? 'invoice' : 'invoices'}` : null}
        {invoices.isFetching && !invoices.isPending ? <Spinner label="Updating…" /> : null}
      </div>

      {invoices.isPending ? (
        <PageSpinner label="Loading invoices…" />
      ) : invoices.isError ? (
        <Alert tone="danger" title="The invoices could not be loaded.">
          {errorMessage(invoices.error)}
        </Alert>
      ) : rows.length === 0 ? (
        <EmptyState title={filtered ? 'No invoices match.' : 'No invoices yet.'}>
          {filtered ? 'Try other statuses or another search.' : 'Invoices are made from a booking’s quote, in its Money panel.'}
        </EmptyState>
      ) : (
        <>
          <InvoicesTable invoices={rows} timeZone={timeZone} linkBookings={Boolean(me?.areas.includes('bookings'))} />
          <Pagination label="Invoices pages" page={p.page} pageSize={PAGE_SIZE} total={invoices.data.total} onPageChange={(page) => change({ page: page > 1 ? String(page) : '' })} />
        </>
      )}
    </>
  );
}
