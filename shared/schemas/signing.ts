import { z } from 'zod';

export const SIGNING_STATUSES = ['pending', 'signed', 'void', 'replaced', 'expired', 'declined'] as const;
export type SigningStatus = (typeof SIGNING_STATUSES)[number];

export const SIGNING_EVENTS = ['sent', 'opened', 'consented', 'consent_withdrawn', 'initialed', 'signed', 'voided', 'replaced', 'refused_stock'] as const;
export type SigningEventKind = (typeof SIGNING_EVENTS)[number];

export interface SigningEventRow {
  event: SigningEventKind;
  at: string;
  ip: string | null;
  userAgent: string | null;
  detail: string | null;
}

/** What the office sees of a signing request. */
export interface SigningRequestRow {
  id: string;
  documentId: string;
  status: SigningStatus;
  sentTo: string;
  expiresAt: string;
  createdAt: string;
  signedAt: string | null;
  signedDocumentId: string | null;
  events: SigningEventRow[];
  can: { resend: boolean; void: boolean };
}

export const SignatureRequestInput = z.object({
  to: z.union([z.literal(''), z.string().trim().toLowerCase().pipe(z.email({ error: 'Enter a valid e-mail address.' }))]).default(''),
});
export type SignatureRequestInput = z.input<typeof SignatureRequestInput>;

/**
 * The disclosure a consumer receives before consenting to electronic records and signatures,
 * element by element as 15 U.S.C. §7001(c)(1)(B)–(C) lists them.
 */
export interface Disclosure {
  /** §7001(c)(1)(B)(i): the right or option to have the record on paper. */
  paperCopy: string;
  /** §7001(c)(1)(B)(i): the right to withdraw consent, and its conditions or consequences (fees, ending the relationship). */
  withdrawal: string;
  /** §7001(c)(1)(B)(ii): whether consent covers only this transaction or categories of records. */
  scope: string;
  /** §7001(c)(1)(B)(iii): the procedure to withdraw consent and to update contact information. */
  procedures: string;
  /** §7001(c)(1)(B)(iv): how to request a paper copy after consenting, and whether a fee is charged. */
  paperCopyRequest: string;
  /** §7001(c)(1)(C)(i): the hardware and software needed to access and keep the records. */
  requirements: string;
  /** §7001(c)(1)(C)(ii): consent in a manner that shows the consumer can access the records. */
  demonstration: string;
}

/** GET /api/sign/:token — the public signing page's data. */
export interface SigningPage {
  status: SigningStatus;
  company: { name: string; phone: string; email: string };
  customerName: string;
  document: { id: string; number: string; version: number; sha256: string; title: string; html: string; pdfUrl: string };
  disclosure: Disclosure;
  clauses: { key: string; title: string; requiresInitials: boolean }[];
  consentedAt: string | null;
  signedAt: string | null;
  /** When signed: the customer's copy, for as long as the company keeps the link open. */
  signedPdfUrl: string | null;
  expiresAt: string;
}

export const SignRequest = z.object({
  typedName: z.string({ error: 'Type your full legal name.' }).trim().min(2, 'Type your full legal name.').max(200, 'Use at most 200 characters.'),
  /** A PNG data URL from the drawing pad; leave out to sign with the typed name only. */
  signatureImage: z
    .string()
    .max(1_500_000, 'The drawing is too large.')
    .regex(/^data:image\/png;base64,[A-Za-z0-9+/=]+$/, 'The signature drawing is not a PNG image.')
    .optional(),
  initials: z.record(
    z.string(),
    z.string().trim().min(1, 'Write your initials.').max(8, 'Initials are at most 8 characters.'),
  ),
});
export type SignRequest = z.input<typeof SignRequest>;

export interface VerifyResult {
  documentId: string;
  /** The stored bytes still hash to the stored SHA-256. */
  hashMatches: boolean;
  sha256: string;
  /** For a signed copy: the digital signature checks out and covers the whole file. */
  signature: { signed: boolean; intact: boolean; coversWholeDocument: boolean; signerCommonName: string | null; problem: string | null } | null;
}
