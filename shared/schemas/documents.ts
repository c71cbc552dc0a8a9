import { z } from 'zod';

/** The documents rendered from a template. */
export const DOCUMENT_KINDS = ['rental_agreement', 'invoice', 'receipt', 'credit_note'] as const;
export type DocumentKind = (typeof DOCUMENT_KINDS)[number];
/** Every kind a stored document can be: the templated ones and the customer's signed copy of an agreement. */
export const STORED_DOCUMENT_KINDS = [...DOCUMENT_KINDS, 'signed_agreement'] as const;
export type StoredDocumentKind = (typeof STORED_DOCUMENT_KINDS)[number];
export const DOCUMENT_KIND_LABELS: Record<StoredDocumentKind, string> = {
  rental_agreement: 'Rental agreement',
  invoice: 'Invoice',
  receipt: 'Receipt',
  credit_note: 'Credit note',
  signed_agreement: 'Signed rental agreement',
};

/** The templates a company can edit: the four documents and the e-mails that carry them. */
export const TEMPLATE_NAMES = [
  'rental-agreement', 'invoice', 'receipt', 'credit-note',
  'email-rental-agreement', 'email-invoice', 'email-receipt', 'email-credit-note',
] as const;
export type TemplateName = (typeof TEMPLATE_NAMES)[number];

export interface DocumentSendRow {
  id: string;
  to: string;
  status: 'queued' | 'sent' | 'failed';
  attempts: number;
  error: string | null;
  sentAt: string | null;
  createdAt: string;
}

/** Where the booking's rental agreement stands (GET /api/bookings/:id/documents answers it beside the list). */
export type AgreementStatus =
  | { state: 'none' }
  | { state: 'awaiting'; currentNumber: string }
  | { state: 'signed'; currentNumber: string; signedNumber: string }
  /** The customer signed an earlier version; the booking changed since: the next invoice waits for a new signature. */
  | { state: 'changed_since_signed'; currentNumber: string; lastSignedNumber: string };

export interface BookingDocumentList {
  data: DocumentRow[];
  total: number;
  agreement: AgreementStatus;
}

export interface DocumentRow {
  id: string;
  kind: StoredDocumentKind;
  number: string;
  version: number;
  status: 'issued' | 'replaced' | 'void';
  sha256: string;
  bookingId: string;
  createdAt: string;
  issuedBy: string | null;
  sends: DocumentSendRow[];
  can: { send: boolean };
}

export const SendDocumentRequest = z.object({
  /** Defaults to the customer's e-mail. */
  to: z.union([z.literal(''), z.string().trim().toLowerCase().pipe(z.email({ error: 'Enter a valid e-mail address.' }))]).default(''),
});
export type SendDocumentRequest = z.input<typeof SendDocumentRequest>;

export const TemplateSource = z.object({
  source: z.string({ error: 'Write the template.' }).min(1, 'The template is empty.').max(200_000, 'The template is too long.'),
});

export const TemplatePreviewRequest = TemplateSource.extend({
  bookingId: z.uuid({ error: 'Choose a booking to preview with.' }),
});

/** GET /api/templates and GET /api/clauses carry what the user may do with them. */
export interface LibraryPermissions {
  can: { update: boolean };
}

export interface TemplateRow {
  name: TemplateName;
  source: string;
  /** True while the company uses the shipped default. */
  isDefault: boolean;
  updatedAt: string | null;
  variables: string[];
}

export const ClauseInput = z.object({
  key: z.string().trim().min(2, 'Give the clause a short key.').max(60).regex(/^[a-z0-9-]+$/, 'Use lowercase letters, digits and hyphens.'),
  title: z.string().trim().min(1, 'Give the clause a title.').max(160),
  body: z.string().min(1, 'Write the clause.').max(20_000),
  requiresInitials: z.boolean().default(false),
  position: z.number().int().min(0).max(10_000),
  active: z.boolean().default(true),
});
export type ClauseInput = z.input<typeof ClauseInput>;

export interface ClauseRow {
  id: string;
  key: string;
  title: string;
  body: string;
  requiresInitials: boolean;
  position: number;
  active: boolean;
  updatedAt: string;
}

/** A template problem, with the line it is on. */
export interface TemplateProblem {
  line: number;
  column?: number;
  message: string;
  variable?: string;
}

export const PAYMENT_METHODS = ['cash', 'check', 'transfer', 'card'] as const;

export const LOGO_TYPES = ['image/png', 'image/jpeg'] as const;
export const LOGO_MAX_BYTES = 1024 * 1024;
