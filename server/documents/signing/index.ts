/**
 * Signing an issued document: the company's certificate and its encrypted private key, the
 * signed PDF (initials and signature in their boxes, a certificate page, a PKCS#7 signature
 * over the whole file) and an independent check of a signed PDF. No HTTP, no database.
 */
export {
  certificateFingerprint,
  createCompanyCertificate,
  decryptPrivateKey,
  encryptPrivateKey,
  generateCompanyCertificate,
  toP12,
  type CompanyCertificate,
} from './certificate';
export type { TrailEvent } from './certificatePage';
export { signingFields, type InitialsField, type SigningFields } from './fields';
export { renderSignedPdf, SIGNATURE_LENGTH, SigningInputError, type SignedPdfInput } from './signedPdf';
export { verifySignedPdf, type SignatureCheck } from './verify';
