import { useMemo } from 'react';

/**
 * The page has one h1, and the preview sits under an h2: its headings move two levels down
 * (h1 becomes h3). The server sanitized the HTML, so headings carry no attributes to keep.
 */
export function demoteHeadings(html: string): string {
  return html.replace(/<(\/?)h([1-6])(?=[\s>])/gi, (_, slash: string, level: string) => `<${slash}h${Math.min(6, Number(level) + 2)}`);
}

/** The server's sanitized HTML of a rendered document, laid out like the printed page. */
export function DocumentPreview({ html, label }: { html: string; label: string }) {
  const safe = useMemo(() => demoteHeadings(html), [html]);
  return (
    <div
      role="document"
      aria-label={label}
      // A scrolling region with nothing focusable inside (values no longer become links) must
      // take the focus itself, so keyboard users can scroll it (axe scrollable-region-focusable).
      tabIndex={0}
      className="document-preview max-h-[75vh] overflow-y-auto rounded-md border border-canvas-300 bg-white px-5 py-6 shadow-inner sm:px-8"
      // Sanitized on the server (sanitize-html: no scripts, no event handlers, no outside images).
      dangerouslySetInnerHTML={{ __html: safe }}
    />
  );
}
