import type { Request } from 'express';
import type { Transaction } from '../db';
import { CalendarFeed, type User } from '../models';
import { newToken } from '../services/tokens';
import { audit } from './audit';

/** Revokes the person's live feed, if any. */
async function revokeLive(actor: User, t: Transaction) {
  const [count] = await CalendarFeed.update({ revokedAt: new Date() }, { where: { userId: actor.id, organizationId: actor.organizationId, revokedAt: null }, transaction: t });
  return count;
}

/** A new secret feed address for the actor; the old one stops working. Only the token's hash is kept. */
export async function createCalendarFeed(actor: User, req: Request, t: Transaction) {
  const replaced = await revokeLive(actor, t);
  const { token, hash } = newToken();
  const feed = await CalendarFeed.create({ organizationId: actor.organizationId, userId: actor.id, tokenHash: hash }, { transaction: t });
  await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'calendar_feed.created', subjectType: 'user', subjectId: actor.id, data: { replaced } }, req, t);
  return { feed, token };
}

export async function revokeCalendarFeed(actor: User, req: Request, t: Transaction) {
  const revoked = await revokeLive(actor, t);
  if (revoked) await audit({ organizationId: actor.organizationId, actorUserId: actor.id, action: 'calendar_feed.revoked', subjectType: 'user', subjectId: actor.id }, req, t);
}
