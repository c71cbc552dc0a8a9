import { useEffect, useId, useState } from 'react';
import type { BookingListRow } from '@shared/schemas/bookings';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { formatDate } from '@/lib/format';
import { useDebounced } from '@/lib/use-debounced';
import { useBookings } from '../api/get-bookings';

export interface PickedBooking {
  id: string;
  reference: string;
  customerName: string;
  eventStart: string;
}

const picked = (b: BookingListRow): PickedBooking => ({ id: b.id, reference: b.reference, customerName: b.customer.name, eventStart: b.eventStart });
const describe = (b: PickedBooking) => `${b.reference} · ${b.customerName} · ${formatDate(b.eventStart)}`;

interface BookingPickerProps {
  value: PickedBooking | null;
  onChange: (booking: PickedBooking) => void;
  label?: string;
  /** With nothing chosen yet, take the first booking found, so there is something to show at once. */
  pickFirst?: boolean;
}

/** Find a booking by reference or customer name and choose it. */
export function BookingPicker({ value, onChange, label = 'Find a booking', pickFirst = false }: BookingPickerProps) {
  const [search, setSearch] = useState('');
  const [open, setOpen] = useState(false);
  const q = useDebounced(search.trim(), 250);
  const results = useBookings({ q: q || undefined, pageSize: 8 });
  const listId = useId();

  const first = results.data?.data[0];
  useEffect(() => {
    if (pickFirst && !value && first) onChange(picked(first));
  }, [pickFirst, value, first, onChange]);

  return (
    <div className="space-y-2">
      {value ? (
        <div className="flex flex-wrap items-center justify-between gap-2 rounded-md border border-canvas-200 bg-canvas-50 px-3 py-2 text-sm">
          <p>
            <span className="text-canvas-700">Booking: </span>
            <span className="font-semibold text-canvas-900">{describe(value)}</span>
          </p>
          <Button size="sm" variant="secondary" aria-expanded={open} onClick={() => setOpen((v) => !v)}>
            {open ? 'Keep this booking' : 'Choose another booking'}
          </Button>
        </div>
      ) : null}
      {open || !value ? (
        <div className="space-y-2">
          <TextField label={label} type="search" placeholder="Reference or customer" value={search} onChange={(e) => setSearch(e.target.value)} aria-controls={listId} />
          <ul id={listId} aria-label="Matching bookings" className="divide-y divide-canvas-200 rounded-md border border-canvas-200 bg-white text-sm">
            {(results.data?.data ?? []).map((b) => (
              <li key={b.id}>
                <button
                  type="button"
                  onClick={() => {
                    onChange(picked(b));
                    setOpen(false);
                    setSearch('');
                  }}
                  className="block w-full px-3 py-2 text-left hover:bg-canvas-100"
                >
                  <span className="font-semibold">Use {b.reference}</span>
                  <span className="block text-canvas-700">
                    {b.customer.name} · {formatDate(b.eventStart)}
                  </span>
                </button>
              </li>
            ))}
            {results.data && results.data.data.length === 0 ? <li className="px-3 py-2 text-canvas-700">No booking matches.</li> : null}
            {results.isPending ? <li className="px-3 py-2 text-canvas-700">Searching…</li> : null}
            {results.isError ? <li className="px-3 py-2 text-rust-700">The bookings could not be searched.</li> : null}
          </ul>
        </div>
      ) : null}
    </div>
  );
}
