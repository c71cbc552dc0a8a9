import { Op } from 'sequelize';
import type { Transaction } from '../db';
import { Document, SigningRequest } from '../models';

/**
 * Where a booking's rental agreement stands, read one way for the office, the customer's pages
 * and the invoice rule:
 * - none: no agreement issued;
 * - awaiting: the current version is out and nothing was ever signed;
 * - signed: the current version is the one the customer signed;
 * - changed_since_signed: the customer signed an earlier version, and the booking changed since
 *   (a new version replaced it): the current version needs a new signature before the next invoice.
 */
export type AgreementState =
  | { state: 'none' }
  | { state: 'awaiting'; current: Document }
  | { state: 'signed'; current: Document; signed: Document }
  | { state: 'changed_since_signed'; current: Document; lastSigned: Document };

export async function agreementStateOf(bookingId: string, transaction?: Transaction): Promise<AgreementState> {
  const current = await Document.findOne({
    where: { bookingId, kind: 'rental_agreement', status: 'issued' }, order: [['version', 'DESC']], transaction,
  });
  const signedRequests = await SigningRequest.findAll({
    where: { bookingId, status: 'signed', signedDocumentId: { [Op.ne]: null } }, order: [['signedAt', 'DESC']], transaction,
  });
  const ofCurrent = current ? signedRequests.find((r) => r.documentId === current.id) : undefined;
  const signedDoc = async (r: SigningRequest) => (await Document.findByPk(r.signedDocumentId!, { transaction }))!;
  if (current && ofCurrent) return { state: 'signed', current, signed: await signedDoc(ofCurrent) };
  if (signedRequests.length > 0) {
    const lastSigned = await signedDoc(signedRequests[0]);
    // A signed booking with no current agreement (voided) is still "changed": it needs a new one.
    return current ? { state: 'changed_since_signed', current, lastSigned } : { state: 'none' };
  }
  return current ? { state: 'awaiting', current } : { state: 'none' };
}
