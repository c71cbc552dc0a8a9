/**
 * The document engine: a template, the company's clauses and a booking's values in; the
 * Markdown, the sanitized HTML preview, the PDF bytes and their SHA-256 out. No HTTP, no
 * database: the caller stores what comes back.
 */
import { createHash } from 'node:crypto';
import type { Clause } from './clauses';
import { markdownToHtml } from './html';
import { renderPdf } from './pdf';
import { renderDocumentMarkdown } from './template';
import type { DocumentValues } from './values';

export { type Clause, loadDefaultClauses, parseClauseFile } from './clauses';
export { loadDefaultEmailTemplate, loadDefaultTemplate } from './defaults';
export { EMAIL_VARIABLES, renderDocumentEmail, validateEmailTemplate } from './email';
export { markdownToHtml } from './html';
export { drawPageChrome, pageFrame, renderPdf, type PdfInput } from './pdf';
export type { DocumentFill, SignatureFill } from './pdfBlocks';
export { renderDocumentMarkdown, TemplateError, validateTemplate, type TemplateProblem, type TemplateValidation } from './template';
export {
  bookingDocumentValues,
  DOCUMENT_KINDS,
  DOCUMENT_TITLES,
  DOCUMENT_VARIABLES,
  type BookingDocumentInput,
  type DocumentKind,
  type DocumentValues,
  type OrganizationForDocuments,
} from './values';

export interface RenderedDocument {
  markdown: string;
  html: string;
  pdf: Buffer;
  /** SHA-256 of the PDF bytes, hex. */
  sha256: string;
}

export async function renderDocument(input: {
  template: string;
  clauses: Clause[];
  values: DocumentValues;
  company: { name: string; logo?: Buffer | null };
  /** The PDF's creation date; the issue time makes a re-render byte-identical. */
  issuedAt?: Date;
}): Promise<RenderedDocument> {
  const markdown = renderDocumentMarkdown(input.template, input.values, input.clauses);
  const html = markdownToHtml(markdown);
  const pdf = await renderPdf({
    markdown,
    title: `${input.values.document.title} ${input.values.document.number}`,
    company: input.company,
    documentLabel: input.values.document.label,
    createdAt: input.issuedAt,
  });
  return { markdown, html, pdf, sha256: createHash('sha256').update(pdf).digest('hex') };
}
