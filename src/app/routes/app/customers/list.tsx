import type { QueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { Link, useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { buttonClasses } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { Pagination } from '@/components/ui/pagination';
import { PageSpinner, Spinner } from '@/components/ui/spinner';
import { TextField } from '@/components/ui/text-field';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { useDebounced } from '@/lib/use-debounced';
import { customersQueryOptions, useCustomers } from '@/features/customers/api/get-customers';
import { CustomersTable } from '@/features/customers/components/customers-table';
import { requireArea } from '../../../guards';

const PAGE_SIZE = 50;

function filterFrom(params: URLSearchParams) {
  const page = Number(params.get('page') ?? '1');
  return { q: params.get('q')?.trim() || undefined, page: Number.isInteger(page) && page > 0 ? page : 1, pageSize: PAGE_SIZE };
}

export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'customers');
  void queryClient.prefetchQuery(customersQueryOptions(filterFrom(new URL(request.url).searchParams)));
  return null;
};

export default function CustomersRoute() {
  const [params, setParams] = useSearchParams();
  const filter = filterFrom(params);
  const customers = useCustomers(filter);
  const [search, setSearch] = useState(filter.q ?? '');
  const settled = useDebounced(search.trim(), 300);

  useEffect(() => {
    if ((settled || undefined) !== filter.q) setParams(settled ? { q: settled } : {}, { replace: true });
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [settled]);

  const rows = customers.data?.data ?? [];
  return (
    <>
      <PageHeader
        title="Customers"
        description="The people and organizations you rent to."
        actions={
          <Link className={buttonClasses('primary')} to={paths.app.customerNew.getHref()}>
            New customer
          </Link>
        }
      />
      <form role="search" aria-label="Search customers" className="mb-4 max-w-xl" onSubmit={(e) => e.preventDefault()}>
        <TextField label="Search" type="search" placeholder="Name, e-mail or phone" value={search} onChange={(e) => setSearch(e.target.value)} />
      </form>
      <div className="mb-2 flex min-h-6 items-center gap-3 text-sm text-canvas-700" aria-live="polite">
        {customers.data ? `${customers.data.total} ${customers.data.total === 1 ? 'customer' : 'customers'}` : null}
        {customers.isFetching && !customers.isPending ? <Spinner label="Updating…" /> : null}
      </div>
      {customers.isPending ? (
        <PageSpinner label="Loading customers…" />
      ) : customers.isError ? (
        <Alert tone="danger" title="The customers could not be loaded.">
          {errorMessage(customers.error)}
        </Alert>
      ) : rows.length === 0 ? (
        <EmptyState title={filter.q ? 'No customers match.' : 'No customers yet.'}>{filter.q ? 'Try part of a name, an e-mail or a phone number.' : 'Add one, or add them as you take bookings.'}</EmptyState>
      ) : (
        <>
          <CustomersTable customers={rows} />
          <Pagination
            label="Customers pages"
            page={filter.page}
            pageSize={PAGE_SIZE}
            total={customers.data.total}
            onPageChange={(page) => setParams({ ...(filter.q ? { q: filter.q } : {}), ...(page > 1 ? { page: String(page) } : {}) })}
          />
        </>
      )}
    </>
  );
}
