import { useState } from 'react';
import type { CaughtMail } from '@shared/schemas/mail';
import { cn } from '@/lib/cn';
import { formatBytes, formatDateTime } from '@/lib/format';
import { LinkifiedText } from './linkified-text';

type View = 'text' | 'html';

/** One caught mail: headers, the text part with live links, the HTML part sandboxed, attachments. */
export function MailMessage({ mail }: { mail: CaughtMail }) {
  const [view, setView] = useState<View>(mail.text ? 'text' : 'html');
  const hasHtml = mail.html.trim().length > 0;

  return (
    <article aria-labelledby={`mail-${mail.id}-subject`} className="rounded-lg border border-canvas-200 bg-white">
      <header className="border-b border-canvas-200 px-4 py-3">
        <h2 id={`mail-${mail.id}-subject`} className="text-lg font-semibold break-words text-canvas-900">
          {mail.subject || '(no subject)'}
        </h2>
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-sm">
          <dt className="font-semibold text-canvas-700">From</dt>
          <dd className="break-all">{mail.from}</dd>
          <dt className="font-semibold text-canvas-700">To</dt>
          <dd className="break-all">{mail.to.join(', ')}</dd>
          <dt className="font-semibold text-canvas-700">Date</dt>
          <dd>
            <time dateTime={mail.date}>{formatDateTime(mail.date)}</time>
          </dd>
        </dl>
      </header>

      {hasHtml && mail.text ? (
        <div role="group" aria-label="Show part" className="flex gap-1 border-b border-canvas-200 px-4 py-2">
          {(['text', 'html'] as const).map((v) => (
            <button
              key={v}
              type="button"
              aria-pressed={view === v}
              onClick={() => setView(v)}
              className={cn('rounded-md px-3 py-1 text-sm font-semibold', view === v ? 'bg-pine-700 text-white' : 'text-canvas-800 hover:bg-canvas-100')}
            >
              {v === 'text' ? 'Text' : 'HTML'}
            </button>
          ))}
        </div>
      ) : null}

      <div className="px-4 py-4">
        {view === 'text' || !hasHtml ? (
          mail.text ? <LinkifiedText text={mail.text} /> : <p className="text-sm text-canvas-600">This mail has no text part.</p>
        ) : (
          // An empty sandbox: the mail's HTML cannot run scripts, submit forms or reach this page.
          <iframe title={`HTML part of “${mail.subject}”`} sandbox="" srcDoc={mail.html} className="h-[28rem] w-full rounded border border-canvas-200 bg-white" />
        )}
      </div>

      {mail.attachments.length > 0 ? (
        <section aria-labelledby={`mail-${mail.id}-attachments`} className="border-t border-canvas-200 px-4 py-3">
          <h3 id={`mail-${mail.id}-attachments`} className="font-semibold text-canvas-900">
            Attachments ({mail.attachments.length})
          </h3>
          <ul className="mt-2 space-y-2 text-sm">
            {mail.attachments.map((a, index) => (
              <li key={`${a.filename}-${index}`} className="rounded-md bg-canvas-100 px-3 py-2">
                <span className="font-semibold">{a.filename || '(no name)'}</span>{' '}
                <span className="text-canvas-700">
                  · {a.contentType} · {formatBytes(a.size)}
                </span>
                <span className="mt-1 block font-mono text-xs break-all text-canvas-700">sha256 {a.sha256}</span>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </article>
  );
}
