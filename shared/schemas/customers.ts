import { z } from 'zod';

export const CUSTOMER_TYPES = ['person', 'organization'] as const;

const text = (max: number) => z.string().trim().max(max, `Use at most ${max} characters.`).default('');

export const CustomerInput = z.object({
  type: z.enum(CUSTOMER_TYPES, { error: 'Choose person or organization.' }).default('person'),
  name: z.string({ error: 'Enter the customer name.' }).trim().min(1, 'Enter the customer name.').max(160, 'Use at most 160 characters.'),
  contactName: text(120),
  email: z.union([z.literal(''), z.string().trim().toLowerCase().pipe(z.email({ error: 'Enter a valid e-mail address.' }))]).default(''),
  phone: z.string().trim().max(40).regex(/^[0-9+().\-\s]*$/, 'Use digits, spaces and + ( ) - . only.').default(''),
  billingLine1: text(160),
  billingLine2: text(160),
  billingCity: text(80),
  billingRegion: text(80),
  billingPostalCode: text(20),
  notes: text(4000),
  taxExempt: z.boolean().default(false),
});
export type CustomerInput = z.input<typeof CustomerInput>;
export type CustomerValues = z.output<typeof CustomerInput>;

export const CustomerListQuery = z.object({
  page: z.coerce.number().int().min(1, 'Pages start at 1.').default(1),
  pageSize: z.coerce.number().int().min(1).max(200, 'At most 200 a page.').default(50),
  q: z.string().trim().max(100).optional(),
});
export type CustomerListQuery = z.infer<typeof CustomerListQuery>;

export interface StoredFileRef {
  id: string;
  filename: string;
  contentType: string;
  size: number;
  sha256: string;
  createdAt: string;
}

export interface CustomerRow extends CustomerValues {
  id: string;
  createdAt: string;
  updatedAt: string;
  exemptionCertificate: StoredFileRef | null;
  bookingCount: number;
  /** readCertificate: the tax exemption certificate is a tax record, for the office, the bookkeeper and the owner (not the crew). */
  can: { update: boolean; readCertificate: boolean };
}

/** Exemption certificates: PDF or image, checked by content, at most 5 MB. */
export const CERTIFICATE_TYPES = ['application/pdf', 'image/png', 'image/jpeg', 'image/webp'] as const;
export const CERTIFICATE_MAX_BYTES = 5 * 1024 * 1024;
