/**
 * The signed copy of an issued document: the same Markdown laid out again exactly as issued,
 * with the customer's initials and signature in their boxes, a certificate page after it, and
 * the whole file digitally signed (PKCS#7 detached, adbe.pkcs7.detached) with the company's
 * certificate through @signpdf.
 */
import { randomBytes } from 'node:crypto';
import { pdfkitAddPlaceholder } from '@signpdf/placeholder-pdfkit';
import { P12Signer } from '@signpdf/signer-p12';
import { SignPdf } from '@signpdf/signpdf';
import { renderPdf } from '../pdf';
import { certificateFingerprint, toP12 } from './certificate';
import { drawCertificatePages, type TrailEvent } from './certificatePage';
import { signingFields } from './fields';

export interface SignedPdfInput {
  /** The issued document's Markdown, title, company, label and issue time, as it was issued. */
  markdown: string;
  title: string;
  company: { name: string; logo?: Buffer | null };
  documentLabel: string;
  issuedAt: Date;
  signature: { typedName: string; imagePng?: Buffer | null; signedAt: Date };
  /** Initials by clause key, e.g. { weather: "JH" }; every initials box must have one. */
  initials: Record<string, string>;
  trail: TrailEvent[];
  /** SHA-256 (hex) of the issued PDF, printed on the certificate page. */
  issuedSha256: string;
  certificate: { certificatePem: string; privateKeyPem: string };
  /** Time zone for the date written in the signature block; UTC when absent. */
  timeZone?: string;
  /** The signature block party that signs here; "Customer" by default. */
  signerRole?: string;
}

/** Something in the signer's input does not fit the document; nothing was signed. */
export class SigningInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SigningInputError';
  }
}

/**
 * Room for the PKCS#7 blob in /Contents, in bytes (written as twice as many hex digits). A
 * 2048-bit RSA signature with one certificate and signed attributes is about 1.6 KB; 8 KB
 * leaves room for a longer chain or a timestamp later.
 */
export const SIGNATURE_LENGTH = 8192;

const MAX_INITIALS = 8;
/** A signature pad's PNG is tens of kilobytes; anything near this is not a signature. */
export const MAX_SIGNATURE_PNG_BYTES = 1024 * 1024;
const PNG_MAGIC = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

/** The PNG signature and IHDR (ISO/IEC 15948 §5.2, §11.2.2): eight magic bytes, then IHDR with width and height. */
function checkSignaturePng(png: Buffer): void {
  if (png.length > MAX_SIGNATURE_PNG_BYTES) throw new SigningInputError('The drawn signature is too large.');
  if (png.length < 33 || !png.subarray(0, 8).equals(PNG_MAGIC) || png.toString('latin1', 12, 16) !== 'IHDR') {
    throw new SigningInputError('The drawn signature is not a PNG image.');
  }
  const width = png.readUInt32BE(16);
  const height = png.readUInt32BE(20);
  if (!width || !height || width > 4000 || height > 4000) throw new SigningInputError('The drawn signature has an unusable size.');
}

// ICU writes a narrow no-break space before AM/PM; the embedded fonts' latin subset reads better with a plain one (as values.ts does).
const plainSpaces = (s: string) => s.replace(/[\u202f\u00a0]/g, ' ');

function signedDate(at: Date, timeZone: string): string {
  return new Intl.DateTimeFormat('en-US', { timeZone, year: 'numeric', month: 'long', day: 'numeric' }).format(at);
}

function signedDateTime(at: Date, timeZone: string): string {
  const format = new Intl.DateTimeFormat('en-US', {
    timeZone,
    year: 'numeric',
    month: 'long',
    day: 'numeric',
    hour: 'numeric',
    minute: '2-digit',
    timeZoneName: 'short',
  });
  return plainSpaces(format.format(at));
}

function checkInput(input: SignedPdfInput) {
  const typedName = input.signature.typedName.replace(/\s+/g, ' ').trim();
  if (!typedName) throw new SigningInputError('The signer typed no name.');
  if (typedName.length > 200) throw new SigningInputError('The typed name is longer than 200 characters.');
  if (input.signature.imagePng) checkSignaturePng(input.signature.imagePng);
  if (!/^[0-9a-f]{64}$/i.test(input.issuedSha256)) throw new SigningInputError('The issued SHA-256 is not 64 hex digits.');
  const fields = signingFields(input.markdown);
  const role = input.signerRole ?? 'Customer';
  if (!fields.signatureRoles.includes(role)) throw new SigningInputError(`The document has no signature block for "${role}".`);
  const initials: Record<string, string> = {};
  for (const field of fields.initials) {
    const value = (input.initials[field.key] ?? '').replace(/\s+/g, '').trim();
    if (!value) throw new SigningInputError(`Initials are missing for "${field.heading ?? field.key}".`);
    if (value.length > MAX_INITIALS) throw new SigningInputError(`Initials for "${field.heading ?? field.key}" are longer than ${MAX_INITIALS} characters.`);
    initials[field.key] = value;
  }
  const unknown = Object.keys(input.initials).filter((k) => !fields.initials.some((f) => f.key === k));
  if (unknown.length) throw new SigningInputError(`The document has no initials box for ${unknown.map((k) => `"${k}"`).join(', ')}.`);
  return { typedName, role, fields, initials };
}

/** The signed PDF's bytes. Throws SigningInputError when the signer's input does not fit the document. */
export async function renderSignedPdf(input: SignedPdfInput): Promise<Buffer> {
  const { typedName, role, fields, initials } = checkInput(input);
  const timeZone = input.timeZone ?? 'UTC';
  const { signedAt } = input.signature;
  const fingerprintSha256 = certificateFingerprint(input.certificate.certificatePem);

  const unsigned = await renderPdf({
    markdown: input.markdown,
    title: input.title,
    company: input.company,
    documentLabel: input.documentLabel,
    createdAt: input.issuedAt,
    fill: {
      initials,
      signature: {
        role,
        typedName,
        imagePng: input.signature.imagePng ?? null,
        statement: `Signed electronically by ${typedName} on ${signedDate(signedAt, timeZone)}`,
        date: signedDateTime(signedAt, timeZone),
      },
    },
    beforeEnd: (doc) => {
      drawCertificatePages(doc, {
        company: input.company,
        title: input.title,
        documentLabel: input.documentLabel,
        issuedAt: input.issuedAt,
        issuedSha256: input.issuedSha256.toLowerCase(),
        issuedPageCount: doc.bufferedPageRange().count,
        signer: { typedName, signedAt, drawn: Boolean(input.signature.imagePng) },
        initials: fields.initials.map((f) => ({ key: f.key, heading: f.heading, initials: initials[f.key] })),
        trail: input.trail,
        fingerprintSha256,
      });
      // An invisible signature field on the certificate page; it must be added before doc.end().
      pdfkitAddPlaceholder({
        pdf: doc,
        pdfBuffer: Buffer.alloc(0),
        reason: `${input.documentLabel} signed electronically by ${typedName}`,
        contactInfo: '',
        name: input.company.name,
        location: '',
        signingTime: signedAt,
        signatureLength: SIGNATURE_LENGTH,
        appName: 'Guyline',
      });
    },
  });

  // A P12 signer object signs once, so each signing makes its own, under a throwaway passphrase.
  const passphrase = randomBytes(18).toString('base64url');
  const signer = new P12Signer(toP12(input.certificate.certificatePem, input.certificate.privateKeyPem, passphrase), { passphrase });
  return new SignPdf().sign(unsigned, signer, signedAt);
}
