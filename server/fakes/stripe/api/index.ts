import express, { Router } from 'express';
import type { Payments } from '../payments';
import { checkoutSessionsRouter } from './checkoutSessions';
import { apiErrors, authenticate, idempotency, requestId, unknownRoute, type StoredAnswer } from './middleware';
import { paymentIntentsRouter } from './paymentIntents';
import { refundsRouter } from './refunds';

/** The `/v1` API the SDK talks to: authenticated, form-encoded, idempotent POSTs. */
export function apiRouter(
  payments: Payments,
  o: { apiKey?: string; baseUrl: () => string; answers: Map<string, StoredAnswer> },
): Router {
  const router = Router();
  router.use(requestId);
  router.use(authenticate(o.apiKey));
  router.use(express.urlencoded({ extended: true, limit: '1mb' }));
  router.use((_req, _res, next) => {
    payments.sweepExpired();
    next();
  });
  router.use(idempotency(o.answers));
  router.use(checkoutSessionsRouter(payments, o.baseUrl));
  router.use(paymentIntentsRouter(payments));
  router.use(refundsRouter(payments));
  router.use(unknownRoute);
  router.use(apiErrors);
  return router;
}
