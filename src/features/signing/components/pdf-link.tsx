import { cn } from '@/lib/cn';

/**
 * "Open the agreement as a PDF", in a new tab. Opening it is part of the consent (it shows the
 * customer can open the format), so the click, middle click and keyboard open are all reported.
 */
export function PdfLink({ href, onOpen, className }: { href: string; onOpen?: () => void; className?: string }) {
  return (
    <a
      href={href}
      target="_blank"
      rel="noopener"
      onClick={onOpen}
      onAuxClick={onOpen}
      className={cn(
        'inline-flex min-h-11 items-center gap-2 rounded-md border border-pine-700 bg-white px-4 py-2 font-semibold text-pine-800 hover:bg-pine-50',
        className,
      )}
    >
      <svg aria-hidden="true" viewBox="0 0 20 20" className="size-5 shrink-0" fill="none" stroke="currentColor" strokeWidth="1.75">
        <path d="M5 2.75h6.5L15.25 6.5v10.75H5z" />
        <path d="M11.5 2.75V6.5h3.75M7.5 10.5h5M7.5 13.5h5" />
      </svg>
      Open the agreement as a PDF
      <span className="sr-only"> (opens in a new tab)</span>
    </a>
  );
}
