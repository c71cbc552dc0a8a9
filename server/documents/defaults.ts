/**
 * The shipped templates in templates/documents: one Markdown template per document kind and
 * the e-mail that carries each document. Companies edit copies; these files stay as shipped.
 */
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { DocumentKind } from './values';

export const documentsDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', 'templates', 'documents');

const FILE_NAMES: Record<DocumentKind, string> = {
  rental_agreement: 'rental-agreement',
  invoice: 'invoice',
  receipt: 'receipt',
  credit_note: 'credit-note',
};

/** The default Markdown + Handlebars template of a document kind. */
export function loadDefaultTemplate(kind: DocumentKind): string {
  const name = FILE_NAMES[kind];
  if (!name) throw new Error(`No default template for ${kind}.`);
  return fs.readFileSync(path.join(documentsDir, `${name}.md.hbs`), 'utf8');
}

/** The default e-mail that carries a document: first line "Subject: ...", then plain text. */
export function loadDefaultEmailTemplate(kind: DocumentKind): string {
  const name = FILE_NAMES[kind];
  if (!name) throw new Error(`No default e-mail for ${kind}.`);
  return fs.readFileSync(path.join(documentsDir, `email-${name}.hbs`), 'utf8');
}
