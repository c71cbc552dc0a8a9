import { createCompanyCertificate, decryptPrivateKey, encryptPrivateKey } from '../documents/signing';
import type { Transaction } from '../db';
import { env } from '../env';
import { Organization } from '../models';

/**
 * Gives the company its own signing certificate when it has none yet (new companies get one at
 * sign-up); the private key is stored encrypted with SIGNING_KEY_SECRET.
 */
export async function ensureCompanyCertificate(organizationId: string, transaction?: Transaction) {
  const org = (await Organization.findByPk(organizationId, { transaction, lock: transaction ? transaction.LOCK.UPDATE : undefined }))!;
  if (org.certificatePem && org.privateKeyEncrypted) return org;
  const cert = createCompanyCertificate(org.name);
  org.certificatePem = cert.certificatePem;
  org.certificateFingerprint = cert.fingerprintSha256;
  org.privateKeyEncrypted = encryptPrivateKey(cert.privateKeyPem, env.SIGNING_KEY_SECRET);
  await org.save({ transaction });
  return org;
}

export function companySigningKey(org: Organization) {
  if (!org.certificatePem || !org.privateKeyEncrypted) throw new Error('The company has no signing certificate yet');
  return { certificatePem: org.certificatePem, privateKeyPem: decryptPrivateKey(org.privateKeyEncrypted, env.SIGNING_KEY_SECRET) };
}
