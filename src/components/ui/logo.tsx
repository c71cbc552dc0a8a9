import { cn } from '@/lib/cn';

/** The Guyline mark: a pole tent with its guy line, and the word. */
export function Logo({ className, inverted = false }: { className?: string; inverted?: boolean }) {
  return (
    <span className={cn('inline-flex items-center gap-2 text-lg font-bold tracking-tight', inverted ? 'text-white' : 'text-pine-800', className)}>
      <svg aria-hidden="true" viewBox="0 0 32 32" className="size-7 shrink-0">
        <rect width="32" height="32" rx="7" fill={inverted ? '#faf8f4' : '#194f46'} />
        <path d="M16 6 5 25h22Z" fill={inverted ? '#194f46' : '#faf8f4'} />
        <path d="M16 6v19" stroke={inverted ? '#faf8f4' : '#194f46'} strokeWidth="2" />
        <path d="M27 25 30 28" stroke={inverted ? '#194f46' : '#faf8f4'} strokeWidth="1.5" />
      </svg>
      <span>Guyline</span>
    </span>
  );
}
