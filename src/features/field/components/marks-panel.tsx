import { Link } from 'react-router';
import type { FieldBooking } from '@shared/schemas/field';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { formatZoned } from '@/lib/zoned-time';
import { useMarkStop } from '../api/mark-stop';

/** Delivered, then set up: each a mark with who and when. Set-up waits for the site checklist when there is a tent. */
export function MarksPanel({ booking }: { booking: FieldBooking }) {
  const bookingId = booking.delivery.bookingId;
  const mark = useMarkStop(bookingId);
  const p = booking.delivery.progress;
  const hasTent = booking.delivery.items.some((i) => i.kind === 'tent');
  const when = (iso: string | null) => formatZoned(iso, booking.timeZone);
  return (
    <div className="space-y-3">
      <ol className="space-y-2 text-sm">
        <li className="flex flex-wrap items-center justify-between gap-2 rounded-md border border-canvas-200 bg-white px-3 py-2">
          <span>
            <span className="font-semibold">Delivered</span>
            {p.deliveredAt ? <span className="block text-canvas-700">{when(p.deliveredAt)}</span> : null}
          </span>
          {p.deliveredAt ? (
            <span className="font-semibold text-pine-800">Done</span>
          ) : booking.can.markDelivered ? (
            <Button size="md" isLoading={mark.isPending && mark.variables === 'delivered'} onClick={() => mark.mutate('delivered')}>
              Mark delivered
            </Button>
          ) : null}
        </li>
        {hasTent ? (
          <li className="flex flex-wrap items-center justify-between gap-2 rounded-md border border-canvas-200 bg-white px-3 py-2">
            <span>
              <span className="font-semibold">Ready to stake</span>
              <span className="block text-canvas-700">{p.readyToStakeAt ? when(p.readyToStakeAt) : (booking.siteCheck.readyToStake.reason ?? 'The checklist allows it: mark it ready there.')}</span>
            </span>
            {p.readyToStakeAt ? (
              <span className="font-semibold text-pine-800">Done</span>
            ) : (
              <Link className={linkClasses} to={paths.app.fieldSiteCheck.getHref(bookingId)}>
                Open the site checklist
              </Link>
            )}
          </li>
        ) : null}
        <li className="flex flex-wrap items-center justify-between gap-2 rounded-md border border-canvas-200 bg-white px-3 py-2">
          <span>
            <span className="font-semibold">Set up</span>
            <span className="block text-canvas-700">
              {p.setUpAt ? when(p.setUpAt) : !p.deliveredAt ? 'After the delivery.' : hasTent && !p.readyToStakeAt ? 'Once staking is marked ready.' : ''}
            </span>
          </span>
          {p.setUpAt ? (
            <span className="font-semibold text-pine-800">Done</span>
          ) : booking.can.markSetUp ? (
            <Button size="md" isLoading={mark.isPending && mark.variables === 'set_up'} onClick={() => mark.mutate('set_up')}>
              Mark set up
            </Button>
          ) : null}
        </li>
      </ol>
      {mark.isError ? <Alert tone="danger">{errorMessage(mark.error)}</Alert> : null}
    </div>
  );
}
