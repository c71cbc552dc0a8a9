import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useCallback } from 'react';
import { useParams, type LoaderFunctionArgs } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { SectionCard } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner } from '@/components/ui/spinner';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage, isApiError } from '@/lib/api';
import { formatZoned } from '@/lib/zoned-time';
import { bookingHistoryQueryOptions } from '@/features/bookings/api/get-booking-history';
import { bookingQueryOptions, useBooking } from '@/features/bookings/api/get-booking';
import { BookingEditor } from '@/features/bookings/components/editor/booking-editor';
import { StatusBadge } from '@/features/bookings/components/status';
import { bookingDocumentsQueryOptions } from '@/features/documents/api/get-booking-documents';
import { DocumentsPanel } from '@/features/documents/components/documents-panel';
import { useMe } from '@/features/auth/api/get-me';
import { BookingFieldSection } from '@/features/field/components/booking-field-section';
import { MoneyPanel } from '@/features/invoices/components/money-panel';
import { useEditorData } from './editor-data';
import { requireArea } from '../../../guards';

export const clientLoader = (queryClient: QueryClient) => async ({ request, params }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'bookings');
  const id = params.id ?? '';
  // The documents only for those the booking says may read them, so the crew is not sent a 403.
  void queryClient
    .ensureQueryData(bookingQueryOptions(id))
    .then((booking) => (booking.can.readDocuments ? queryClient.prefetchQuery(bookingDocumentsQueryOptions(id)) : undefined))
    .catch(() => undefined);
  return null;
};

export default function BookingRoute() {
  const { id = '' } = useParams();
  const booking = useBooking(id);
  const data = useEditorData();
  const me = useMe().data;
  const isOwner = me?.user.role === 'owner';
  const queryClient = useQueryClient();
  // Issuing and sending show on the booking's history.
  const refreshHistory = useCallback(() => void queryClient.invalidateQueries({ queryKey: bookingHistoryQueryOptions(id).queryKey }), [queryClient, id]);

  if (booking.isPending) return <PageSpinner label="Loading the booking…" />;
  if (booking.isError) {
    if (isApiError(booking.error) && booking.error.status === 404) throw booking.error;
    return (
      <Alert tone="danger" title="The booking could not be loaded.">
        {errorMessage(booking.error)}
      </Alert>
    );
  }
  const b = booking.data;
  return (
    <>
      <p className="mb-2 text-sm">
        <TextLink to={paths.app.bookings.getHref()}>Back to bookings</TextLink>
      </p>
      <PageHeader
        title={`Booking ${b.reference}`}
        description={
          <span className="flex flex-wrap items-center gap-2">
            <StatusBadge status={b.status} />
            <span>
              {b.customer.name} · {formatZoned(b.eventStart, data.timeZone)}
            </span>
          </span>
        }
      />
      {data.error ? (
        <Alert tone="danger" title="The booking editor could not load.">
          {errorMessage(data.error)}
        </Alert>
      ) : !data.ready ? (
        <PageSpinner label="Loading…" />
      ) : (
        <BookingEditor
          booking={b}
          items={data.items}
          rules={data.rules}
          timeZone={data.timeZone}
          currency={data.currency}
          seePrices={b.can.seePrices}
          documents={
            b.can.readDocuments
              ? ({ dirty }) => (
                  <div className="space-y-6">
                    <SectionCard
                      title="Money"
                      description="Invoices made from the saved quote, payments received, and the ledger entries every balance is summed from."
                    >
                      <MoneyPanel
                        booking={{ id: b.id, reference: b.reference, customerEmail: b.customer.email, securityDepositCents: b.securityDepositCents }}
                        timeZone={data.timeZone}
                        currency={b.currency}
                        canBill={b.can.issueDocuments}
                        canGiveMoneyBack={isOwner}
                        dirty={dirty}
                        onChanged={refreshHistory}
                      />
                    </SectionCard>
                    <SectionCard
                      title="Documents"
                      description="Rental agreements, invoices, receipts and credit notes made from the saved booking, with the e-mails that carried them."
                    >
                      <DocumentsPanel
                        booking={{ id: b.id, reference: b.reference, customerEmail: b.customer.email }}
                        timeZone={data.timeZone}
                        canIssue={b.can.issueDocuments}
                        dirty={dirty}
                        onChanged={refreshHistory}
                      />
                    </SectionCard>
                  </div>
                )
              : undefined
          }
        />
      )}
      {me?.areas.includes('field') ? <BookingFieldSection booking={b} /> : null}
    </>
  );
}
