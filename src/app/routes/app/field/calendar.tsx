import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router';
import { SectionCard } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { calendarFeedQueryOptions } from '@/features/field/api/calendar-feed';
import { CalendarFeedPanel } from '@/features/field/components/calendar-feed-panel';
import { requireArea } from '../../../guards';

export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'field');
  void queryClient.prefetchQuery(calendarFeedQueryOptions());
  return null;
};

export default function CalendarRoute() {
  return (
    <>
      <p className="mb-2 text-sm">
        <TextLink to={paths.app.field.getHref()}>Back to today</TextLink>
      </p>
      <PageHeader title="My calendar feed" description="Your deliveries and pickups in your own calendar app." />
      <SectionCard title="Calendar address">
        <CalendarFeedPanel />
      </SectionCard>
    </>
  );
}
