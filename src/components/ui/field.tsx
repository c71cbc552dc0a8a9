import { cn } from '@/lib/cn';

/** Shared classes and pieces for labelled form controls. */
export const controlClasses = (invalid: boolean, className?: string) =>
  cn(
    'block w-full rounded-md border bg-white px-3 py-2 text-base text-canvas-900 placeholder:text-canvas-500',
    'disabled:bg-canvas-100 disabled:text-canvas-600',
    invalid ? 'border-rust-600' : 'border-canvas-400',
    className,
  );

export function describedBy(...ids: Array<string | false | undefined>) {
  const joined = ids.filter(Boolean).join(' ');
  return joined || undefined;
}

export function FieldLabel({ htmlFor, children, hidden }: { htmlFor: string; children: React.ReactNode; hidden?: boolean }) {
  return (
    <label htmlFor={htmlFor} className={hidden ? 'sr-only' : 'mb-1 block text-sm font-semibold text-canvas-800'}>
      {children}
    </label>
  );
}

export function FieldHint({ id, children }: { id: string; children?: React.ReactNode }) {
  if (!children) return null;
  return (
    <p id={id} className="mt-1 text-sm text-canvas-600">
      {children}
    </p>
  );
}

/** Always rendered so screen readers announce a message when it appears. */
export function FieldError({ id, children }: { id: string; children?: React.ReactNode }) {
  return (
    <p id={id} aria-live="polite" className={children ? 'mt-1 text-sm font-semibold text-rust-700' : 'sr-only'}>
      {children}
    </p>
  );
}
