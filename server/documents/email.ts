/**
 * The e-mail that carries a document, with the "Subject:" first-line convention of
 * server/services/mailer.ts. Plain text over the document's values, plus the links the
 * sending code knows (the signing page for an agreement); the PDF goes as an attachment.
 */
import { renderPlainText, TemplateError, validateTemplate, type TemplateValidation } from './template';
import { DOCUMENT_VARIABLES, type DocumentValues } from './values';

export interface DocumentEmailLinks {
  /** The customer's signing or viewing page; empty when there is none. */
  link: string;
}

export type DocumentEmailValues = DocumentValues & DocumentEmailLinks;

export const EMAIL_VARIABLES: string[] = [...DOCUMENT_VARIABLES, 'link'];

export function validateEmailTemplate(source: string): TemplateValidation {
  const result = validateTemplate(source, { variables: EMAIL_VARIABLES, context: 'email' });
  if (!result.ok) return result;
  if (!/^Subject:/.test(source)) return { ok: false, errors: [{ line: 1, message: 'the first line must be "Subject: ..."' }] };
  return result;
}

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** Plain text to simple HTML: paragraphs, line breaks and clickable links (as mailer.ts does). */
function textToHtml(text: string): string {
  const paragraphs = text
    .trim()
    .split(/\n{2,}/)
    .map((p) =>
      escapeHtml(p)
        .replace(/(https?:\/\/[^\s<]+)/g, '<a href="$1">$1</a>')
        .replace(/\n/g, '<br>'),
    );
  return `<!doctype html><html><body style="font-family:sans-serif;line-height:1.5;color:#1f2a24">${paragraphs.map((p) => `<p>${p}</p>`).join('\n')}</body></html>`;
}

export function renderDocumentEmail(source: string, values: DocumentValues, links: Partial<DocumentEmailLinks> = {}): { subject: string; text: string; html: string } {
  const out = renderPlainText(source, { ...values, link: links.link ?? '' });
  const [first, ...rest] = out.split('\n');
  if (!first.startsWith('Subject:')) throw new TemplateError([{ line: 1, message: 'the first line must be "Subject: ..."' }]);
  const text = `${rest.join('\n').replace(/\n{3,}/g, '\n\n').trim()}\n`;
  return { subject: first.slice('Subject:'.length).trim(), text, html: textToHtml(text) };
}
