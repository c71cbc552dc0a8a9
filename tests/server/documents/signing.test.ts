/**
 * The signing engine, checked with tools from outside the project: pdfsig(1) and pdfimages(1)
 * from Debian 12's poppler-utils 22.12, qpdf 11.3 (`qpdf --check`), pdffonts, Mozilla's pdf.js,
 * OpenSSL 3.0 (X509Certificate in node:crypto, `openssl pkcs12`).
 */
import { execFile } from 'node:child_process';
import { createPrivateKey, X509Certificate } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { deflateSync, crc32 } from 'node:zlib';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadDefaultClauses, loadDefaultTemplate, renderDocument, type RenderedDocument } from '../../../server/documents';
import {
  createCompanyCertificate,
  decryptPrivateKey,
  encryptPrivateKey,
  renderSignedPdf,
  signingFields,
  SigningInputError,
  toP12,
  verifySignedPdf,
  type CompanyCertificate,
  type SignedPdfInput,
} from '../../../server/documents/signing';
import { issuedAt, organization, sampleValues } from './fixtures';
import { flat, pdffonts, pdfjsText, qpdfCheck } from './pdfTools';

const run = promisify(execFile);

async function withFile<T>(bytes: Buffer, name: string, fn: (file: string) => Promise<T>): Promise<T> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'guyline-sign-'));
  const file = path.join(dir, name);
  fs.writeFileSync(file, bytes);
  try {
    return await fn(file);
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

/** pdfsig(1) output; it exits 0 whether or not the signature is valid, so callers read the text. */
const pdfsig = (pdf: Buffer) => withFile(pdf, 'signed.pdf', async (file) => (await run('/usr/bin/pdfsig', [file])).stdout);

/** pdfimages -list: one row per image (poppler-utils). */
const pdfimages = (pdf: Buffer) =>
  withFile(pdf, 'signed.pdf', async (file) => (await run('/usr/bin/pdfimages', ['-list', file])).stdout.split('\n').slice(2).filter((l) => l.trim()));

/**
 * A signature as signature_pad exports it: a PNG with a transparent background and one dark
 * stroke (a sine wave). Written by hand after the PNG spec (ISO/IEC 15948: signature, IHDR
 * with colour type 6 = RGBA, IDAT of filtered scanlines, IEND; CRC-32 over type and data).
 */
function signaturePng(width = 300, height = 90): Buffer {
  const raw = Buffer.alloc((width * 4 + 1) * height);
  for (let x = 10; x < width - 10; x++) {
    const yc = Math.round(height / 2 + Math.sin(x / 18) * (height / 3));
    for (let y = yc - 1; y <= yc + 1; y++) {
      const at = y * (width * 4 + 1) + 1 + x * 4;
      raw.writeUInt32BE(0x1c3f7aff, at);
    }
  }
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
    const out = Buffer.alloc(8 + data.length + 4);
    out.writeUInt32BE(data.length, 0);
    body.copy(out, 4);
    out.writeUInt32BE(crc32(body), 8 + data.length);
    return out;
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr.set([8, 6, 0, 0, 0], 8);
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), chunk('IDAT', deflateSync(raw)), chunk('IEND', Buffer.alloc(0))]);
}

const clauses = loadDefaultClauses();
const values = sampleValues('rental_agreement');
const title = `${values.document.title} ${values.document.number}`;
const INITIALS: Record<string, string> = {
  'buried-utilities': 'JH',
  'weather-and-wind': 'JAH',
  'damage-and-loss': 'J.H.',
  cancellation: 'JuH',
};
const TRAIL: SignedPdfInput['trail'] = [
  { at: new Date('2027-04-21T14:00:02.000Z'), event: 'Sent for signature', ip: '198.51.100.23', userAgent: 'Mozilla/5.0 (X11; Linux x86_64) Firefox/128.0' },
  {
    at: new Date('2027-04-22T15:58:40.000Z'),
    event: 'Opened',
    ip: '203.0.113.77',
    userAgent: 'Mozilla/5.0 (iPhone; CPU iPhone OS 17_4 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.4 Mobile/15E148 Safari/604.1',
  },
  { at: new Date('2027-04-22T15:59:10.000Z'), event: 'Consented to electronic records', ip: '203.0.113.77', userAgent: 'Mobile Safari 17.4' },
  { at: new Date('2027-04-22T16:04:55.000Z'), event: 'Initialed', ip: '203.0.113.77', userAgent: 'Mobile Safari 17.4', detail: 'weather-and-wind' },
  { at: new Date('2027-04-22T16:05:31.000Z'), event: 'Signed', ip: '2001:db8:4:7::1a', userAgent: 'Mobile Safari 17.4' },
];
const signedAt = new Date('2027-04-22T16:05:31.000Z');

