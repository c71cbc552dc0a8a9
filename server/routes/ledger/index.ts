import { Router } from 'express';
import { LockDateRequest } from '../../../shared/schemas/books';
import { lockDate, setLockDate } from '../../commands/closedPeriods';
import { withTransaction } from '../../db';
import { auth, authenticate } from '../../middlewares/authenticate';
import { parsed, validate } from '../../middlewares/validate';
import { authorize } from '../../policies';

/** The company's lock date: the books are closed through it (ledger/periods.ts). */
export const ledgerRouter = Router();

ledgerRouter.get('/lock-date', authenticate, async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'ledger', 'readLockDate');
  res.json(await lockDate(user));
});

ledgerRouter.put('/lock-date', authenticate, validate(LockDateRequest), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'ledger', 'close');
  const { closedThrough } = parsed<LockDateRequest>(res);
  res.json(await withTransaction((t) => setLockDate(user, closedThrough, req, t)));
});
