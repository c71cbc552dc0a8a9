import { Link } from 'react-router';
import { linkClasses } from '@/components/ui/text-link';

export interface GettingStartedStep {
  title: string;
  text: string;
  to: string;
  linkLabel: string;
}

/** A short list of first steps, each a link to the screen where it is done. */
export function GettingStarted({ steps }: { steps: readonly GettingStartedStep[] }) {
  return (
    <ol className="space-y-4">
      {steps.map((step, index) => (
        <li key={step.to} className="flex gap-4">
          <span aria-hidden="true" className="flex size-8 shrink-0 items-center justify-center rounded-full bg-pine-100 font-bold text-pine-800">
            {index + 1}
          </span>
          <div>
            <p className="font-semibold text-canvas-900">{step.title}</p>
            <p className="text-sm text-canvas-700">{step.text}</p>
            <Link className={`${linkClasses} mt-1 inline-block text-sm`} to={step.to}>
              {step.linkLabel}
            </Link>
          </div>
        </li>
      ))}
    </ol>
  );
}
