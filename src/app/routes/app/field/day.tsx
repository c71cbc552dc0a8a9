import type { QueryClient } from '@tanstack/react-query';
import { data, useParams, type LoaderFunctionArgs } from 'react-router';
import { daySheetQueryOptions } from '@/features/field/api/get-day-sheet';
import { requireArea } from '../../../guards';
import { DayPage } from './day-page';

const DATE = /^\d{4}-\d{2}-\d{2}$/;

export const clientLoader = (queryClient: QueryClient) => async ({ request, params }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'field');
  if (!DATE.test(params.date ?? '')) throw data('Not a date', { status: 404 });
  void queryClient.prefetchQuery(daySheetQueryOptions(params.date!));
  return null;
};

export default function DayRoute() {
  const { date = '' } = useParams();
  return <DayPage date={date} />;
}
