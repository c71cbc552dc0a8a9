import { useMemo, useState } from 'react';
import { addDays, dateInZone } from '@shared/dates';
import { lockDateRequestOn, type LockDateRow } from '@shared/schemas/books';
import { Alert, FormMessage, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SectionCard } from '@/components/ui/card';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { Spinner } from '@/components/ui/spinner';
import { TextField } from '@/components/ui/text-field';
import { errorMessage } from '@/lib/api';
import { useZodForm } from '@/lib/form';
import { formatCalendarDate, formatZoned } from '@/lib/zoned-time';
import { useLockDate } from '../api/get-lock-date';
import { useSetLockDate } from '../api/set-lock-date';

const HEADING_ID = 'closed-books';

/** What the form asks to confirm: closing through a day, or (the owner) reopening to one or entirely. */
type Pending = { closedThrough: string | null; backward: boolean };

/** Last month's last day is the usual errand; never later than yesterday, never a day already closed. */
function suggestedDay(row: LockDateRow, today: string): string {
  const endOfLastMonth = addDays(`${today.slice(0, 8)}01`, -1);
  if (!row.closedThrough || endOfLastMonth > row.closedThrough) return endOfLastMonth;
  return row.latestClosable;
}

function ClosedBooksForm({ row, timeZone }: { row: LockDateRow; timeZone: string }) {
  const today = dateInZone(new Date(), timeZone);
  // The same schema the server checks with, with today's date on the company's calendar.
  const schema = useMemo(() => lockDateRequestOn(today), [today]);
  const form = useZodForm(schema, { closedThrough: suggestedDay(row, today) }, {
    toInput: (v) => ({ input: { closedThrough: v.closedThrough.trim() || undefined } }),
  });
  const save = useSetLockDate();
  const [pending, setPending] = useState<Pending | null>(null);
  const [done, setDone] = useState<string | null>(null);

  const ask = form.handleSubmit(({ closedThrough }) => {
    setDone(null);
    const current = row.closedThrough;
    if (closedThrough === current) {
      form.setErrors({ closedThrough: `The books are already closed through ${formatCalendarDate(current)}.` });
      return;
    }
    const backward = current !== null && (closedThrough === null || closedThrough < current);
    if (backward && !row.can.reopen) {
      form.setErrors({ closedThrough: `The books are closed through ${formatCalendarDate(current)}. Only the owner moves the date back; choose a later day or ask them.` });
      return;
    }
    setPending({ closedThrough, backward });
  });

  const confirm = () => {
    if (!pending) return;
    save.mutate(
      { closedThrough: pending.closedThrough },
      {
        onSuccess: (next) => {
          setPending(null);
          setDone(next.closedThrough ? `The books are closed through ${formatCalendarDate(next.closedThrough)}.` : 'Every period is open again.');
        },
        onError: (error) => {
          // The question is answered; the message goes by the field, whose date stays as typed.
          setPending(null);
          form.showError(error);
        },
      },
    );
  };

  const day = pending?.closedThrough ? formatCalendarDate(pending.closedThrough) : '';
  return (
    <>
      {row.closedThrough ? (
        <p className="text-canvas-800" data-testid="lock-date">
          Closed through <strong>{formatCalendarDate(row.closedThrough)}</strong>
          {row.closedAt ? (
            <span className="text-canvas-600">
              {' '}
              (set {row.closedBy ? `by ${row.closedBy} ` : ''}on {formatZoned(row.closedAt, timeZone)})
            </span>
          ) : null}
          .
        </p>
      ) : (
        <p className="text-canvas-800" data-testid="lock-date">
          No period is closed: payments, invoices and refunds can still be dated on any day.
        </p>
      )}
      {row.can.close ? (
        <form ref={form.formRef} onSubmit={ask} noValidate aria-label="Close the books" className="mt-4 space-y-3">
          <FormMessage message={form.formError} />
          <div className="flex flex-wrap items-end gap-3">
            <TextField
              label="Close the books through"
              type="date"
              required
              max={row.latestClosable}
              hint={`The latest day you can close is yesterday, ${formatCalendarDate(row.latestClosable)}.`}
              className="min-w-56"
              disabled={save.isPending}
              {...form.field('closedThrough')}
            />
            <Button type="submit" disabled={save.isPending}>
              Close the books…
            </Button>
            {row.can.reopen && row.closedThrough ? (
              <Button variant="secondary" disabled={save.isPending} onClick={() => {
                  setDone(null);
                  setPending({ closedThrough: null, backward: true });
                }}>
                Reopen every period…
              </Button>
            ) : null}
          </div>
        </form>
      ) : null}
      <LiveRegion>{done ? <Alert tone="success" className="mt-4">{done}</Alert> : null}</LiveRegion>
      <ConfirmDialog
        open={pending !== null}
        title={
          !pending?.backward ? `Close the books through ${day}?`
          : pending.closedThrough ? `Reopen the books after ${day}?`
          : 'Reopen every period?'
        }
        confirmLabel={!pending?.backward ? 'Close the books' : 'Reopen'}
        confirmVariant={pending?.backward ? 'danger' : 'primary'}
        isLoading={save.isPending}
        onConfirm={confirm}
        onCancel={() => setPending(null)}
      >
        {!pending?.backward ? (
          <p>
            Nothing can then be recorded on or before {day}: payments, invoices, refunds and deposits. Card payments and deposits earned that belong to a closed
            day are recorded on the day they come in. Only the owner can move the date back.
          </p>
        ) : (
          <p>Figures you have already handed over for those days could then change. Close the books again once the correction is made.</p>
        )}
      </ConfirmDialog>
    </>
  );
}

/**
 * The bookkeeper's closing: the day the books are closed through (the lock date), and a form to
 * close them through a later day with a confirm. The server says what the viewer may do (`can`).
 */
export function ClosedBooksPanel({ timeZone }: { timeZone: string }) {
  const lock = useLockDate();
  return (
    <section aria-labelledby={HEADING_ID} className="mb-6">
      <SectionCard
        title={<span id={HEADING_ID}>Closed books</span>}
        description="Once a month’s figures are handed over, close the books through its last day so nothing more is recorded on those days and your exports stay true. Corrections go into the open days."
      >
        {lock.isPending ? (
          <Spinner label="Loading the closing date…" />
        ) : lock.isError ? (
          <Alert tone="danger" title="The closing date could not be loaded.">
            {errorMessage(lock.error)}
          </Alert>
        ) : (
          <ClosedBooksForm row={lock.data} timeZone={timeZone} />
        )}
      </SectionCard>
    </section>
  );
}
