import type { ReactNode } from 'react';
import { Title } from './title';

/** The page's one h1, its document title and optional actions. */
export function PageHeader({ title, documentTitle, description, actions }: { title: string; documentTitle?: string; description?: ReactNode; actions?: ReactNode }) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <Title>{documentTitle ?? title}</Title>
      <div className="min-w-0">
        <h1 className="text-2xl font-bold tracking-tight text-canvas-900 sm:text-3xl">{title}</h1>
        {description ? <div className="mt-1 max-w-prose text-canvas-700">{description}</div> : null}
      </div>
      {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
    </header>
  );
}
