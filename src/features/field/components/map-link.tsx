import type { FieldSite } from '@shared/schemas/field';
import { useState } from 'react';
import { cn } from '@/lib/cn';

/**
 * The site address, opening the phone's map app (a geo: link), with a copy button for phones
 * and computers that do not follow geo: links.
 */
export function MapLink({ site, className }: { site: FieldSite; className?: string }) {
  const [copied, setCopied] = useState(false);
  if (!site.address) return <p className={cn('text-sm text-rust-800', className)}>No site address on the booking: call the office.</p>;
  return (
    <div className={cn('flex flex-wrap items-center gap-x-3 gap-y-1', className)}>
      <a href={site.mapUrl ?? undefined} className="font-semibold text-pine-700 underline hover:text-pine-900">
        {site.address}
        <span className="sr-only"> (opens your map app)</span>
      </a>
      <button
        type="button"
        className="min-h-8 rounded-md px-2 text-sm font-semibold text-canvas-700 underline hover:bg-canvas-100"
        onClick={() => {
          void navigator.clipboard?.writeText(site.address).then(
            () => setCopied(true),
            () => setCopied(false),
          );
        }}
      >
        Copy address
      </button>
      <span aria-live="polite" className="text-sm text-canvas-600">
        {copied ? 'Copied.' : ''}
      </span>
    </div>
  );
}
