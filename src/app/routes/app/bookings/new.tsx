import type { QueryClient } from '@tanstack/react-query';
import { useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner } from '@/components/ui/spinner';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { useMe } from '@/features/auth/api/get-me';
import { BookingEditor } from '@/features/bookings/components/editor/booking-editor';
import { useEditorData } from './editor-data';
import { requireArea } from '../../../guards';

export const clientLoader = (queryClient: QueryClient) => ({ request }: LoaderFunctionArgs) => requireArea(queryClient, request, 'bookings').then(() => null);

export default function NewBookingRoute() {
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const { data: me } = useMe();
  const data = useEditorData();

  return (
    <>
      <p className="mb-2 text-sm">
        <TextLink to={paths.app.bookings.getHref()}>Back to bookings</TextLink>
      </p>
      <PageHeader title="New booking" description="Take the enquiry: who, when, where, how many guests, and what they need." />
      {data.error ? (
        <Alert tone="danger" title="The booking editor could not load.">
          {errorMessage(data.error)}
        </Alert>
      ) : !data.ready ? (
        <PageSpinner label="Loading…" />
      ) : (
        <BookingEditor
          booking={null}
          items={data.items}
          rules={data.rules}
          timeZone={data.timeZone}
          currency={data.currency}
          seePrices={me?.user.role !== 'crew'}
          initialCustomerId={params.get('customerId') ?? undefined}
          onCreated={(b) => navigate(paths.app.booking.getHref(b.id), { replace: true })}
        />
      )}
    </>
  );
}
