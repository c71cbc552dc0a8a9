import { useId, type ReactNode } from 'react';

/**
 * A chart with its words: a heading, a one-sentence summary read out in place of the drawing
 * (role="img"), and a caption pointing to the table that has every figure as text. The chart is
 * for looking; the table beside it is the accessible version and where the figures link from.
 */
export function ChartFigure({ title, summary, height = 260, children }: { title: string; summary: string; height?: number; children: ReactNode }) {
  const captionId = useId();
  return (
    <figure className="rounded-lg border border-canvas-200 bg-white p-4" aria-labelledby={captionId}>
      <figcaption id={captionId} className="mb-2">
        <span className="block font-semibold text-canvas-900">{title}</span>
        <span className="block text-sm text-canvas-700">{summary} Every figure is in the table, each one opens what it is made of.</span>
      </figcaption>
      <div role="img" aria-label={`${title}. ${summary}`} style={{ width: '100%', height }}>
        {children}
      </div>
    </figure>
  );
}
