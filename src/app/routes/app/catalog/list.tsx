import type { QueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { Link, useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { ItemListQuery } from '@shared/schemas/items';
import { Alert } from '@/components/ui/alert';
import { Button, buttonClasses } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { Pagination } from '@/components/ui/pagination';
import { Select } from '@/components/ui/select';
import { PageSpinner, Spinner } from '@/components/ui/spinner';
import { TextField } from '@/components/ui/text-field';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { useDebounced } from '@/lib/use-debounced';
import { useMe } from '@/features/auth/api/get-me';
import { itemsQueryOptions, useItems, type ItemsFilter } from '@/features/catalog/api/get-items';
import { ImportItemsDialog } from '@/features/catalog/components/import-items-dialog';
import { kindOptions } from '@/features/catalog/components/item-kinds';
import { ItemsTable } from '@/features/catalog/components/items-table';
import { useOrganization } from '@/features/organization/api/get-organization';
import { requireArea } from '../../../guards';

const PAGE_SIZE = 50;

/** The list's filter from the address, so a filtered view can be bookmarked and shared. */
function filterFrom(params: URLSearchParams): ItemsFilter & { page: number; pageSize: number } {
  const parsed = ItemListQuery.safeParse(Object.fromEntries(params));
  const q = parsed.success ? parsed.data : ItemListQuery.parse({});
  return { q: q.q || undefined, kind: q.kind, active: q.active, sort: q.sort, dir: q.dir, page: q.page, pageSize: PAGE_SIZE };
}

export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'catalog');
  void queryClient.prefetchQuery(itemsQueryOptions(filterFrom(new URL(request.url).searchParams)));
  return null;
};

const activeOptions = [
  { value: 'true', label: 'Active items' },
  { value: 'false', label: 'Inactive items' },
  { value: 'all', label: 'All items' },
];

export default function CatalogRoute() {
  const [params, setParams] = useSearchParams();
  const filter = filterFrom(params);
  const items = useItems(filter);
  const { data: me } = useMe();
  const organization = useOrganization();
  const isOwner = Boolean(me?.areas.includes('settings'));
  const [importing, setImporting] = useState(false);
  const [search, setSearch] = useState(filter.q ?? '');
  const settledSearch = useDebounced(search, 300);

  const change = (next: Record<string, string | undefined>) => {
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
    if ((settledSearch.trim() || undefined) !== filter.q) change({ q: settledSearch.trim() || undefined });
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [settledSearch]);

  const rows = items.data?.data ?? [];
  // The server sends what this user may see; crew get no prices.
  const showPrices = rows.length > 0 ? rows.every((r) => r.can.seePrices) : me?.user.role !== 'crew';

  return (
    <>
      <PageHeader
        title="Catalog"
        description="Your tents, sidewalls, tables, chairs, lighting, accessories and services, with what you own and charge."
        actions={
          isOwner ? (
            <>
              <Button variant="secondary" onClick={() => setImporting(true)}>
                Import CSV
              </Button>
              <Link className={buttonClasses('primary')} to={paths.app.catalogNew.getHref()}>
                New item
              </Link>
            </>
          ) : null
        }
      />

      <form role="search" aria-label="Filter the catalog" className="mb-4 grid gap-4 sm:grid-cols-[2fr_1fr_1fr]" onSubmit={(e) => e.preventDefault()}>
        <TextField label="Search" type="search" placeholder="Name, SKU or description" value={search} onChange={(e) => setSearch(e.target.value)} />
        <Select label="Kind" options={kindOptions} placeholder="All kinds" value={filter.kind ?? ''} onChange={(e) => change({ kind: e.target.value || undefined })} />
        <Select label="Show" options={activeOptions} value={filter.active ?? 'true'} onChange={(e) => change({ active: e.target.value === 'true' ? undefined : e.target.value })} />
      </form>

      <div className="mb-2 flex min-h-6 items-center gap-3 text-sm text-canvas-700" aria-live="polite">
        {items.data ? `${items.data.total} ${items.data.total === 1 ? 'item' : 'items'}` : null}
        {items.isFetching && !items.isPending ? <Spinner label="Updating…" /> : null}
      </div>

      {items.isPending ? (
        <PageSpinner label="Loading the catalog…" />
      ) : items.isError ? (
        <Alert tone="danger" title="The catalog could not be loaded.">
          {errorMessage(items.error)}
        </Alert>
      ) : rows.length === 0 ? (
        <EmptyState
          title={filter.q || filter.kind || filter.active !== 'true' ? 'No items match.' : 'The catalog is empty.'}
          action={
            isOwner && !filter.q && !filter.kind ? (
              <Link className={buttonClasses('primary')} to={paths.app.catalogNew.getHref()}>
                Add the first item
              </Link>
            ) : null
          }
        >
          {filter.q || filter.kind ? 'Try another search or kind.' : isOwner ? 'Add items one by one, or import your price list from a CSV file.' : null}
        </EmptyState>
      ) : (
        <>
          <ItemsTable
            items={rows}
            currency={organization.data?.currency ?? 'USD'}
            showPrices={showPrices}
            sort={filter.sort ?? 'name'}
            dir={filter.dir ?? 'asc'}
            onSort={(sort) => change({ sort, dir: filter.sort === sort && filter.dir === 'asc' ? 'desc' : 'asc' })}
          />
          <Pagination
            label="Catalog pages"
            page={filter.page}
            pageSize={PAGE_SIZE}
            total={items.data.total}
            onPageChange={(page) => change({ page: page > 1 ? String(page) : undefined })}
          />
        </>
      )}

      {isOwner ? <ImportItemsDialog open={importing} onClose={() => setImporting(false)} /> : null}
    </>
  );
}
