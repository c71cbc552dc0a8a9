import type { CustomerRow, StoredFileRef } from '../../shared/schemas/customers';
import type { Customer, StoredFile, User } from '../models';
import { can } from '../policies';

export function presentFile(file: StoredFile): StoredFileRef {
  return {
    id: file.id,
    filename: file.filename,
    contentType: file.contentType,
    size: file.size,
    sha256: file.sha256,
    createdAt: file.createdAt.toISOString(),
  };
}

export function presentCustomer(
  customer: Customer,
  actor: User,
  extra: { certificate: StoredFile | null; bookingCount: number },
): CustomerRow {
  return {
    id: customer.id,
    type: customer.type,
    name: customer.name,
    contactName: customer.contactName,
    email: customer.email,
    phone: customer.phone,
    billingLine1: customer.billingLine1,
    billingLine2: customer.billingLine2,
    billingCity: customer.billingCity,
    billingRegion: customer.billingRegion,
    billingPostalCode: customer.billingPostalCode,
    notes: customer.notes,
    taxExempt: customer.taxExempt,
    exemptionCertificate: extra.certificate && can(actor, 'customer', 'readCertificate', customer) ? presentFile(extra.certificate) : null,
    bookingCount: extra.bookingCount,
    createdAt: customer.createdAt.toISOString(),
    updatedAt: customer.updatedAt.toISOString(),
    can: { update: can(actor, 'customer', 'update', customer), readCertificate: can(actor, 'customer', 'readCertificate', customer) },
  };
}
