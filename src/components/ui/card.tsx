import type { HTMLAttributes, ReactNode } from 'react';
import { cn } from '@/lib/cn';

export function Card({ className, ...rest }: HTMLAttributes<HTMLDivElement>) {
  return <div className={cn('rounded-lg border border-canvas-200 bg-white p-4 shadow-sm sm:p-6', className)} {...rest} />;
}

/** A card with a heading; `headingLevel` keeps the page outline right (h1 is the page's). */
export function SectionCard({
  title,
  description,
  headingLevel = 2,
  actions,
  children,
  className,
}: {
  title: ReactNode;
  description?: ReactNode;
  headingLevel?: 2 | 3;
  actions?: ReactNode;
  children: ReactNode;
  className?: string;
}) {
  const Heading = headingLevel === 2 ? 'h2' : 'h3';
  return (
    <Card className={className}>
      <div className="mb-4 flex flex-wrap items-start justify-between gap-2">
        <div>
          <Heading className="text-lg font-semibold text-canvas-900">{title}</Heading>
          {description ? <p className="mt-1 text-sm text-canvas-600">{description}</p> : null}
        </div>
        {actions}
      </div>
      {children}
    </Card>
  );
}
