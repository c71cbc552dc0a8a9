import type { ReactNode } from 'react';
import { monthWeeks } from '@/lib/zoned-time';
import { cn } from '@/lib/cn';

const WEEKDAYS = [
  ['Sun', 'Sunday'],
  ['Mon', 'Monday'],
  ['Tue', 'Tuesday'],
  ['Wed', 'Wednesday'],
  ['Thu', 'Thursday'],
  ['Fri', 'Friday'],
  ['Sat', 'Saturday'],
] as const;

/**
 * A month as a table of weeks (Sunday first). Each day cell gets its date and what
 * `renderDay` returns; on a phone the grid scrolls sideways rather than crushing the days.
 */
export function MonthGrid({
  month,
  caption,
  renderDay,
  dayClassName,
  today,
}: {
  month: string;
  caption: string;
  renderDay: (date: string) => ReactNode;
  dayClassName?: (date: string) => string | undefined;
  today?: string;
}) {
  const weeks = monthWeeks(month);
  return (
    <div className="overflow-x-auto rounded-lg border border-canvas-200 bg-white">
      <table className="w-full min-w-[42rem] table-fixed border-collapse text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-canvas-100 text-canvas-700">
          <tr>
            {WEEKDAYS.map(([short, long]) => (
              <th key={short} scope="col" className="px-2 py-1.5 text-left font-semibold">
                <abbr title={long} className="no-underline">
                  {short}
                </abbr>
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {weeks.map((week, i) => (
            <tr key={i}>
              {week.map((date, j) =>
                date ? (
                  <td key={date} className={cn('h-24 border border-canvas-200 p-1 align-top', dayClassName?.(date))}>
                    <div className={cn('mb-1 text-xs font-semibold', date === today ? 'inline-block rounded-full bg-pine-700 px-1.5 text-white' : 'text-canvas-700')}>
                      {Number(date.slice(8))}
                      {date === today ? <span className="sr-only"> (today)</span> : null}
                    </div>
                    {renderDay(date)}
                  </td>
                ) : (
                  <td key={`empty-${j}`} className="border border-canvas-200 bg-canvas-50" />
                ),
              )}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
