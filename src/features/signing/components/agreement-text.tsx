import { useMemo } from 'react';

/**
 * The page keeps one h1 and each step its h2: the agreement's own headings move two levels down
 * (h1 becomes h3). The server sanitized the HTML, so headings carry no attributes to keep.
 */
export function demoteHeadings(html: string): string {
  return html.replace(/<(\/?)h([1-6])(?=[\s>])/gi, (_, slash: string, level: string) => `<${slash}h${Math.min(6, Number(level) + 2)}`);
}

/**
 * The issued agreement as HTML from the same source as its PDF. It flows with the page rather
 * than scrolling in a box of its own: on a phone a scroll inside a scroll is hard to read.
 */
export function AgreementText({ html, label }: { html: string; label: string }) {
  const safe = useMemo(() => demoteHeadings(html), [html]);
  return (
    <div
      role="document"
      aria-label={label}
      className="document-preview overflow-x-auto rounded-md border border-canvas-300 bg-white px-4 py-5 sm:px-8 sm:py-6"
      // Sanitized on the server (no scripts, no event handlers, no outside images).
      dangerouslySetInnerHTML={{ __html: safe }}
    />
  );
}
