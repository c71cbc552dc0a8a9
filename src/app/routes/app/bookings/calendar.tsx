import type { QueryClient } from '@tanstack/react-query';
import { Link, useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { Button, buttonClasses } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner, Spinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { monthLabel, monthRange, shiftMonth, zonedMonth } from '@/lib/zoned-time';
import { useBookings } from '@/features/bookings/api/get-bookings';
import { BookingsCalendar, StatusLegend } from '@/features/bookings/components/bookings-calendar';
import { useOrganization } from '@/features/organization/api/get-organization';
import { requireArea } from '../../../guards';

export const clientLoader = (queryClient: QueryClient) => ({ request }: LoaderFunctionArgs) => requireArea(queryClient, request, 'bookings').then(() => null);

export default function BookingsCalendarRoute() {
  const [params, setParams] = useSearchParams();
  const organization = useOrganization();
  const timeZone = organization.data?.timeZone ?? 'UTC';
  const asked = params.get('month') ?? '';
  const month = /^\d{4}-\d{2}$/.test(asked) ? asked : zonedMonth(Date.now(), timeZone);
  const range = monthRange(month, timeZone);
  const bookings = useBookings({ from: range.from, to: range.to, pageSize: 500 });

  return (
    <>
      <PageHeader
        title="Booking calendar"
        description="Bookings on the days of their events."
        actions={
          <Link className={buttonClasses('secondary')} to={paths.app.bookings.getHref()}>
            List
          </Link>
        }
      />
      <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
        <h2 className="text-lg font-semibold text-canvas-900" aria-live="polite">
          {monthLabel(month)}
          {bookings.isFetching && !bookings.isPending ? <Spinner className="ml-2 text-sm font-normal text-canvas-600" label="Loading…" /> : null}
        </h2>
        <div className="flex gap-2">
          <Button size="sm" variant="secondary" onClick={() => setParams({ month: shiftMonth(month, -1) }, { replace: true })}>
            Previous month
          </Button>
          <Button size="sm" variant="secondary" onClick={() => setParams({}, { replace: true })}>
            This month
          </Button>
          <Button size="sm" variant="secondary" onClick={() => setParams({ month: shiftMonth(month, 1) }, { replace: true })}>
            Next month
          </Button>
        </div>
      </div>
      <div className="mb-3">
        <StatusLegend />
      </div>
      {bookings.isPending ? (
        <PageSpinner label="Loading bookings…" />
      ) : bookings.isError ? (
        <Alert tone="danger" title="The bookings could not be loaded.">
          {errorMessage(bookings.error)}
        </Alert>
      ) : (
        <>
          {bookings.data.total > bookings.data.data.length ? (
            <Alert tone="warning" className="mb-3">
              Showing the first {bookings.data.data.length} of {bookings.data.total} bookings this month.
            </Alert>
          ) : null}
          <BookingsCalendar bookings={bookings.data.data} month={month} timeZone={timeZone} />
        </>
      )}
    </>
  );
}
