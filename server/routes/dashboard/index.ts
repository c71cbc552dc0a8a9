import { Router } from 'express';
import { auth, authenticate } from '../../middlewares/authenticate';
import { authorize } from '../../policies';
import { dashboardSummary } from '../../services/dashboard';

export const dashboardRouter = Router();

/** The Home screen's figures for the signed-in person (see shared/schemas/dashboard.ts). */
dashboardRouter.get('/', authenticate, async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'booking', 'list');
  res.json(await dashboardSummary(user, organization));
});
