/**
 * The company's own signing certificate: a self-signed X.509 certificate made when the company
 * is created, its private key kept encrypted at rest with a key from the settings, and turned
 * into a short-lived P12 for @signpdf's signer at signing time.
 */
import { createCipheriv, createDecipheriv, createHash, generateKeyPairSync, randomBytes, scryptSync } from 'node:crypto';
import forge from 'node-forge';

export interface CompanyCertificate {
  certificatePem: string;
  privateKeyPem: string;
  /** SHA-256 of the certificate's DER bytes, lowercase hex without separators. */
  fingerprintSha256: string;
}

/** SHA-256 of a PEM certificate's DER bytes, lowercase hex. */
export function certificateFingerprint(certificatePem: string): string {
  const der = forge.asn1.toDer(forge.pki.certificateToAsn1(forge.pki.certificateFromPem(certificatePem))).getBytes();
  return createHash('sha256').update(Buffer.from(der, 'binary')).digest('hex');
}

/**
 * A self-signed certificate whose subject is the company (CN and O), good for signing
 * documents only. The RSA key comes from node:crypto (OpenSSL), which is far faster than
 * forge's pure-JavaScript key generation; forge builds and signs the certificate.
 */
export function createCompanyCertificate(companyName: string, opts: { years?: number } = {}): CompanyCertificate {
  const name = companyName.trim();
  if (!name) throw new Error('A signing certificate needs the company name.');
  const years = opts.years ?? 10;
  if (!Number.isInteger(years) || years < 1 || years > 30) throw new Error('A signing certificate is valid for 1 to 30 years.');

  const { privateKey: privateKeyPem } = generateKeyPairSync('rsa', {
    modulusLength: 2048,
    publicKeyEncoding: { type: 'spki', format: 'pem' },
    privateKeyEncoding: { type: 'pkcs8', format: 'pem' },
  });
  const privateKey = forge.pki.privateKeyFromPem(privateKeyPem) as forge.pki.rsa.PrivateKey;
  const publicKey = forge.pki.setRsaPublicKey(privateKey.n, privateKey.e);

  const cert = forge.pki.createCertificate();
  cert.publicKey = publicKey;
  // A positive 128-bit serial (RFC 5280 §4.1.2.2: positive, at most 20 octets).
  const serial = randomBytes(16);
  serial[0] &= 0x7f;
  serial[0] |= 0x10;
  cert.serialNumber = serial.toString('hex');
  const now = new Date();
  // A minute back, so a verifier whose clock runs slightly behind does not see "not yet valid".
  cert.validity.notBefore = new Date(now.getTime() - 60_000);
  const notAfter = new Date(now);
  notAfter.setUTCFullYear(notAfter.getUTCFullYear() + years);
  cert.validity.notAfter = notAfter;
  const subject = [
    { name: 'commonName', value: name },
    { name: 'organizationName', value: name },
  ];
  cert.setSubject(subject);
  cert.setIssuer(subject);
  cert.setExtensions([
    { name: 'basicConstraints', cA: false, critical: true },
    { name: 'keyUsage', critical: true, digitalSignature: true, nonRepudiation: true },
    { name: 'subjectKeyIdentifier' },
  ]);
  cert.sign(privateKey, forge.md.sha256.create());

  const certificatePem = forge.pki.certificateToPem(cert);
  return { certificatePem, privateKeyPem, fingerprintSha256: certificateFingerprint(certificatePem) };
}

/*
 * The encrypted private key is one printable string:
 *   gl1.<salt>.<iv>.<tag>.<ciphertext>   (base64url parts)
 * AES-256-GCM with a key derived from the secret by scrypt over a random salt. The version
 * prefix is authenticated too (GCM additional data), so no part can be swapped or altered.
 */
const VERSION = 'gl1';
// scrypt's cost parameters (RFC 7914): N = 2^15, r = 8, p = 1, about 32 MiB and a few tens of ms.
const SCRYPT = { N: 1 << 15, r: 8, p: 1, maxmem: 64 * 1024 * 1024 };

function keyFrom(secret: string, salt: Buffer): Buffer {
  if (!secret) throw new Error('The key-encryption secret is empty.');
  return scryptSync(secret, salt, 32, SCRYPT);
}

export function encryptPrivateKey(pem: string, secret: string): string {
  const salt = randomBytes(16);
  const iv = randomBytes(12);
  const cipher = createCipheriv('aes-256-gcm', keyFrom(secret, salt), iv);
  cipher.setAAD(Buffer.from(VERSION));
  const ciphertext = Buffer.concat([cipher.update(pem, 'utf8'), cipher.final()]);
  const tag = cipher.getAuthTag();
  return [VERSION, salt, iv, tag, ciphertext].map((p) => (typeof p === 'string' ? p : p.toString('base64url'))).join('.');
}

/** Throws when the secret is wrong or any part of the blob was changed. */
export function decryptPrivateKey(blob: string, secret: string): string {
  const parts = blob.split('.');
  if (parts.length !== 5 || parts[0] !== VERSION) throw new Error('The encrypted private key is not in a format this version reads.');
  const [salt, iv, tag, ciphertext] = parts.slice(1).map((p) => Buffer.from(p, 'base64url'));
  if (salt.length !== 16 || iv.length !== 12 || tag.length !== 16) throw new Error('The encrypted private key is damaged.');
  const decipher = createDecipheriv('aes-256-gcm', keyFrom(secret, salt), iv);
  decipher.setAAD(Buffer.from(VERSION));
  decipher.setAuthTag(tag);
  try {
    return Buffer.concat([decipher.update(ciphertext), decipher.final()]).toString('utf8');
  } catch {
    throw new Error('The private key could not be decrypted: the secret is wrong or the stored key was altered.');
  }
}

/** The certificate and key as PKCS#12 bytes, for @signpdf/signer-p12. */
export function toP12(certificatePem: string, privateKeyPem: string, passphrase: string): Buffer {
  const cert = forge.pki.certificateFromPem(certificatePem);
  const key = forge.pki.privateKeyFromPem(privateKeyPem);
  const p12 = forge.pkcs12.toPkcs12Asn1(key, [cert], passphrase, { algorithm: 'aes256', friendlyName: 'signing' });
  return Buffer.from(forge.asn1.toDer(p12).getBytes(), 'binary');
}
