import { createHash } from 'node:crypto';
import type { Transaction } from '../db';
import { StoredFile } from '../models';

/**
 * Keeps file bytes in PostgreSQL (stored_files). Callers use only these functions, so an object
 * store can replace the table later without touching them.
 */
export async function storeFile(
  input: { organizationId: string; filename: string; contentType: string; data: Buffer; purpose: string },
  transaction?: Transaction,
) {
  const sha256 = createHash('sha256').update(input.data).digest('hex');
  return StoredFile.create({ ...input, size: input.data.length, sha256 }, { transaction });
}

/** Loads a file's bytes, scoped to the organization; null when missing. */
export async function readFile(organizationId: string, id: string) {
  return StoredFile.unscoped().findOne({ where: { id, organizationId } });
}

export async function deleteFile(organizationId: string, id: string, transaction?: Transaction) {
  await StoredFile.destroy({ where: { id, organizationId }, transaction });
}
