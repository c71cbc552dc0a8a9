import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';

export type AlertTone = 'info' | 'success' | 'warning' | 'danger';

const tones: Record<AlertTone, string> = {
  info: 'border-pine-200 bg-pine-50 text-pine-900',
  success: 'border-pine-300 bg-pine-50 text-pine-900',
  warning: 'border-ochre-200 bg-ochre-50 text-ochre-800',
  danger: 'border-rust-200 bg-rust-50 text-rust-800',
};

/** Errors use role="alert" (announced at once); other tones role="status". */
export function Alert({ tone = 'info', title, children, className }: { tone?: AlertTone; title?: ReactNode; children?: ReactNode; className?: string }) {
  return (
    <div role={tone === 'danger' ? 'alert' : 'status'} className={cn('rounded-md border px-4 py-3 text-sm', tones[tone], className)}>
      {title ? <p className="font-semibold">{title}</p> : null}
      {children ? <div className={title ? 'mt-1' : undefined}>{children}</div> : null}
    </div>
  );
}

/**
 * A live region that is always in the page (so screen readers notice what appears in it) but
 * takes no room while empty.
 */
export function LiveRegion({ children, politeness = 'polite' }: { children?: ReactNode; politeness?: 'polite' | 'assertive' }) {
  return (
    <div aria-live={politeness} aria-atomic="true" className={children ? undefined : 'sr-only'}>
      {children}
    </div>
  );
}

/** The form-level message, announced as soon as it appears. */
export function FormMessage({ message, tone = 'danger' }: { message: string | null | undefined; tone?: AlertTone }) {
  return <LiveRegion politeness="assertive">{message ? <Alert tone={tone}>{message}</Alert> : null}</LiveRegion>;
}
