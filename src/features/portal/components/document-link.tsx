import { cn } from '@/lib/cn';
import { portalDocumentUrl } from '../api/documents';

/** A PDF to keep: the server sends it as a download, so the page stays where it is. */
export function DocumentLink({ documentId, href, label, className }: { documentId?: string; href?: string; label: string; className?: string }) {
  const url = href ?? (documentId ? portalDocumentUrl(documentId) : '#');
  return (
    <a
      href={url}
      download
      className={cn(
        'inline-flex min-h-10 items-center gap-2 rounded-md border border-pine-700 bg-white px-3 py-2 text-sm font-semibold text-pine-800 hover:bg-pine-50',
        className,
      )}
    >
      <svg aria-hidden="true" viewBox="0 0 20 20" className="size-5 shrink-0" fill="none" stroke="currentColor" strokeWidth="1.75">
        <path d="M10 3v9m-4-4 4 4 4-4M4 15.5h12" />
      </svg>
      {label}
    </a>
  );
}
