import type { SigningEventRow } from '@shared/schemas/signing';
import { formatZoned } from '@/lib/zoned-time';
import { browserName, SIGNING_EVENT_LABELS } from './signing-labels';

/** What happened to one signing link, oldest first as it is read, with where each step came from. */
export function SigningTrail({ events, timeZone, label }: { events: readonly SigningEventRow[]; timeZone: string; label: string }) {
  const ordered = [...events].sort((a, b) => a.at.localeCompare(b.at));
  if (ordered.length === 0) return <p className="mt-2 text-sm text-canvas-700">Nothing recorded yet.</p>;
  return (
    <div className="mt-2 overflow-x-auto rounded-md border border-canvas-200">
      <table className="w-full min-w-[36rem] border-collapse text-left text-sm">
        <caption className="sr-only">{label}</caption>
        <thead className="bg-canvas-100 text-canvas-700">
          <tr>
            <th scope="col" className="px-3 py-1.5 font-semibold">
              Event
            </th>
            <th scope="col" className="px-3 py-1.5 font-semibold">
              Time
            </th>
            <th scope="col" className="px-3 py-1.5 font-semibold">
              IP address
            </th>
            <th scope="col" className="px-3 py-1.5 font-semibold">
              Browser
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-canvas-200 bg-white">
          {ordered.map((e, index) => (
            <tr key={`${e.event}-${e.at}-${index}`}>
              <td className="px-3 py-1.5 text-canvas-900">
                {SIGNING_EVENT_LABELS[e.event]}
                {e.detail ? <span className="text-canvas-700">: {e.detail}</span> : null}
              </td>
              <td className="px-3 py-1.5 whitespace-nowrap text-canvas-900">{formatZoned(e.at, timeZone)}</td>
              <td className="px-3 py-1.5 font-mono text-xs break-all text-canvas-900">{e.ip ?? '—'}</td>
              <td className="px-3 py-1.5 text-canvas-900" title={e.userAgent ?? undefined}>
                {e.userAgent ? browserName(e.userAgent) : '—'}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
