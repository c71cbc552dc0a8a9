import type { AgreementState } from '../services/agreementState';
import type { AgreementStatus, ClauseRow, DocumentRow, DocumentSendRow, TemplateName, TemplateRow } from '../../shared/schemas/documents';
import type { CompanyClause, Document, DocumentSend, DocumentTemplate, User } from '../models';
import { can } from '../policies';

export function presentSend(s: DocumentSend): DocumentSendRow {
  return {
    id: s.id, to: s.to, status: s.status, attempts: s.attempts, error: s.error ?? null,
    sentAt: s.sentAt ? s.sentAt.toISOString() : null, createdAt: s.createdAt.toISOString(),
  };
}

export function presentDocument(doc: Document, actor: User, extra: { issuedBy: string | null; sends: DocumentSend[] }): DocumentRow {
  return {
    id: doc.id,
    kind: doc.kind,
    number: doc.number,
    version: doc.version,
    status: doc.status,
    sha256: doc.sha256,
    bookingId: doc.bookingId,
    createdAt: doc.createdAt.toISOString(),
    issuedBy: extra.issuedBy,
    sends: extra.sends.map(presentSend),
    can: { send: can(actor, 'document', 'send', doc) },
  };
}

export function presentTemplate(name: TemplateName, source: string, own: DocumentTemplate | null, variables: string[]): TemplateRow {
  return { name, source, isDefault: !own, updatedAt: own ? own.updatedAt.toISOString() : null, variables };
}

export function presentClause(c: CompanyClause): ClauseRow {
  return { id: c.id, key: c.key, title: c.title, body: c.body, requiresInitials: c.requiresInitials, position: c.position, active: c.active, updatedAt: c.updatedAt.toISOString() };
}

/** The agreement's state for the office: numbers only, the documents themselves are in the list. */
export function presentAgreementStatus(a: AgreementState): AgreementStatus {
  switch (a.state) {
    case 'none':
      return { state: 'none' };
    case 'awaiting':
      return { state: 'awaiting', currentNumber: a.current.number };
    case 'signed':
      return { state: 'signed', currentNumber: a.current.number, signedNumber: a.signed.number };
    case 'changed_since_signed':
      return { state: 'changed_since_signed', currentNumber: a.current.number, lastSignedNumber: a.lastSigned.number };
  }
}
