import { useState } from 'react';
import { BOOKING_STATUS_LABELS, type BookingRow, type BookingStatus, type ShortfallDetail } from '@shared/schemas/bookings';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { TextArea } from '@/components/ui/textarea';
import { errorMessage } from '@/lib/api';
import { shortfallsOf, useChangeBookingStatus } from '../../api/change-booking-status';

/** The button for moving to each status. */
export const ACTION_LABELS: Record<BookingStatus, string> = {
  draft: 'Back to draft',
  quoted: 'Mark as quoted',
  reserved: 'Reserve stock',
  out: 'Mark as out',
  returned: 'Mark as returned',
  closed: 'Close the booking',
  cancelled: 'Cancel the booking',
};

interface StatusActionsProps {
  booking: BookingRow;
  /** Unsaved edits: the status works on what is saved, so save first. */
  dirty: boolean;
  onShortfall: (shortfalls: ShortfallDetail[]) => void;
}

export function StatusActions({ booking, dirty, onShortfall }: StatusActionsProps) {
  const change = useChangeBookingStatus();
  const [cancelling, setCancelling] = useState(false);
  const [reason, setReason] = useState('');
  const [message, setMessage] = useState<string | null>(null);
  const targets = booking.can.changeStatus;

  const run = (status: BookingStatus, note = '') => {
    setMessage(null);
    change.mutate(
      { id: booking.id, status, note },
      {
        onSuccess: (next) => {
          setCancelling(false);
          setReason('');
          setMessage(`Status changed to ${BOOKING_STATUS_LABELS[next.status]}.`);
        },
        onError: (error) => {
          const shortfalls = shortfallsOf(error);
          if (shortfalls) onShortfall(shortfalls);
        },
      },
    );
  };

  if (targets.length === 0) return <p className="text-sm text-canvas-700">No status change is open to you from {BOOKING_STATUS_LABELS[booking.status].toLowerCase()}.</p>;
  const pendingTo = change.isPending ? change.variables?.status : null;
  const failed = change.isError && !shortfallsOf(change.error) && !cancelling ? errorMessage(change.error) : null;

  return (
    <div className="space-y-3">
      {dirty ? <Alert tone="warning">Save your changes before changing the status.</Alert> : null}
      <div className="flex flex-wrap gap-2">
        {targets.map((status) => (
          <Button
            key={status}
            size="sm"
            variant={status === 'cancelled' ? 'danger' : status === 'reserved' || status === 'out' || status === 'returned' || status === 'closed' ? 'primary' : 'secondary'}
            disabled={dirty || change.isPending}
            isLoading={pendingTo === status}
            onClick={() => {
              if (status === 'cancelled') {
                change.reset();
                setCancelling(true);
              } else run(status);
            }}
          >
            {ACTION_LABELS[status]}
          </Button>
        ))}
      </div>
      <div aria-live="polite">
        {message ? <Alert tone="success">{message}</Alert> : null}
        {failed ? <Alert tone="danger">{failed}</Alert> : null}
      </div>
      <Dialog
        open={cancelling}
        title={`Cancel booking ${booking.reference}?`}
        busy={change.isPending}
        onClose={() => setCancelling(false)}
        footer={
          <>
            <Button variant="secondary" onClick={() => setCancelling(false)} disabled={change.isPending}>
              Keep the booking
            </Button>
            <Button variant="danger" isLoading={change.isPending} onClick={() => run('cancelled', reason)}>
              Cancel the booking
            </Button>
          </>
        }
      >
        <p className="mb-3 text-sm">Any stock it holds is released. The reason is kept in the booking’s history.</p>
        <TextArea label="Reason for cancelling" value={reason} maxLength={500} onChange={(e) => setReason(e.target.value)} />
        {change.isError ? (
          <p role="alert" className="mt-2 text-sm font-semibold text-rust-700">
            {errorMessage(change.error)}
          </p>
        ) : null}
      </Dialog>
    </div>
  );
}

interface ShortfallDialogProps {
  shortfalls: ShortfallDetail[] | null;
  onClose: () => void;
  onReduce: (s: ShortfallDetail) => void;
  onSubstitute: (s: ShortfallDetail) => void;
  onSubRent: (s: ShortfallDetail) => void;
}

/** Stock is short for reserving: name each item and offer the choices a person has. */
export function ShortfallDialog({ shortfalls, onClose, onReduce, onSubstitute, onSubRent }: ShortfallDialogProps) {
  return (
    <Dialog
      open={shortfalls !== null}
      wide
      title="Not enough stock to reserve"
      onClose={onClose}
      footer={
        <Button variant="secondary" onClick={onClose}>
          Close
        </Button>
      }
    >
      <p className="text-sm">
        Nothing was reserved. For each item below, reduce the quantity, pick a substitute item, or sub-rent the rest from another company.
        Then save the booking and reserve again.
      </p>
      <ul className="mt-4 space-y-4">
        {(shortfalls ?? []).map((s) => (
          <li key={s.itemId} className="rounded-md border border-rust-200 bg-rust-50 p-3">
            <p className="font-semibold text-rust-800">
              {s.name}: {s.requested} asked, {s.available} free, short by {s.shortfall}
            </p>
            <div className="mt-2 flex flex-wrap gap-2">
              <Button size="sm" variant="secondary" disabled={s.available <= 0} onClick={() => onReduce(s)}>
                Reduce {s.name} to {s.available}
              </Button>
              <Button size="sm" variant="secondary" onClick={() => onSubstitute(s)}>
                Pick a substitute for {s.name}
              </Button>
              <Button size="sm" variant="secondary" onClick={() => onSubRent(s)}>
                Sub-rent {s.shortfall} {s.name}
              </Button>
            </div>
          </li>
        ))}
      </ul>
    </Dialog>
  );
}
