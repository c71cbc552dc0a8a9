import type { QueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { Link, useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { BOOKING_STATUSES, BOOKING_STATUS_LABELS, type BookingStatus } from '@shared/schemas/bookings';
import { Alert } from '@/components/ui/alert';
import { Button, buttonClasses } from '@/components/ui/button';
import { Chip } from '@/components/ui/chip';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { Pagination } from '@/components/ui/pagination';
import { PageSpinner, Spinner } from '@/components/ui/spinner';
import { TextField } from '@/components/ui/text-field';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { useDebounced } from '@/lib/use-debounced';
import { addCalendarDays, zonedInputToIso } from '@/lib/zoned-time';
import { useMe } from '@/features/auth/api/get-me';
import { useBookings, type BookingsFilter } from '@/features/bookings/api/get-bookings';
import { BookingsTable } from '@/features/bookings/components/bookings-table';
import { useOrganization } from '@/features/organization/api/get-organization';
import { requireArea } from '../../../guards';

const PAGE_SIZE = 50;
const DATE = /^\d{4}-\d{2}-\d{2}$/;

interface ListParams {
  status: BookingStatus[];
  fromDate: string;
  toDate: string;
  q: string;
  page: number;
}

function paramsFrom(params: URLSearchParams): ListParams {
  const status = (params.get('status') ?? '').split(',').filter((s): s is BookingStatus => (BOOKING_STATUSES as readonly string[]).includes(s));
  const page = Number(params.get('page') ?? '1');
  const from = params.get('from') ?? '';
  const to = params.get('to') ?? '';
  return { status, fromDate: DATE.test(from) ? from : '', toDate: DATE.test(to) ? to : '', q: params.get('q') ?? '', page: Number.isInteger(page) && page > 0 ? page : 1 };
}

/** Dates on the company's calendar to the instants the API takes: from the first day's start to the last day's end. */
function toFilter(p: ListParams, timeZone: string): BookingsFilter {
  return {
    status: p.status.length ? p.status : undefined,
    from: p.fromDate ? (zonedInputToIso(`${p.fromDate}T00:00`, timeZone) ?? undefined) : undefined,
    to: p.toDate ? (zonedInputToIso(`${addCalendarDays(p.toDate, 1)}T00:00`, timeZone) ?? undefined) : undefined,
    q: p.q.trim() || undefined,
    page: p.page,
    pageSize: PAGE_SIZE,
  };
}

export const clientLoader = (queryClient: QueryClient) => ({ request }: LoaderFunctionArgs) => requireArea(queryClient, request, 'bookings').then(() => null);

export default function BookingsRoute() {
  const [params, setParams] = useSearchParams();
  const p = paramsFrom(params);
  const organization = useOrganization();
  const timeZone = organization.data?.timeZone ?? 'UTC';
  const bookings = useBookings(toFilter(p, timeZone));
  const { data: me } = useMe();
  const [search, setSearch] = useState(p.q);
  const settled = useDebounced(search.trim(), 300);

  const change = (next: Partial<Record<'status' | 'from' | 'to' | 'q' | 'page', string>>) => {
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

  const toggle = (s: BookingStatus) => {
    const next = p.status.includes(s) ? p.status.filter((x) => x !== s) : [...p.status, s];
    change({ status: BOOKING_STATUSES.filter((x) => next.includes(x)).join(',') });
  };

  const rows = bookings.data?.data ?? [];
  const canCreate = me?.user.role === 'owner' || me?.user.role === 'office';
  const filtered = p.status.length > 0 || p.fromDate || p.toDate || p.q;

  return (
    <>
      <PageHeader
        title="Bookings"
        description="Every enquiry, quote and rental, from first call to return."
        actions={
          <>
            <Link className={buttonClasses('secondary')} to={paths.app.bookingsCalendar.getHref()}>
              Calendar
            </Link>
            {canCreate ? (
              <Link className={buttonClasses('primary')} to={paths.app.bookingNew.getHref()}>
                New booking
              </Link>
            ) : null}
          </>
        }
      />

      <form role="search" aria-label="Filter bookings" className="mb-4 space-y-4" onSubmit={(e) => e.preventDefault()}>
        <fieldset>
          <legend className="mb-2 text-sm font-semibold text-canvas-800">Status</legend>
          <div className="flex flex-wrap gap-2">
            {BOOKING_STATUSES.map((s) => (
              <Chip key={s} pressed={p.status.includes(s)} onClick={() => toggle(s)}>
                {BOOKING_STATUS_LABELS[s]}
              </Chip>
            ))}
          </div>
        </fieldset>
        <div className="grid gap-4 sm:grid-cols-[2fr_1fr_1fr_auto] sm:items-end">
          <TextField label="Search" type="search" placeholder="Reference, customer or site" value={search} onChange={(e) => setSearch(e.target.value)} />
          <TextField label="Events from" type="date" value={p.fromDate} onChange={(e) => change({ from: e.target.value })} />
          <TextField label="Events to" type="date" value={p.toDate} min={p.fromDate || undefined} onChange={(e) => change({ to: e.target.value })} />
          {filtered ? (
            <Button
              variant="ghost"
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
        {bookings.data ? `${bookings.data.total} ${bookings.data.total === 1 ? 'booking' : 'bookings'}` : null}
        {bookings.isFetching && !bookings.isPending ? <Spinner label="Updating…" /> : null}
      </div>

      {bookings.isPending ? (
        <PageSpinner label="Loading bookings…" />
      ) : bookings.isError ? (
        <Alert tone="danger" title="The bookings could not be loaded.">
          {errorMessage(bookings.error)}
        </Alert>
      ) : rows.length === 0 ? (
        <EmptyState title={filtered ? 'No bookings match.' : 'No bookings yet.'}>{filtered ? 'Try other statuses or dates.' : canCreate ? 'Take the first enquiry with New booking.' : null}</EmptyState>
      ) : (
        <>
          <BookingsTable bookings={rows} timeZone={timeZone} />
          <Pagination label="Bookings pages" page={p.page} pageSize={PAGE_SIZE} total={bookings.data.total} onPageChange={(page) => change({ page: page > 1 ? String(page) : '' })} />
        </>
      )}
    </>
  );
}
