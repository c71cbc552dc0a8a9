import type { CaughtMail } from '@shared/schemas/mail';
import { cn } from '@/lib/cn';
import { formatDateTime } from '@/lib/format';

/** The caught mails; the selected one is marked with aria-current. */
export function MailList({ mails, selectedId, onSelect }: { mails: readonly CaughtMail[]; selectedId: string | null; onSelect: (id: string) => void }) {
  return (
    <ul className="divide-y divide-canvas-200 self-start overflow-hidden rounded-lg border border-canvas-200 bg-white" aria-label="Caught mail">
      {mails.map((mail) => {
        const selected = mail.id === selectedId;
        return (
          <li key={mail.id}>
            <button
              type="button"
              aria-current={selected ? 'true' : undefined}
              onClick={() => onSelect(mail.id)}
              className={cn('block w-full px-4 py-3 text-left hover:bg-canvas-100', selected && 'bg-pine-50 hover:bg-pine-50')}
            >
              <span className="block truncate font-semibold text-canvas-900">{mail.subject || '(no subject)'}</span>
              <span className="block truncate text-sm text-canvas-700">To {mail.to.join(', ')}</span>
              <span className="block text-xs text-canvas-600">
                <time dateTime={mail.date}>{formatDateTime(mail.date)}</time>
              </span>
            </button>
          </li>
        );
      })}
    </ul>
  );
}
