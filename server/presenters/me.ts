import type { MeResponse } from '../../shared/schemas/auth';
import type { Organization, User } from '../models';
import { areasFor } from '../policies';

export function presentMe(user: User, organization: Organization): MeResponse {
  return {
    user: { id: user.id, name: user.name, email: user.email, role: user.role },
    organization: { id: organization.id, name: organization.name },
    areas: areasFor(user),
  };
}
