import { Router } from 'express';
import { z } from 'zod';
import { InviteUserRequest, ListQuery, UpdateUserRequest } from '../../../shared/schemas/users';
import { inviteUser, sendInvite, updateUser } from '../../commands/accounts';
import { audit } from '../../commands/audit';
import { withTransaction } from '../../db';
import { auth, authenticate } from '../../middlewares/authenticate';
import { parsed, validate } from '../../middlewares/validate';
import { User } from '../../models';
import { authorize, sameOrganization } from '../../policies';
import { presentUser } from '../../presenters/user';

export const usersRouter = Router();

const IdParams = z.object({ id: z.uuid({ error: 'Not a user id.' }) });

usersRouter.get('/', authenticate, validate(ListQuery, 'query'), async (req, res) => {
  const { user: actor } = auth(req);
  authorize(actor, 'user', 'list');
  const { page, pageSize } = parsed<ListQuery>(res, 'query');
  const { rows, count } = await User.findAndCountAll({
    where: { organizationId: actor.organizationId },
    order: [['name', 'ASC'], ['id', 'ASC']],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  });
  res.json({ data: rows.map((u) => presentUser(u, actor)), total: count });
});

usersRouter.post('/invite', authenticate, validate(InviteUserRequest), async (req, res) => {
  const { user: actor } = auth(req);
  authorize(actor, 'user', 'invite');
  const input = parsed<InviteUserRequest>(res);
  const user = await withTransaction((t) => inviteUser(actor, input, req, t));
  res.status(201).json(presentUser(user, actor));
});

usersRouter.patch('/:id', authenticate, validate(IdParams, 'params'), validate(UpdateUserRequest), async (req, res) => {
  const { user: actor } = auth(req);
  const { id } = parsed<{ id: string }>(res, 'params');
  const input = parsed<UpdateUserRequest>(res);
  const updated = await withTransaction(async (t) => {
    const target = sameOrganization(actor, await User.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE }), 'That user');
    if (input.role !== undefined) authorize(actor, 'user', 'changeRole', target);
    if (input.disabled !== undefined) authorize(actor, 'user', 'disable', target);
    return updateUser(actor, target, input, req, t);
  });
  res.json(presentUser(updated, actor));
});

usersRouter.post('/:id/resend-invite', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user: actor } = auth(req);
  const { id } = parsed<{ id: string }>(res, 'params');
  await withTransaction(async (t) => {
    const target = sameOrganization(actor, await User.findByPk(id, { transaction: t }), 'That user');
    authorize(actor, 'user', 'resendInvite', target);
    await sendInvite(actor, target, req, t);
    await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'user.invite_resent', subjectType: 'user', subjectId: target.id }, req, t);
  });
  res.status(202).json({ message: 'A new invitation is on its way.' });
});
