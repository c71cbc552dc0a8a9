import type { Area } from '../../shared/types';
import { env } from '../env';
import { forbidden, notFound } from '../errors';
import type { User } from '../models';
import { bookingPolicy } from './booking';
import { customerPolicy } from './customer';
import { documentPolicy } from './document';
import { exportPolicy } from './export';
import { fieldPolicy } from './field';
import { invoicePolicy } from './invoice';
import { itemPolicy } from './item';
import { ledgerPolicy } from './ledger';
import { organizationPolicy } from './organization';
import { reportPolicy } from './report';
import { userPolicy } from './user';

const policies = { user: userPolicy, organization: organizationPolicy, item: itemPolicy, customer: customerPolicy, booking: bookingPolicy, document: documentPolicy, invoice: invoicePolicy, field: fieldPolicy, export: exportPolicy, report: reportPolicy, ledger: ledgerPolicy };
type Policies = typeof policies;

/** `can(actor, 'user', 'disable', target)`: the single place the server decides who may do what. */
export function can<R extends keyof Policies, A extends keyof Policies[R]>(
  actor: User,
  resource: R,
  action: A,
  ...args: Policies[R][A] extends (actor: User, ...rest: infer P) => boolean ? P : never
): boolean {
  const rule = policies[resource][action] as unknown as (actor: User, ...rest: unknown[]) => boolean;
  return rule(actor, ...args);
}

/** Like `can`, but throws 403; call after loading a record scoped to the actor's organization. */
export function authorize<R extends keyof Policies, A extends keyof Policies[R]>(
  actor: User,
  resource: R,
  action: A,
  ...args: Policies[R][A] extends (actor: User, ...rest: infer P) => boolean ? P : never
): void {
  if (!can(actor, resource, action, ...args)) throw forbidden();
}

/** A record of another organization is reported as missing, never as forbidden. */
export function sameOrganization<T extends { organizationId: string } | null>(actor: User, record: T, what: string): NonNullable<T> {
  if (!record || record.organizationId !== actor.organizationId) throw notFound(what);
  return record as NonNullable<T>;
}

/** The parts of the app a user may open; the client builds its navigation from this list. */
export function areasFor(user: User): Area[] {
  const areas: Area[] = ['dashboard', 'bookings', 'customers', 'catalog'];
  if (invoicePolicy.read(user)) areas.push('invoices');
  if (exportPolicy.run(user)) areas.push('exports');
  if (reportPolicy.read(user)) areas.push('reports');
  if (fieldPolicy.read(user)) areas.push('field');
  if (userPolicy.list(user)) areas.push('users');
  if (user.role === 'owner') areas.push('settings');
  if (env.FAKES === 'on' && organizationPolicy.readCaughtMail(user)) areas.push('devInbox');
  return areas;
}
