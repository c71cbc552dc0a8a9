import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';

/**
 * A column header that sorts the table: a button inside the <th>, with aria-sort on the cell so
 * screen readers hear the order.
 */
export function SortHeader({
  label,
  active,
  dir,
  onSort,
  className,
}: {
  label: ReactNode;
  active: boolean;
  dir: 'asc' | 'desc';
  onSort: () => void;
  className?: string;
}) {
  return (
    <th scope="col" aria-sort={active ? (dir === 'asc' ? 'ascending' : 'descending') : 'none'} className={cn('px-2 py-1 font-semibold whitespace-nowrap', className)}>
      <button type="button" onClick={onSort} className="inline-flex items-center gap-1 rounded px-2 py-1 font-semibold hover:bg-canvas-200">
        {label}
        <svg aria-hidden="true" viewBox="0 0 12 12" className={cn('size-3', active ? 'text-canvas-900' : 'text-canvas-400')} fill="currentColor">
          {active && dir === 'desc' ? <path d="M2 4h8L6 9Z" /> : active ? <path d="M2 8h8L6 3Z" /> : <path d="M3 5h6L6 1.5ZM3 7h6l-3 3.5Z" />}
        </svg>
      </button>
    </th>
  );
}
