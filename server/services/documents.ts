import { Op } from 'sequelize';
import type { DocumentKind, TemplateName } from '../../shared/schemas/documents';
import { LOAD_FOR_SEATING, occupantLoads } from '../../shared/planner';
import {
  DOCUMENT_VARIABLES, EMAIL_VARIABLES, loadDefaultClauses, loadDefaultEmailTemplate, loadDefaultTemplate, validateEmailTemplate,
  validateTemplate, type Clause, type TemplateValidation,
} from '../documents';
import type { Transaction } from '../db';
import { CompanyClause, DocumentTemplate, Item, type BookingLine } from '../models';

export const KIND_OF_TEMPLATE: Record<TemplateName, { kind: DocumentKind; email: boolean }> = {
  'rental-agreement': { kind: 'rental_agreement', email: false },
  invoice: { kind: 'invoice', email: false },
  receipt: { kind: 'receipt', email: false },
  'credit-note': { kind: 'credit_note', email: false },
  'email-rental-agreement': { kind: 'rental_agreement', email: true },
  'email-invoice': { kind: 'invoice', email: true },
  'email-receipt': { kind: 'receipt', email: true },
  'email-credit-note': { kind: 'credit_note', email: true },
};

export const templateNameFor = (kind: DocumentKind, email = false) =>
  `${email ? 'email-' : ''}${kind.replace(/_/g, '-')}` as TemplateName;

export function defaultTemplateSource(name: TemplateName): string {
  const { kind, email } = KIND_OF_TEMPLATE[name];
  return email ? loadDefaultEmailTemplate(kind) : loadDefaultTemplate(kind);
}

/** The company's own copy of a template, or the shipped default. */
export async function templateSource(organizationId: string, name: TemplateName, transaction?: Transaction) {
  const own = await DocumentTemplate.findOne({ where: { organizationId, name }, transaction });
  return { source: own?.source ?? defaultTemplateSource(name), own };
}

export function variablesFor(name: TemplateName): string[] {
  return KIND_OF_TEMPLATE[name].email ? EMAIL_VARIABLES : DOCUMENT_VARIABLES;
}

export function checkTemplate(name: TemplateName, source: string): TemplateValidation {
  return KIND_OF_TEMPLATE[name].email ? validateEmailTemplate(source) : validateTemplate(source, { variables: DOCUMENT_VARIABLES });
}

export function checkClause(body: string): TemplateValidation {
  return validateTemplate(body, { variables: DOCUMENT_VARIABLES, context: 'clause' });
}

/** Gives a company its own copy of the default clause library the first time it is needed. */
export async function ensureClauseLibrary(organizationId: string, transaction?: Transaction) {
  if (await CompanyClause.count({ where: { organizationId }, transaction })) return;
  await CompanyClause.bulkCreate(
    loadDefaultClauses().map((c) => ({ organizationId, key: c.key, title: c.title, body: c.body, requiresInitials: c.requiresInitials, position: c.position })),
    { transaction, ignoreDuplicates: true },
  );
}

/** The company's active clauses in order, as the engine takes them. */
export async function activeClauses(organizationId: string, transaction?: Transaction): Promise<Clause[]> {
  await ensureClauseLibrary(organizationId, transaction);
  const rows = await CompanyClause.findAll({ where: { organizationId, active: true }, order: [['position', 'ASC'], ['key', 'ASC']], transaction });
  return rows.map((r) => ({ key: r.key, title: r.title, body: r.body, requiresInitials: r.requiresInitials, position: r.position }));
}

/**
 * The most people each tent on the booking may hold for its seating style: the occupant load of
 * IFC 2018 Table 1004.5 (the same figure the planner shows).
 */
export async function occupancyOf(
  organizationId: string,
  lines: Pick<BookingLine, 'itemId' | 'quantity'>[],
  seating: keyof typeof LOAD_FOR_SEATING,
  transaction?: Transaction,
) {
  const ids = lines.map((l) => l.itemId).filter((x): x is string => !!x);
  if (!ids.length) return [];
  const tents = await Item.findAll({ where: { id: { [Op.in]: ids }, organizationId, kind: 'tent' }, transaction });
  return tents
    .filter((t) => t.widthFt && t.lengthFt)
    .map((t) => ({ tent: t.name, maxOccupants: occupantLoads(t.widthFt! * t.lengthFt!)[LOAD_FOR_SEATING[seating]] }));
}
