import { Router } from 'express';
import { env } from '../../env';
import { HttpError, notFound } from '../../errors';

/** Developer-only views of the local fakes; mounted only while they run (FAKES=on). */
export const devRouter = Router();

async function sink(path: string, init?: RequestInit) {
  if (!env.MAIL_SINK_URL) throw notFound('The mail sink');
  try {
    return await fetch(new URL(path, env.MAIL_SINK_URL), init);
  } catch {
    throw new HttpError(502, 'mail_sink_down', 'The local mail sink is not answering. Is `npm start` still running?');
  }
}

devRouter.get('/mail', async (_req, res) => {
  const r = await sink('/messages');
  res.status(r.status).json(await r.json());
});

devRouter.delete('/mail', async (_req, res) => {
  const r = await sink('/messages', { method: 'DELETE' });
  res.status(r.status === 204 ? 204 : r.status).end();
});