let certificate: CompanyCertificate;
let issued: RenderedDocument;
let typed: Buffer;

function input(overrides: Partial<SignedPdfInput> = {}): SignedPdfInput {
  return {
    markdown: issued.markdown,
    title,
    company: { name: organization.name },
    documentLabel: values.document.label,
    issuedAt,
    signature: { typedName: 'Juniper A. Hollowell', signedAt },
    initials: INITIALS,
    trail: TRAIL,
    issuedSha256: issued.sha256,
    certificate,
    timeZone: organization.timeZone,
    ...overrides,
  };
}

/** The same file with one byte inside the first signed range changed. */
function tamper(pdf: Buffer, find: string, replace: string): Buffer {
  expect(replace.length).toBe(find.length);
  const at = pdf.indexOf(find, 0, 'latin1');
  expect(at, `${find} is in the file`).toBeGreaterThan(0);
  const copy = Buffer.from(pdf);
  copy.write(replace, at, 'latin1');
  return copy;
}

beforeAll(async () => {
  certificate = createCompanyCertificate(organization.name);
  issued = await renderDocument({ template: loadDefaultTemplate('rental_agreement'), clauses, values, company: { name: organization.name }, issuedAt });
  typed = await renderSignedPdf(input());
});

describe('createCompanyCertificate', () => {
  it("makes a self-signed RSA 2048 certificate in the company's name, for signatures only, as OpenSSL reads it", () => {
    const x509 = new X509Certificate(certificate.certificatePem);
    // OpenSSL prints the subject one attribute a line.
    expect(x509.subject.split('\n')).toEqual(expect.arrayContaining([`CN=${organization.name}`, `O=${organization.name}`]));
    expect(x509.issuer).toBe(x509.subject);
    expect(x509.verify(x509.publicKey)).toBe(true);
    expect(x509.publicKey.asymmetricKeyDetails?.modulusLength).toBe(2048);
    expect(x509.ca).toBe(false);
    // OpenSSL's fingerprint256 is colon-separated upper-case hex of the same SHA-256.
    expect(x509.fingerprint256.replace(/:/g, '').toLowerCase()).toBe(certificate.fingerprintSha256);
    expect(x509.checkPrivateKey(createPrivateKey(certificate.privateKeyPem))).toBe(true);
    const years = (Date.parse(x509.validTo) - Date.parse(x509.validFrom)) / (365.25 * 24 * 3600 * 1000);
    expect(Math.round(years)).toBe(10);
  });

  it('gives the key usage digitalSignature and nonRepudiation (openssl x509 -text)', async () => {
    const text = await withFile(Buffer.from(certificate.certificatePem), 'cert.pem', async (file) => (await run('openssl', ['x509', '-in', file, '-noout', '-text'])).stdout);
    expect(text).toMatch(/X509v3 Key Usage: critical\s+Digital Signature, Non Repudiation\s/);
    expect(text).toContain('Public-Key: (2048 bit)');
  });

  it('makes a P12 that OpenSSL opens with the passphrase and refuses without it', async () => {
    const p12 = toP12(certificate.certificatePem, certificate.privateKeyPem, 'correct horse');
    await withFile(p12, 'company.p12', async (file) => {
      const { stdout } = await run('openssl', ['pkcs12', '-in', file, '-passin', 'pass:correct horse', '-nokeys', '-clcerts']);
      expect(stdout).toContain('BEGIN CERTIFICATE');
      await expect(run('openssl', ['pkcs12', '-in', file, '-passin', 'pass:wrong', '-nokeys'])).rejects.toThrow();
    });
  });

  it('refuses an empty company name', () => {
    expect(() => createCompanyCertificate('  ')).toThrow(/company name/);
  });
});

describe('encryptPrivateKey / decryptPrivateKey', () => {
  const secret = 'a-long-settings-secret-for-tests-only';

  it('round-trips, with a fresh salt and IV each time', () => {
    const a = encryptPrivateKey(certificate.privateKeyPem, secret);
    const b = encryptPrivateKey(certificate.privateKeyPem, secret);
    expect(a).not.toBe(b);
    expect(a).not.toContain('PRIVATE KEY');
    expect(a.split('.')).toHaveLength(5);
    expect(decryptPrivateKey(a, secret)).toBe(certificate.privateKeyPem);
    expect(decryptPrivateKey(b, secret)).toBe(certificate.privateKeyPem);
  });

  it('throws for a wrong secret and for any altered part', () => {
    const blob = encryptPrivateKey(certificate.privateKeyPem, secret);
    expect(() => decryptPrivateKey(blob, 'another secret')).toThrow(/could not be decrypted/);
    const parts = blob.split('.');
    for (let i = 1; i < parts.length; i++) {
      const altered = [...parts];
      const bytes = Buffer.from(altered[i], 'base64url');
      bytes[bytes.length >> 1] ^= 0x01;
      altered[i] = bytes.toString('base64url');
      expect(() => decryptPrivateKey(altered.join('.'), secret), `part ${i}`).toThrow();
    }
    expect(() => decryptPrivateKey(`gl9${blob.slice(3)}`, secret)).toThrow(/format/);
    expect(() => decryptPrivateKey(blob.split('.').slice(0, 4).join('.'), secret)).toThrow();
  });
});

