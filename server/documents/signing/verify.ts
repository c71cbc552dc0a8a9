/**
 * Our own check of a signed PDF, independent of @signpdf: find the last signature's /ByteRange
 * and /Contents, hash the signed ranges, compare the hash with the message digest in the
 * PKCS#7 signed attributes, and check the RSA signature over those attributes with the
 * certificate carried in the PKCS#7 (node-forge). The certificate is self-signed, so trust comes
 * from comparing its fingerprint with the one the company stored, not from a chain.
 */
import { createHash } from 'node:crypto';
import forge from 'node-forge';

export interface SignatureCheck {
  /** The PDF holds a signature this check could read. */
  signed: boolean;
  /** The signed bytes hash to the signed digest, the signature over it is valid, and (when asked) the certificate is the expected one. */
  intact: boolean;
  /** The signed ranges run from the first byte to the last: nothing was appended after signing. */
  coversWholeDocument: boolean;
  /** signed && intact && coversWholeDocument: what a "verified" badge should rest on. */
  valid: boolean;
  signerCommonName?: string;
  /** SHA-256 of the signing certificate's DER bytes, lowercase hex. */
  fingerprintSha256?: string;
  /** The signing time from the signed attributes. */
  signedAt?: Date;
  problem?: string;
}

// Object identifiers: RFC 5652 (CMS) §11 for the attributes, RFC 5754 / RFC 8017 for the algorithms.
const OID = {
  data: '1.2.840.113549.1.7.1',
  contentType: '1.2.840.113549.1.9.3',
  messageDigest: '1.2.840.113549.1.9.4',
  signingTime: '1.2.840.113549.1.9.5',
};
const DIGESTS: Record<string, 'sha1' | 'sha256' | 'sha384' | 'sha512'> = {
  '1.3.14.3.2.26': 'sha1',
  '2.16.840.1.101.3.4.2.1': 'sha256',
  '2.16.840.1.101.3.4.2.2': 'sha384',
  '2.16.840.1.101.3.4.2.3': 'sha512',
};
const RSA_SIGNATURES = new Set([
  '1.2.840.113549.1.1.1', // rsaEncryption
  '1.2.840.113549.1.1.5', // sha1WithRSAEncryption
  '1.2.840.113549.1.1.11', // sha256WithRSAEncryption
  '1.2.840.113549.1.1.12', // sha384WithRSAEncryption
  '1.2.840.113549.1.1.13', // sha512WithRSAEncryption
]);

interface SignerInfoCapture {
  serial: string;
  digestAlgorithm: string;
  signatureAlgorithm: string;
  signature: string;
  authenticatedAttributes?: forge.asn1.Asn1[];
}

type Asn1Value = forge.asn1.Asn1[];

// fromDer's options object, which @types/node-forge leaves out (node-forge lib/asn1.js).
const forgeAsn1 = forge.asn1 as unknown as {
  fromDer(bytes: forge.util.ByteStringBuffer, options: { parseAllBytes: boolean }): forge.asn1.Asn1;
};

const { Class, Type } = forge.asn1;
const isUniversal = (node: forge.asn1.Asn1 | undefined, type: number) => node?.tagClass === Class.UNIVERSAL && node.type === type;

/**
 * RFC 5652 §5.3 SignerInfo, read by hand: node-forge parses the certificates of a SignedData
 * but not its signers (its signer validator is not exported).
 *   SEQUENCE { version, SEQUENCE { issuer, serialNumber }, digestAlgorithm,
 *              [0] IMPLICIT signedAttrs OPTIONAL, signatureAlgorithm, signature OCTET STRING, ... }
 */
function readSignerInfo(node: forge.asn1.Asn1): SignerInfoCapture | null {
  if (!isUniversal(node, Type.SEQUENCE)) return null;
  const parts = node.value as Asn1Value;
  const [, issuerAndSerial, digestAlgorithm] = parts;
  let i = 3;
  let authenticatedAttributes: forge.asn1.Asn1[] | undefined;
  if (parts[i]?.tagClass === Class.CONTEXT_SPECIFIC && parts[i].type === 0) authenticatedAttributes = parts[i++].value as Asn1Value;
  const signatureAlgorithm = parts[i];
  const signature = parts[i + 1];
  const serial = (issuerAndSerial?.value as Asn1Value | undefined)?.[1];
  const digestOid = (digestAlgorithm?.value as Asn1Value | undefined)?.[0];
  const signatureOid = (signatureAlgorithm?.value as Asn1Value | undefined)?.[0];
  if (!isUniversal(serial, Type.INTEGER) || !isUniversal(digestOid, Type.OID) || !isUniversal(signatureOid, Type.OID) || !isUniversal(signature, Type.OCTETSTRING)) {
    return null;
  }
  return {
    serial: serial!.value as string,
    digestAlgorithm: digestOid!.value as string,
    signatureAlgorithm: signatureOid!.value as string,
    signature: signature!.value as string,
    authenticatedAttributes,
  };
}

function attribute(attrs: forge.asn1.Asn1[], oid: string): forge.asn1.Asn1 | undefined {
  for (const attr of attrs) {
    const [type, values] = attr.value as Asn1Value;
    if (type && forge.asn1.derToOid(type.value as string) === oid) return (values?.value as Asn1Value)?.[0];
  }
  return undefined;
}

function lastByteRange(bytes: Buffer): [number, number, number, number] | null {
  const text = bytes.toString('latin1');
  const re = /\/ByteRange\s*\[\s*(\d+)\s+(\d+)\s+(\d+)\s+(\d+)\s*\]/g;
  let last: RegExpExecArray | null = null;
  for (let m = re.exec(text); m; m = re.exec(text)) last = m;
  return last ? [Number(last[1]), Number(last[2]), Number(last[3]), Number(last[4])] : null;
}

