import type { ReactNode } from 'react';
import { useParams } from 'react-router';
import type { FieldBooking } from '@shared/schemas/field';
import { Alert } from '@/components/ui/alert';
import { PageSpinner } from '@/components/ui/spinner';
import { errorMessage, isApiError } from '@/lib/api';
import { useFieldBooking } from '@/features/field/api/get-field-booking';

/** Loads the booking's field page for the route and hands it to `children`. */
export function WithFieldBooking({ children }: { children: (booking: FieldBooking) => ReactNode }) {
  const { id = '' } = useParams();
  const booking = useFieldBooking(id);
  if (booking.isPending) return <PageSpinner label="Loading the stop…" />;
  if (booking.isError) {
    if (isApiError(booking.error) && booking.error.status === 404) throw booking.error;
    return (
      <Alert tone="danger" title="The stop could not be loaded.">
        {errorMessage(booking.error)}
      </Alert>
    );
  }
  return <>{children(booking.data)}</>;
}
