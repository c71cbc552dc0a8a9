import { Router } from 'express';
import { env } from '../env';
import { authRouter } from './auth';
import { bookingsRouter } from './bookings';
import { customersRouter } from './customers';
import { dashboardRouter } from './dashboard';
import { documentsRouter } from './documents';
import { exportsRouter } from './exports';
import { fieldRouter } from './field';
import { health } from './health';
import { invoicesRouter } from './invoices';
import { ledgerRouter } from './ledger';
import { signingRouter } from './signing';
import { itemsRouter } from './items';
import { planningRouter } from './planning';
import { portalRouter } from './portal';
import { devRouter } from './dev';
import { organizationRouter } from './organization';
import { reportsRouter } from './reports';
import { usersRouter } from './users';

export function apiRouter() {
  const api = Router();
  api.get('/health', health);
  api.use('/auth', authRouter);
  api.use('/users', usersRouter);
  // Before the routers mounted at '/', which every later request walks through: the bookings list
  // is the busiest screen (npm run bench). No path here is also one of theirs (the permission matrix lists them all).
  api.use('/bookings', bookingsRouter);
  api.use('/', planningRouter);
  api.use('/', documentsRouter);
  api.use('/', signingRouter);
  api.use('/', invoicesRouter);
  api.use('/', portalRouter);
  api.use('/organization', organizationRouter);
  api.use('/items', itemsRouter);
  api.use('/customers', customersRouter);
  api.use('/field', fieldRouter);
  api.use('/exports', exportsRouter);
  api.use('/reports', reportsRouter);
  api.use('/ledger', ledgerRouter);
  api.use('/dashboard', dashboardRouter);
  if (env.FAKES === 'on') api.use('/dev', devRouter);
  return api;
}
