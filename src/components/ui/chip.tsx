import type { ButtonHTMLAttributes } from 'react';
import { cn } from '@/lib/cn';

/** A toggle in a row of filters; its state is aria-pressed. */
export function Chip({ pressed, className, children, ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { pressed: boolean }) {
  return (
    <button
      type="button"
      aria-pressed={pressed}
      className={cn(
        'inline-flex min-h-8 items-center gap-1 rounded-full border px-3 py-1 text-sm font-semibold transition-colors',
        pressed ? 'border-pine-700 bg-pine-700 text-white hover:bg-pine-800' : 'border-canvas-300 bg-white text-canvas-800 hover:bg-canvas-100',
        className,
      )}
      {...rest}
    >
      {pressed ? (
        <svg aria-hidden="true" viewBox="0 0 16 16" className="size-3.5" fill="none" stroke="currentColor" strokeWidth="2.5">
          <path d="m3 8 3.5 3.5L13 5" />
        </svg>
      ) : null}
      {children}
    </button>
  );
}
