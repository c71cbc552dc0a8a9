import { useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Spinner } from '@/components/ui/spinner';
import { errorMessage } from '@/lib/api';
import { formatDateTime } from '@/lib/format';
import { useCalendarFeed, useCreateCalendarFeed, useRevokeCalendarFeed } from '../api/calendar-feed';

/** Your stops in your phone's calendar: a secret address, shown once, that you can replace or turn off. */
export function CalendarFeedPanel() {
  const feed = useCalendarFeed();
  const create = useCreateCalendarFeed();
  const revoke = useRevokeCalendarFeed();
  const [url, setUrl] = useState<string | null>(null);
  const [copied, setCopied] = useState(false);
  if (feed.isPending) return <Spinner label="Loading…" className="text-canvas-600" />;
  if (feed.isError) return <Alert tone="danger">{errorMessage(feed.error)}</Alert>;
  const state = feed.data;
  return (
    <div className="space-y-4 text-sm">
      <p>
        Subscribe to this address in your phone’s calendar app to see every delivery and pickup you are on. Anyone with the address can read your stops: keep it to
        yourself, and make a new one if it gets out (the old one stops working at once).
      </p>
      {state.active ? (
        <p>
          Your calendar address was made {formatDateTime(state.createdAt)}
          {state.lastUsedAt ? `; a calendar last read it ${formatDateTime(state.lastUsedAt)}` : '; no calendar has read it yet'}.
        </p>
      ) : (
        <p>You have no calendar address.</p>
      )}
      {url ? (
        <div className="space-y-2 rounded-md border border-pine-200 bg-pine-50 p-3">
          <label htmlFor="calendar-url" className="block font-semibold text-pine-900">
            Your calendar address (shown only now)
          </label>
          <input id="calendar-url" readOnly value={url} onFocus={(e) => e.target.select()} className="block w-full rounded-md border border-canvas-400 bg-white px-3 py-2 font-mono text-xs" />
          <div className="flex flex-wrap items-center gap-2">
            <Button size="sm" variant="secondary" onClick={() => void navigator.clipboard?.writeText(url).then(() => setCopied(true))}>
              Copy address
            </Button>
            <a className="font-semibold text-pine-700 underline" href={url.replace(/^https?:/, 'webcal:')}>
              Open in calendar
            </a>
            <span aria-live="polite">{copied ? 'Copied.' : ''}</span>
          </div>
        </div>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button
          isLoading={create.isPending}
          onClick={() => {
            setCopied(false);
            create.mutate(undefined, { onSuccess: (made) => setUrl(made.url) });
          }}
        >
          {state.active ? 'Make a new address' : 'Make my calendar address'}
        </Button>
        {state.active ? (
          <Button variant="ghost" className="text-rust-700 hover:bg-rust-50" isLoading={revoke.isPending} onClick={() => revoke.mutate(undefined, { onSuccess: () => setUrl(null) })}>
            Turn the address off
          </Button>
        ) : null}
      </div>
      {create.isError ? <Alert tone="danger">{errorMessage(create.error)}</Alert> : null}
      {revoke.isError ? <Alert tone="danger">{errorMessage(revoke.error)}</Alert> : null}
    </div>
  );
}
