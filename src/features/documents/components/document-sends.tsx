import type { DocumentSendRow } from '@shared/schemas/documents';
import { Badge } from '@/components/ui/badge';
import { Spinner } from '@/components/ui/spinner';
import { formatZoned } from '@/lib/zoned-time';
import { SEND_STATUS_TONES } from './document-labels';

function SendState({ send, timeZone }: { send: DocumentSendRow; timeZone: string }) {
  switch (send.status) {
    case 'queued':
      return (
        <Badge tone={SEND_STATUS_TONES.queued}>
          <Spinner className="mr-1 scale-75" />
          Queued
        </Badge>
      );
    case 'sent':
      return <Badge tone={SEND_STATUS_TONES.sent}>Sent {send.sentAt ? `at ${formatZoned(send.sentAt, timeZone)}` : ''}</Badge>;
    case 'failed':
      return <Badge tone={SEND_STATUS_TONES.failed}>Failed</Badge>;
  }
}

/** The e-mails that carried one document, newest first, each with where it stands. */
export function DocumentSends({ sends, timeZone, label }: { sends: readonly DocumentSendRow[]; timeZone: string; label: string }) {
  if (sends.length === 0) return null;
  const ordered = [...sends].sort((a, b) => b.createdAt.localeCompare(a.createdAt));
  return (
    <div className="mt-3">
      <h4 className="text-sm font-semibold text-canvas-800">E-mails</h4>
      <ul aria-label={label} aria-live="polite" className="mt-1 space-y-1 text-sm">
        {ordered.map((s) => (
          <li key={s.id} className="flex flex-wrap items-center gap-x-2 gap-y-1">
            <span className="break-all text-canvas-900">To {s.to}</span>
            <SendState send={s} timeZone={timeZone} />
            <span className="text-canvas-600">asked {formatZoned(s.createdAt, timeZone)}</span>
            {s.status === 'failed' ? (
              <span className="basis-full font-semibold text-rust-700">
                Failed: {s.error || 'the mail server did not accept it.'}
                {s.attempts > 1 ? ` (${s.attempts} attempts)` : ''}
              </span>
            ) : null}
          </li>
        ))}
      </ul>
    </div>
  );
}
