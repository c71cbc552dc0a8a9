import type { Request } from 'express';
import type { Transaction } from '../db';
import { AuditLog } from '../models';

export interface AuditEntry {
  organizationId: string;
  actorUserId: string | null;
  action: string;
  subjectType: string;
  subjectId: string | null;
  data?: Record<string, unknown>;
}

/** Writes one audit row in the caller's transaction. */
export async function audit(entry: AuditEntry, req: Request | null, transaction: Transaction) {
  await AuditLog.create({ ...entry, data: entry.data ?? {}, ip: req?.ip ?? null }, { transaction });
}
