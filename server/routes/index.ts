import { Router } from 'express';
import { env } from '../env';
import { authRouter } from './auth';
import { devRouter } from './dev';
import { organizationRouter } from './organization';
import { usersRouter } from './users';

export function apiRouter() {
  const api = Router();
  api.get('/health', (_req, res) => res.json({ ok: true }));
  api.use('/auth', authRouter);
  api.use('/users', usersRouter);
  api.use('/organization', organizationRouter);
  if (env.FAKES === 'on') api.use('/dev', devRouter);
  return api;
}
