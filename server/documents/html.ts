/**
 * The HTML preview of a document: marked for the Markdown, the blocks of blocks.ts as HTML,
 * then sanitize-html over everything, since a template is written by a person and the values
 * come from customers. No scripts, no event handlers, no images from elsewhere.
 */
import { Marked, type Tokens } from 'marked';
import sanitizeHtml from 'sanitize-html';
import { parseBlock, type DocumentBlock } from './blocks';

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

function blockHtml(block: DocumentBlock): string {
  switch (block.type) {
    case 'table': {
      const cls = (align: string) => (align === 'right' ? ' class="num"' : '');
      const head = block.columns.map((c) => `<th${cls(c.align)}>${escapeHtml(c.label)}</th>`).join('');
      const rows = block.rows
        .map((r) => `<tr>${r.map((cell, i) => `<td${cls(block.columns[i]?.align ?? 'left')}>${escapeHtml(cell)}</td>`).join('')}</tr>`)
        .join('\n');
      const span = Math.max(1, block.columns.length - 1);
      const totals = block.totals
        .map(
          (t) =>
            `<tr class="${t.strong ? 'total strong' : 'total'}"><th colspan="${span}" class="num">${escapeHtml(t.label)}</th><td class="num">${escapeHtml(t.amount)}</td></tr>`,
        )
        .join('\n');
      return `<table class="line-items">\n<thead><tr>${head}</tr></thead>\n<tbody>\n${rows}\n</tbody>${totals ? `\n<tfoot>\n${totals}\n</tfoot>` : ''}\n</table>\n`;
    }
    case 'initials':
      return `<div class="initials" data-clause="${escapeHtml(block.key)}"><span class="initials-label">${escapeHtml(block.label)}</span><span class="initials-box"></span></div>\n`;
    case 'signature':
      return `<div class="signatures">\n${block.parties
        .map(
          (p) =>
            `<div class="signature" data-role="${escapeHtml(p.role)}"><p class="signature-role">${escapeHtml(p.role)}${
              p.onBehalfOf ? `: ${escapeHtml(p.onBehalfOf)}` : ''
            }</p><p class="signature-line">Signature</p><p class="signature-name">Name: ${escapeHtml(p.name)}</p><p class="signature-date">Date:</p></div>`,
        )
        .join('\n')}\n</div>\n`;
  }
}

const marked = new Marked({
  gfm: true,
  async: false,
  renderer: {
    code(token: Tokens.Code) {
      const block = parseBlock(token.lang, token.text);
      if (block) return blockHtml(block);
      return `<pre><code>${escapeHtml(token.text)}</code></pre>\n`;
    },
  },
});

const SANITIZE: sanitizeHtml.IOptions = {
  allowedTags: [
    'h1', 'h2', 'h3', 'h4', 'h5', 'h6', 'p', 'br', 'hr', 'strong', 'b', 'em', 'i', 'u', 'del', 's', 'blockquote', 'ul', 'ol', 'li',
    'code', 'pre', 'table', 'thead', 'tbody', 'tfoot', 'tr', 'th', 'td', 'a', 'span', 'div', 'img',
  ],
  allowedAttributes: {
    a: ['href', 'title'],
    img: ['src', 'alt', 'width', 'height'],
    ol: ['start'],
    th: ['colspan', 'class', 'align'],
    td: ['colspan', 'class', 'align'],
    table: ['class'],
    tr: ['class'],
    div: ['class', 'data-clause', 'data-role'],
    span: ['class'],
    p: ['class'],
  },
  allowedSchemes: ['http', 'https', 'mailto', 'tel'],
  // Images only from inside the document itself: nothing that calls out when the preview opens.
  allowedSchemesByTag: { img: ['data'] },
  allowProtocolRelative: false,
  disallowedTagsMode: 'discard',
  transformTags: {
    a: sanitizeHtml.simpleTransform('a', { rel: 'noopener noreferrer nofollow' }),
  },
};
SANITIZE.allowedAttributes = { ...SANITIZE.allowedAttributes, a: ['href', 'title', 'rel'] };

/** Markdown from renderDocumentMarkdown to safe HTML for the browser preview. */
export function markdownToHtml(markdown: string): string {
  const html = marked.parse(markdown) as string;
  return sanitizeHtml(html, SANITIZE);
}
