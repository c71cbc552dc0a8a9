import { forwardRef, type ReactNode } from 'react';

/** A step's h2: it takes the focus when the step opens, so keyboard and screen reader start there. */
export const StepHeading = forwardRef<HTMLHeadingElement, { children: ReactNode }>(function StepHeading({ children }, ref) {
  return (
    <h2 ref={ref} tabIndex={-1} className="text-xl font-semibold text-canvas-900 focus:outline-none">
      {children}
    </h2>
  );
});

/** The white sheet a step sits on. */
export function StepCard({ children, label }: { children: ReactNode; label?: string }) {
  return (
    <section aria-label={label} className="rounded-lg border border-canvas-200 bg-white p-4 shadow-sm sm:p-6">
      {children}
    </section>
  );
}
