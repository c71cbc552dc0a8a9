import type { Invoice, User } from '../models';

const desk = (actor: User) => actor.role === 'owner' || actor.role === 'office';

export const invoicePolicy = {
  /** The bookkeeper reads invoices and payments; the crew sees no money. */
  read: (actor: User, invoice?: Invoice) => (!invoice || actor.organizationId === invoice.organizationId) && actor.role !== 'crew',
  create: (actor: User) => desk(actor),
  issue: (actor: User, invoice: Invoice) => actor.organizationId === invoice.organizationId && desk(actor) && invoice.status === 'draft',
  recordPayment: (actor: User, invoice: Invoice) =>
    actor.organizationId === invoice.organizationId && desk(actor) && ['open', 'partly_paid'].includes(invoice.status),
  void: (actor: User, invoice: Invoice) =>
    actor.organizationId === invoice.organizationId && actor.role === 'owner' && invoice.status !== 'void' && invoice.paidCents === 0,
};
