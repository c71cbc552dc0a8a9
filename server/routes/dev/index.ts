import { Router } from 'express';
import { env } from '../../env';
import { HttpError, notFound } from '../../errors';
import { auth, authenticate } from '../../middlewares/authenticate';
import { authorize } from '../../policies';

/**
 * The demo's caught mail (the local mail sink), mounted only while the fakes run (FAKES=on).
 * Caught mail holds live sign-in, reset, signing and pay links, so it is for a signed-in owner,
 * and shows only the mail sent for the owner's own company (staff invitations, resets and
 * welcomes included); emptying it empties that company's mail only.
 */
export const devRouter = Router();

async function sink(path: string, organizationId: string, init?: RequestInit) {
  if (!env.MAIL_SINK_URL) throw notFound('The mail sink');
  const url = new URL(path, env.MAIL_SINK_URL);
  url.searchParams.set('organization', organizationId);
  try {
    return await fetch(url, { ...init, headers: env.MAIL_SINK_TOKEN ? { authorization: `Bearer ${env.MAIL_SINK_TOKEN}` } : {} });
  } catch {
    throw new HttpError(502, 'mail_sink_down', 'The local mail sink is not answering. Is `npm start` still running?');
  }
}

devRouter.get('/mail', authenticate, async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'organization', 'readCaughtMail');
  const r = await sink('/messages', organization.id);
  if (!r.ok) throw new HttpError(502, 'mail_sink_down', 'The local mail sink refused the request.');
  res.json(await r.json());
});

devRouter.delete('/mail', authenticate, async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'organization', 'readCaughtMail');
  const r = await sink('/messages', organization.id, { method: 'DELETE' });
  if (r.status !== 204) throw new HttpError(502, 'mail_sink_down', 'The local mail sink refused the request.');
  res.status(204).end();
});
