import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router';
import { daySheetQueryOptions } from '@/features/field/api/get-day-sheet';
import { requireArea } from '../../../guards';
import { DayPage } from './day-page';

export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'field');
  void queryClient.prefetchQuery(daySheetQueryOptions('today'));
  return null;
};

/** The crew's home on a phone: today's stops, theirs first. */
export default function TodayRoute() {
  return <DayPage date="today" />;
}
