/**
 * The company's own signing certificate: a self-signed X.509 certificate made when the company
 * is created, its private key kept encrypted at rest with a key from the settings, and turned
 * into a short-lived P12 for @signpdf's signer at signing time.
 */
import { createCipheriv, createDecipheriv, createHash, generateKeyPair, generateKeyPairSync, randomBytes, scrypt, scryptSync, sign } from 'node:crypto';
import { promisify } from 'node:util';
import forge from 'node-forge';

const RSA_KEY = {
  modulusLength: 2048,
  publicKeyEncoding: { type: 'spki', format: 'pem' },
  privateKeyEncoding: { type: 'pkcs8', format: 'pem' },
} as const;

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
  const { privateKey: privateKeyPem } = generateKeyPairSync('rsa', RSA_KEY);
  const privateKey = forge.pki.privateKeyFromPem(privateKeyPem) as forge.pki.rsa.PrivateKey;
  const cert = unsignedCertificate(companyName, opts.years, forge.pki.setRsaPublicKey(privateKey.n, privateKey.e));
  cert.sign(privateKey, forge.md.sha256.create());

  const certificatePem = forge.pki.certificateToPem(cert);
  return { certificatePem, privateKeyPem, fingerprintSha256: certificateFingerprint(certificatePem) };
}

// forge's own (node-forge lib/x509.js), which @types/node-forge leaves out.
const forgeTbs = forge.pki as unknown as { getTBSCertificate(cert: forge.pki.Certificate): forge.asn1.Asn1 };

/** The certificate before its signature: subject, validity, serial and extensions. */
function unsignedCertificate(companyName: string, yearsValid: number | undefined, publicKey: forge.pki.PublicKey) {
  const name = companyName.trim();
  if (!name) throw new Error('A signing certificate needs the company name.');
  const years = yearsValid ?? 10;
  if (!Number.isInteger(years) || years < 1 || years > 30) throw new Error('A signing certificate is valid for 1 to 30 years.');

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
  return cert;
}

/**
 * The same certificate made without holding the event loop (sign-up makes one): the RSA key, the
 * certificate's signature and the key-encryption key (scrypt) are all computed on libuv's thread
 * pool by node:crypto; forge only lays out the certificate (a few milliseconds). Signing with
 * forge's pure-JavaScript RSA took a quarter of a second of the event loop.
 */
export async function generateCompanyCertificate(companyName: string, secret: string, opts: { years?: number } = {}) {
  if (!secret) throw new Error('The key-encryption secret is empty.');
  const { privateKey: privateKeyPem, publicKey: publicKeyPem } = await promisify(generateKeyPair)('rsa', RSA_KEY);
  const cert = unsignedCertificate(companyName, opts.years, forge.pki.publicKeyFromPem(publicKeyPem));
  // What forge's cert.sign does, with the RSA signature (PKCS#1 v1.5 over SHA-256) from node:crypto.
  cert.signatureOid = cert.siginfo.algorithmOid = forge.pki.oids.sha256WithRSAEncryption;
  cert.tbsCertificate = forgeTbs.getTBSCertificate(cert);
  const tbs = Buffer.from(forge.asn1.toDer(cert.tbsCertificate).getBytes(), 'binary');
  const signature = await new Promise<Buffer>((resolve, reject) => sign('sha256', tbs, privateKeyPem, (err, sig) => (err ? reject(err) : resolve(sig))));
  cert.signature = signature.toString('binary');
  const der = Buffer.from(forge.asn1.toDer(forge.pki.certificateToAsn1(cert)).getBytes(), 'binary');

  const salt = randomBytes(16);
  const key = await new Promise<Buffer>((resolve, reject) => scrypt(secret, salt, 32, SCRYPT, (err, k) => (err ? reject(err) : resolve(k))));
  return {
    certificatePem: forge.pki.certificateToPem(cert),
    privateKeyPem,
    fingerprintSha256: createHash('sha256').update(der).digest('hex'),
    privateKeyEncrypted: sealPrivateKey(privateKeyPem, key, salt),
  };
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
  return sealPrivateKey(pem, keyFrom(secret, salt), salt);
}

function sealPrivateKey(pem: string, key: Buffer, salt: Buffer): string {
  if (key.length !== 32) throw new Error('The key-encryption key must be 32 bytes.');
  const iv = randomBytes(12);
  const cipher = createCipheriv('aes-256-gcm', key, iv);
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
