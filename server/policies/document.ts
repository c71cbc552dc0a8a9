import type { Document, User } from '../models';

const desk = (actor: User) => actor.role === 'owner' || actor.role === 'office';

/** Documents carry prices: the crew does not see them. */
export const documentPolicy = {
  read: (actor: User, doc: Document) => actor.organizationId === doc.organizationId && actor.role !== 'crew',
  issue: (actor: User) => desk(actor),
  send: (actor: User, doc: Document) => actor.organizationId === doc.organizationId && desk(actor) && doc.status === 'issued',
  readTemplates: (actor: User) => actor.role !== 'crew',
  editTemplates: (actor: User) => actor.role === 'owner',
};
