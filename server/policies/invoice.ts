import type { Invoice, User } from '../models';

const desk = (actor: User) => actor.role === 'owner' || actor.role === 'office';

export const invoicePolicy = {
  /** The bookkeeper reads invoices and payments; the crew sees no money. */
  read: (actor: User, invoice?: Invoice) => (!invoice || actor.organizationId === invoice.organizationId) && actor.role !== 'crew',
  create: (actor: User) => desk(actor),
  issue: (actor: User, invoice: Invoice) => actor.organizationId === invoice.organizationId && desk(actor) && invoice.status === 'draft',
  recordPayment: (actor: User, invoice: Invoice) =>
    actor.organizationId === invoice.organizationId && desk(actor) && invoice.kind !== 'credit_note' && ['open', 'partly_paid'].includes(invoice.status),
  void: (actor: User, invoice: Invoice) =>
    actor.organizationId === invoice.organizationId && actor.role === 'owner' && invoice.kind !== 'credit_note' && invoice.status !== 'void' &&
    invoice.paidCents === 0 && invoice.creditNotesCents === 0,
  /**
   * Withdrawing an issued invoice's pay links (one went to the wrong person, or was forwarded):
   * the desk that sends them. Paid and void invoices too, since their links still show the invoice.
   */
  revokePayLink: (actor: User, invoice: Invoice) =>
    actor.organizationId === invoice.organizationId && desk(actor) && invoice.kind !== 'credit_note' && invoice.status !== 'draft',
  /** A credit note lowers an issued invoice that is not yet fully credited. */
  creditNote: (actor: User, invoice: Invoice) =>
    actor.organizationId === invoice.organizationId && desk(actor) && invoice.kind !== 'credit_note' &&
    ['open', 'partly_paid', 'paid'].includes(invoice.status) && invoice.creditNotesCents < invoice.totalCents,
};
