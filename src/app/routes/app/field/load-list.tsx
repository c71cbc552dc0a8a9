import type { QueryClient } from '@tanstack/react-query';
import { data, useParams, type LoaderFunctionArgs } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { buttonClasses } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner } from '@/components/ui/spinner';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { daySheetPdfUrl, daySheetQueryOptions, useDaySheet } from '@/features/field/api/get-day-sheet';
import { longDate } from '@/features/field/components/labels';
import { LoadListView } from '@/features/field/components/load-list-view';
import { requireArea } from '../../../guards';

export const clientLoader = (queryClient: QueryClient) => async ({ request, params }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'field');
  if (!/^\d{4}-\d{2}-\d{2}$/.test(params.date ?? '')) throw data('Not a date', { status: 404 });
  void queryClient.prefetchQuery(daySheetQueryOptions(params.date!));
  return null;
};

/** What to load on the truck for a day, and what comes back. */
export default function LoadListRoute() {
  const { date = '' } = useParams();
  const sheet = useDaySheet(date);
  if (sheet.isPending) return <PageSpinner label="Loading the load list…" />;
  if (sheet.isError) return <Alert tone="danger" title="The load list could not be loaded.">{errorMessage(sheet.error)}</Alert>;
  return (
    <>
      <p className="mb-2 text-sm print:hidden">
        <TextLink to={paths.app.fieldDay.getHref(date)}>Back to the day sheet</TextLink>
      </p>
      <PageHeader
        title={`Load list, ${longDate(date)}`}
        documentTitle={`Load list ${date}`}
        description="Totals of the day's deliveries (leaves the yard) and pickups (comes back). Poles, stakes and ballast come from each tent's set-up needs in the catalog."
        actions={
          <a className={buttonClasses('secondary', 'sm', 'print:hidden')} href={daySheetPdfUrl(date)} target="_blank" rel="noopener">
            Print (PDF)
          </a>
        }
      />
      <LoadListView loadList={sheet.data.loadList} />
    </>
  );
}
