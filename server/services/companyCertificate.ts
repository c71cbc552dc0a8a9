import { decryptPrivateKey, generateCompanyCertificate } from '../documents/signing';
import type { Transaction } from '../db';
import { env } from '../env';
import { Organization } from '../models';

/**
 * Gives the company its own signing certificate when it has none yet (a new company's is made by
 * the `company-certificate` job queued at sign-up; the first agreement sent makes it otherwise);
 * the private key is stored encrypted with SIGNING_KEY_SECRET. The key and the key-encryption key
 * are made on libuv's thread pool, never on the event loop.
 */
export async function ensureCompanyCertificate(organizationId: string, transaction?: Transaction) {
  const org = (await Organization.findByPk(organizationId, { transaction, lock: transaction ? transaction.LOCK.UPDATE : undefined }))!;
  if (org.certificatePem && org.privateKeyEncrypted) return org;
  const cert = await generateCompanyCertificate(org.name, env.SIGNING_KEY_SECRET);
  org.certificatePem = cert.certificatePem;
  org.certificateFingerprint = cert.fingerprintSha256;
  org.privateKeyEncrypted = cert.privateKeyEncrypted;
  await org.save({ transaction });
  return org;
}

export function companySigningKey(org: Organization) {
  if (!org.certificatePem || !org.privateKeyEncrypted) throw new Error('The company has no signing certificate yet');
  return { certificatePem: org.certificatePem, privateKeyPem: decryptPrivateKey(org.privateKeyEncrypted, env.SIGNING_KEY_SECRET) };
}