describe('signingFields', () => {
  it("lists the agreement's initials boxes beside their clauses and the signature parties", () => {
    const fields = signingFields(issued.markdown);
    expect(fields.initials.map((f) => f.key).sort()).toEqual(Object.keys(INITIALS).sort());
    expect(fields.initials.find((f) => f.key === 'weather-and-wind')?.heading).toMatch(/^\d+\. Weather and wind$/);
    expect(fields.signatureRoles).toEqual(['Customer', 'For the company']);
  });
});

describe('renderSignedPdf with a typed signature', () => {
  it('is valid and covers the whole file by pdfsig', async () => {
    const out = await pdfsig(typed);
    expect(out).toContain('Signature is Valid');
    expect(out).toContain('Total document signed');
    expect(out).toContain(`Signer Certificate Common Name: ${organization.name}`);
    expect(out).toContain('adbe.pkcs7.detached');
    expect(out).toContain('SHA-256');
  });

  it('passes qpdf --check and embeds every font', async () => {
    const check = await qpdfCheck(typed);
    expect(check.code, check.output).toBe(0);
    const fonts = await pdffonts(typed);
    expect(fonts.length).toBeGreaterThan(0);
    for (const f of fonts) expect(f.emb, `${f.name} is not embedded`).toBe('yes');
    // The typed signature and the initials are set in the italic face.
    expect(fonts.some((f) => /IBMPlexSans-Italic/.test(f.name))).toBe(true);
  });

  it('holds the typed name, the initials and a certificate page with the hash, the trail and the fingerprint (pdf.js)', async () => {
    const { pages } = await pdfjsText(typed);
    const { pages: issuedPages } = await pdfjsText(issued.pdf);
    expect(pages.length).toBeGreaterThan(issuedPages.length);
    const text = flat(pages.join('\n'));
    expect(text).toContain('Juniper A. Hollowell');
    expect(text).toContain('Signed electronically by Juniper A. Hollowell on April 22, 2027');
    // 16:05 UTC is 11:05 in Chicago in April (CDT, UTC-5; IANA tz database).
    expect(pages.join('\n')).toContain('April 22, 2027 at 11:05 AM CDT');
    for (const initials of Object.values(INITIALS)) expect(text).toContain(initials);

    const certificatePages = pages.slice(issuedPages.length);
    const certificatePage = flat(certificatePages.join('\n'));
    expect(certificatePage).toContain('Signing certificate');
    expect(certificatePage).toContain(values.document.label);
    expect(certificatePage).toContain(issued.sha256);
    expect(certificatePage).toContain(certificate.fingerprintSha256);
    expect(certificatePage).toContain('Juniper A. Hollowell');
    for (const e of TRAIL) {
      expect(certificatePage).toContain(e.ip);
      expect(certificatePage).toContain(e.at.toISOString());
      expect(certificatePage).toContain(e.event);
    }
    certificatePages.forEach((page, i) => expect(flat(page)).toContain(`Signing certificate, page ${i + 1} of ${certificatePages.length}`));
  });

  it('keeps every issued page as issued apart from what the signer wrote into the boxes', async () => {
    const { pages } = await pdfjsText(typed);
    const { pages: issuedPages } = await pdfjsText(issued.pdf);
    const written = [
      'Signed electronically by Juniper A. Hollowell on April 22, 2027',
      'April 22, 2027 at 11:05 AM CDT',
      'Juniper A. Hollowell',
      ...Object.values(INITIALS),
    ];
    // pdf.js may join neighbouring text without a space, so compare without whitespace.
    const strip = (page: string) => written.reduce((s, w) => s.split(w.replace(/\s+/g, '')).join(''), page.replace(/\s+/g, ''));
    issuedPages.forEach((page, i) => expect(strip(pages[i]), `page ${i + 1}`).toBe(strip(page)));
    expect(flat(pages[issuedPages.length - 1])).toContain(`Page ${issuedPages.length} of ${issuedPages.length}`);
  });

  it('is intact by verifySignedPdf, and signed by the expected certificate', () => {
    const check = verifySignedPdf(typed, { expectedFingerprintSha256: certificate.fingerprintSha256 });
    expect(check).toMatchObject({ signed: true, intact: true, coversWholeDocument: true, valid: true, signerCommonName: organization.name });
    expect(check.problem).toBeUndefined();
    expect(check.signedAt?.toISOString()).toBe(signedAt.toISOString());
  });
});

