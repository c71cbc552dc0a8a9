import type { Customer, User } from '../models';

export const customerPolicy = {
  list: (_actor: User) => true,
  read: (actor: User, customer: Customer) => actor.organizationId === customer.organizationId,
  create: (actor: User) => actor.role === 'owner' || actor.role === 'office',
  /** A customer's tax exemption certificate is a tax record: not the crew's business. */
  readCertificate: (actor: User, customer: Customer) => actor.organizationId === customer.organizationId && actor.role !== 'crew',
  update: (actor: User, customer: Customer) =>
    actor.organizationId === customer.organizationId && (actor.role === 'owner' || actor.role === 'office'),
};
