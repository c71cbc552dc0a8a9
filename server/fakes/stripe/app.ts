import express, { type Express } from 'express';
import { apiRouter } from './api';
import type { StoredAnswer } from './api/middleware';
import { controlRouter } from './control';
import { pageRouter } from './pageRoutes';
import type { Payments } from './payments';
import type { WebhookDispatcher } from './webhooks';

export interface CardFakeParts {
  payments: Payments;
  webhooks: WebhookDispatcher;
  answers: Map<string, StoredAnswer>;
  apiKey?: string;
  baseUrl: () => string;
  reset: () => void;
}

/** The card fake's Express app without listen: the API, the payer's pages and the test controls. */
export function createCardFakeApp(parts: CardFakeParts): Express {
  const app = express();
  app.disable('x-powered-by');
  // Bracketed list parameters in query strings (`expand[0]=payment_intent`), as the SDK sends them.
  app.set('query parser', 'extended');
  app.use('/v1', apiRouter(parts.payments, parts));
  app.use('/_fake', controlRouter(parts.payments, parts.webhooks, parts));
  app.use(pageRouter(parts.payments));
  return app;
}
