import { BOOKING_STATUS_LABELS, type BookingStatus } from '@shared/schemas/bookings';
import { cn } from '@/lib/cn';

/** One colour per status, used by badges, the calendar and its legend alike. */
export const STATUS_STYLES: Record<BookingStatus, string> = {
  draft: 'bg-canvas-100 text-canvas-800 ring-canvas-400',
  quoted: 'bg-ochre-100 text-ochre-800 ring-ochre-600',
  reserved: 'bg-pine-100 text-pine-900 ring-pine-500',
  out: 'bg-sky-100 text-sky-900 ring-sky-600',
  returned: 'bg-violet-100 text-violet-900 ring-violet-500',
  closed: 'bg-canvas-200 text-canvas-700 ring-canvas-500',
  cancelled: 'bg-rust-50 text-rust-800 ring-rust-500 line-through',
};

export function StatusBadge({ status, className }: { status: BookingStatus; className?: string }) {
  return (
    <span className={cn('inline-flex items-center rounded-full px-2 py-0.5 text-xs font-semibold ring-1 ring-inset', STATUS_STYLES[status], className)}>
      {BOOKING_STATUS_LABELS[status]}
    </span>
  );
}
