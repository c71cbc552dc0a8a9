import { cn } from '@/lib/cn';

export const SIGNING_STEPS = ['consent', 'read', 'initial', 'sign', 'done'] as const;
export type SigningStep = (typeof SIGNING_STEPS)[number];

export const SIGNING_STEP_LABELS: Record<SigningStep, string> = {
  consent: 'Consent',
  read: 'Read',
  initial: 'Initial',
  sign: 'Sign',
  done: 'Done',
};

/** The steps as a numbered list: done ones ticked, the current one marked for screen readers too. */
export function SigningProgress({ steps, current }: { steps: readonly SigningStep[]; current: SigningStep }) {
  const at = steps.indexOf(current);
  return (
    <nav aria-label="Signing steps" className="mb-5">
      <ol className="flex items-start">
        {steps.map((step, index) => {
          // Reaching Done completes every step, Done included.
          const state = index < at || (index === at && step === 'done') ? 'done' : index === at ? 'current' : 'upcoming';
          return (
            <li key={step} aria-current={index === at ? 'step' : undefined} className="relative flex flex-1 flex-col items-center text-center">
              {index > 0 ? (
                <span aria-hidden="true" className={cn('absolute top-4 right-1/2 h-0.5 w-full -translate-y-1/2', index <= at ? 'bg-pine-600' : 'bg-canvas-300')} />
              ) : null}
              <span
                aria-hidden="true"
                className={cn(
                  'relative z-10 flex size-8 items-center justify-center rounded-full text-sm font-bold ring-2',
                  state === 'done' && 'bg-pine-700 text-white ring-pine-700',
                  state === 'current' && 'bg-white text-pine-800 ring-pine-700',
                  state === 'upcoming' && 'bg-canvas-50 text-canvas-600 ring-canvas-300',
                )}
              >
                {state === 'done' ? (
                  <svg viewBox="0 0 16 16" className="size-4" fill="none" stroke="currentColor" strokeWidth="2.5">
                    <path d="m3 8 3.5 3.5L13 5" />
                  </svg>
                ) : (
                  index + 1
                )}
              </span>
              <span className={cn('mt-1 text-xs sm:text-sm', index === at ? 'font-semibold text-canvas-900' : 'text-canvas-700')}>
                <span className="sr-only">Step {index + 1}: </span>
                {SIGNING_STEP_LABELS[step]}
                <span className="sr-only">{state === 'done' ? ' (done)' : ''}</span>
              </span>
            </li>
          );
        })}
      </ol>
    </nav>
  );
}