describe('a signed PDF changed afterwards', () => {
  it('with one byte of the document information changed: pdfsig prints Digest Mismatch, verifySignedPdf says not intact', async () => {
    // The info dictionary's title is inside the first signed range (before /Contents).
    const forged = tamper(typed, '(Rental agreement RA-1042)', '(Rental agreement RA-1043)');
    const out = await pdfsig(forged);
    expect(out).toContain('Digest Mismatch');
    expect(out).not.toContain('Signature is Valid');
    const check = verifySignedPdf(forged);
    expect(check).toMatchObject({ signed: true, intact: false, valid: false });
    expect(check.problem).toMatch(/changed after signing/);
  });

  it('with one byte of a page content stream changed (after /Contents): both catch it', async () => {
    const contentsAt = typed.indexOf('/Contents <', 0, 'latin1');
    const streamAt = typed.indexOf('stream\n', typed.indexOf('>', contentsAt), 'latin1');
    expect(streamAt).toBeGreaterThan(contentsAt);
    const forged = Buffer.from(typed);
    forged[streamAt + 7 + 10] ^= 0x01;
    expect((await pdfsig(forged))).toContain('Digest Mismatch');
    expect(verifySignedPdf(forged).intact).toBe(false);
  });

  it('with bytes appended: the signed part is intact but does not cover the whole file', async () => {
    const appended = Buffer.concat([typed, Buffer.from('\n% appended after signing\n', 'latin1')]);
    const out = await pdfsig(appended);
    expect(out).not.toContain('Total document signed');
    const check = verifySignedPdf(appended);
    expect(check).toMatchObject({ signed: true, intact: true, coversWholeDocument: false, valid: false });
  });

  it('is flagged when signed with another certificate than the expected one', () => {
    const other = createCompanyCertificate('Another Tent Co.');
    const check = verifySignedPdf(typed, { expectedFingerprintSha256: other.fingerprintSha256 });
    expect(check).toMatchObject({ signed: true, intact: false, valid: false });
    expect(check.problem).toMatch(/not with the company's certificate/);
  });

  it('an unsigned PDF is not signed', () => {
    expect(verifySignedPdf(issued.pdf)).toMatchObject({ signed: false, intact: false, coversWholeDocument: false, valid: false });
  });
});

describe('renderSignedPdf with a drawn signature', () => {
  it('places the PNG (with its transparency) and is valid by pdfsig; a second signing with the same certificate works too', async () => {
    const drawn = await renderSignedPdf(input({ signature: { typedName: 'Juniper A. Hollowell', imagePng: signaturePng(), signedAt } }));
    const images = await pdfimages(drawn);
    // pdfimages lists the picture and its soft mask (the alpha channel) as two rows.
    expect(images.some((l) => /\bimage\s+300\s+90\b/.test(l))).toBe(true);
    expect(images.some((l) => /\bsmask\s+300\s+90\b/.test(l))).toBe(true);
    const out = await pdfsig(drawn);
    expect(out).toContain('Signature is Valid');
    expect(out).toContain('Total document signed');
    expect((await qpdfCheck(drawn)).code).toBe(0);
    const text = flat((await pdfjsText(drawn)).pages.join('\n'));
    expect(text).toContain('Signed electronically by Juniper A. Hollowell');
    expect(text).toContain('Drawn by the signer on the signing page');
    expect(verifySignedPdf(drawn, { expectedFingerprintSha256: certificate.fingerprintSha256 }).valid).toBe(true);
  });
});

describe('renderSignedPdf refuses input that does not fit the document', () => {
  it('a missing initial, an unknown box, an empty name, or no customer signature block', async () => {
    const { cancellation: _dropped, ...missing } = INITIALS;
    await expect(renderSignedPdf(input({ initials: missing }))).rejects.toThrow(SigningInputError);
    await expect(renderSignedPdf(input({ initials: missing }))).rejects.toThrow(/Cancellation/);
    await expect(renderSignedPdf(input({ initials: { ...INITIALS, gazebo: 'JH' } }))).rejects.toThrow(/"gazebo"/);
    await expect(renderSignedPdf(input({ signature: { typedName: '   ', signedAt } }))).rejects.toThrow(/no name/);
    await expect(renderSignedPdf(input({ markdown: '# Just a note\n\nNo signature here.', initials: {} }))).rejects.toThrow(/signature block/);
    const notPng = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"/>');
    await expect(renderSignedPdf(input({ signature: { typedName: 'Juniper A. Hollowell', imagePng: notPng, signedAt } }))).rejects.toThrow(/not a PNG/);
  });
});
