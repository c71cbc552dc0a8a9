import { Router } from 'express';
import { UpdateOrganizationRequest } from '../../../shared/schemas/organization';
import { audit } from '../../commands/audit';
import { withTransaction } from '../../db';
import { auth, authenticate } from '../../middlewares/authenticate';
import { parsed, validate } from '../../middlewares/validate';
import { Organization } from '../../models';
import { authorize } from '../../policies';
import { presentOrganization } from '../../presenters/organization';

export const organizationRouter = Router();

organizationRouter.get('/', authenticate, (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'organization', 'read', organization);
  res.json(presentOrganization(organization, user));
});

organizationRouter.patch('/', authenticate, validate(UpdateOrganizationRequest), async (req, res) => {
  const { user } = auth(req);
  const input = parsed<UpdateOrganizationRequest>(res);
  const org = await withTransaction(async (t) => {
    const o = (await Organization.findByPk(user.organizationId, { transaction: t, lock: t.LOCK.UPDATE }))!;
    authorize(user, 'organization', 'update', o);
    const before = o.get({ plain: true });
    o.set(input);
    const changed = (o.changed() || []) as string[];
    await o.save({ transaction: t });
    await audit(
      { organizationId: o.id, actorUserId: user.id, action: 'organization.updated', subjectType: 'organization', subjectId: o.id, data: { changed: Object.fromEntries(changed.map((k) => [k, { from: (before as Record<string, unknown>)[k], to: o.get(k) }])) } },
      req,
      t,
    );
    return o;
  });
  res.json(presentOrganization(org, user));
});