export function verifySignedPdf(bytes: Buffer, opts: { expectedFingerprintSha256?: string } = {}): SignatureCheck {
  const unsigned = (problem: string): SignatureCheck => ({ signed: false, intact: false, coversWholeDocument: false, valid: false, problem });
  const range = lastByteRange(bytes);
  if (!range) return unsigned('The PDF holds no signature.');
  const [start, firstLength, secondStart, secondLength] = range;
  if (start !== 0 || firstLength <= 0 || secondStart <= firstLength + 1 || secondStart + secondLength > bytes.length) {
    return unsigned('The signature byte range does not fit the file.');
  }
  if (bytes[firstLength] !== 0x3c /* < */ || bytes[secondStart - 1] !== 0x3e /* > */) {
    return unsigned('The gap in the signature byte range is not the signature value.');
  }
  const hex = bytes.subarray(firstLength + 1, secondStart - 1).toString('latin1');
  if (!/^[0-9a-fA-F]+$/.test(hex) || hex.length % 2) return unsigned('The signature value is not a hex string.');
  const coversWholeDocument = secondStart + secondLength === bytes.length;

  let signer: SignerInfoCapture;
  let certificate: forge.pki.Certificate | undefined;
  try {
    // The value is zero-padded to the placeholder's size: parse one DER object and ignore the rest.
    const der = forge.util.createBuffer(Buffer.from(hex, 'hex').toString('binary'));
    const message = forge.pkcs7.messageFromAsn1(forgeAsn1.fromDer(der, { parseAllBytes: false })) as forge.pkcs7.PkcsSignedData & {
      rawCapture?: { signerInfos?: forge.asn1.Asn1[] };
    };
    const infos = message.rawCapture?.signerInfos ?? [];
    if (infos.length !== 1) return unsigned(`The signature holds ${infos.length} signers; one was expected.`);
    const capture = readSignerInfo(infos[0]);
    if (!capture) return unsigned('The signer information cannot be read.');
    signer = capture;
    const serial = forge.util.bytesToHex(capture.serial).replace(/^(00)+/, '');
    certificate = message.certificates.find((c) => c.serialNumber.replace(/^(00)+/, '') === serial);
  } catch (error) {
    return unsigned(`The signature value is not a PKCS#7 signature (${(error as Error).message}).`);
  }
  if (!certificate) return unsigned('The signature does not carry the certificate that made it.');

  const certificateDer = Buffer.from(forge.asn1.toDer(forge.pki.certificateToAsn1(certificate)).getBytes(), 'binary');
  const fingerprintSha256 = createHash('sha256').update(certificateDer).digest('hex');
  const cn = certificate.subject.getField('CN') as { value?: string } | null;
  const base = { signed: true, coversWholeDocument, signerCommonName: cn?.value, fingerprintSha256 };
  const broken = (problem: string, extra: Partial<SignatureCheck> = {}): SignatureCheck => ({ ...base, ...extra, intact: false, valid: false, problem });

  const digestName = DIGESTS[forge.asn1.derToOid(signer.digestAlgorithm)];
  if (!digestName) return broken('The signature uses a digest algorithm this check does not know.');
  if (!RSA_SIGNATURES.has(forge.asn1.derToOid(signer.signatureAlgorithm))) return broken('The signature is not an RSA signature.');
  const attrs = signer.authenticatedAttributes;
  if (!attrs?.length) return broken('The signature has no signed attributes.');
  const contentType = attribute(attrs, OID.contentType);
  if (!contentType || forge.asn1.derToOid(contentType.value as string) !== OID.data) return broken('The signed content type is not data.');
  const signedDigest = attribute(attrs, OID.messageDigest)?.value;
  const timeAttr = attribute(attrs, OID.signingTime);
  const signedAt = timeAttr?.type === forge.asn1.Type.UTCTIME ? forge.asn1.utcTimeToDate(timeAttr.value as string) : undefined;
  if (typeof signedDigest !== 'string') return broken('The signed attributes hold no message digest.', { signedAt });

  const signedBytes = Buffer.concat([bytes.subarray(0, firstLength), bytes.subarray(secondStart, secondStart + secondLength)]);
  const digest = createHash(digestName).update(signedBytes).digest();
  if (!digest.equals(Buffer.from(signedDigest, 'binary'))) {
    return broken('The signed bytes do not match the signed digest: the PDF was changed after signing.', { signedAt });
  }

  // RFC 5652 §5.4: the signature is over the DER of the attributes as a SET OF, not as [0].
  const attributesDer = forge.asn1.toDer(forge.asn1.create(forge.asn1.Class.UNIVERSAL, forge.asn1.Type.SET, true, attrs)).getBytes();
  const attributesDigest = createHash(digestName).update(Buffer.from(attributesDer, 'binary')).digest('binary');
  let signatureOk = false;
  try {
    signatureOk = (certificate.publicKey as forge.pki.rsa.PublicKey).verify(attributesDigest, signer.signature);
  } catch {
    signatureOk = false;
  }
  if (!signatureOk) return broken("The signature does not verify with the certificate's key.", { signedAt });

  if (opts.expectedFingerprintSha256 && opts.expectedFingerprintSha256.replace(/:/g, '').toLowerCase() !== fingerprintSha256) {
    return broken("The PDF is signed, but not with the company's certificate.", { signedAt });
  }
  return { ...base, signedAt, intact: true, valid: coversWholeDocument, problem: coversWholeDocument ? undefined : 'Bytes were added after the signed part.' };
}
