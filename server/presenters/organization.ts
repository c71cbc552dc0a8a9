import type { OrganizationResponse } from '../../shared/schemas/organization';
import type { Organization, User } from '../models';
import { can } from '../policies';

export function presentOrganization(org: Organization, actor: User): OrganizationResponse {
  return {
    id: org.id,
    name: org.name,
    addressLine1: org.addressLine1,
    addressLine2: org.addressLine2,
    city: org.city,
    region: org.region,
    postalCode: org.postalCode,
    country: org.country,
    phone: org.phone,
    email: org.email,
    currency: org.currency as OrganizationResponse['currency'],
    timeZone: org.timeZone,
    hasLogo: !!org.logoFileId,
    can: { update: can(actor, 'organization', 'update', org) },
  };
}
