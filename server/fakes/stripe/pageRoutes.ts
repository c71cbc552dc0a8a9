import express, { Router, type Response } from 'express';
import { authenticatePage, paidFor, payerMessage, payPage, receiptPage, sessionStatusPage, statusPage, type PayFormState } from './page';
import type { Payments } from './payments';

function html(res: Response, status: number, body: string) {
  res.status(status).set('Cache-Control', 'no-store').type('html').send(body);
}

const notFound = (res: Response) =>
  html(res, 404, statusPage({ title: 'No such payment page', message: 'This link does not lead to a payment. Check the link you were sent.' }));

/**
 * The pages a payer sees: the test card page at a session's `url`, the authentication step some
 * test cards ask for, and receipts. Every form posts back and answers with a 303 on success, so
 * reloading never pays twice.
 */
export function pageRouter(payments: Payments): Router {
  const router = Router();
  const store = payments.store;
  router.use(express.urlencoded({ extended: false, limit: '16kb' }));

  router.get('/pay/:id', (req, res) => {
    const record = store.sessions.get(req.params.id);
    if (!record) return notFound(res);
    payments.sweepExpired();
    if (record.session.status !== 'open') return html(res, 200, sessionStatusPage(record));
    // After a failed authentication the payer lands here again, told why.
    const pi = typeof record.session.payment_intent === 'string' ? store.paymentIntents.get(record.session.payment_intent) : undefined;
    const formError = req.query.declined !== undefined && pi?.last_payment_error ? payerMessage(pi.last_payment_error) : null;
    html(res, 200, payPage(record, { values: {}, fieldErrors: [], formError }));
  });

  router.post('/pay/:id', (req, res) => {
    const record = store.sessions.get(req.params.id);
    if (!record) return notFound(res);
    const body = (req.body ?? {}) as Record<string, unknown>;
    const values: PayFormState['values'] = {
      cardNumber: typeof body.cardNumber === 'string' ? body.cardNumber : '',
      expiry: typeof body.expiry === 'string' ? body.expiry : '',
      cvc: typeof body.cvc === 'string' ? body.cvc : '',
      email: typeof body.email === 'string' ? body.email : '',
    };
    const result = payments.paySession(record, values);
    switch (result.outcome) {
      case 'succeeded':
        return res.redirect(303, result.redirectUrl);
      case 'requires_action':
        return res.redirect(303, result.authenticateUrl);
      case 'invalid':
        return html(res, 422, payPage(record, { values, fieldErrors: result.errors, formError: null }));
      case 'declined':
        return html(res, 402, payPage(record, { values, fieldErrors: [], formError: payerMessage(result.error) }));
      case 'unavailable':
        return html(res, 409, sessionStatusPage(record));
    }
  });

  router.get('/authenticate/:pi', (req, res) => {
    const pi = store.paymentIntents.get(req.params.pi);
    if (!pi) return notFound(res);
    const sessionId = payments.sessionIdOf(pi);
    const record = sessionId ? store.sessions.get(sessionId) : undefined;
    if (pi.status !== 'requires_action') {
      if (record) return res.redirect(303, `/pay/${record.session.id}`);
      return html(res, 409, statusPage({ title: 'Nothing to confirm', message: 'This payment does not need confirming now.' }));
    }
    html(res, 200, authenticatePage(pi, record ? paidFor(record) : pi.description));
  });

  router.post('/authenticate/:pi', (req, res) => {
    const pi = store.paymentIntents.get(req.params.pi);
    if (!pi) return notFound(res);
    const choice = (req.body as Record<string, unknown> | undefined)?.result;
    if (choice !== 'complete' && choice !== 'fail') {
      return html(res, 400, authenticatePage(pi, pi.description));
    }
    const sessionId = payments.sessionIdOf(pi);
    const result = payments.authenticate(pi, choice);
    switch (result.outcome) {
      case 'succeeded':
        return res.redirect(303, result.redirectUrl);
      case 'declined':
        return res.redirect(303, sessionId ? `/pay/${sessionId}?declined=1` : `/authenticate/${pi.id}`);
      case 'unavailable':
        return html(res, 409, sessionStatusPage(store.sessions.get(sessionId!)!));
      case 'requires_action':
      case 'invalid':
      case 'nothing_to_authenticate':
        // GET shows the right page for the intent's state now.
        return res.redirect(303, `/authenticate/${pi.id}`);
      case 'intent': {
        // An intent confirmed through the API goes back to its return_url, as a redirect would.
        const returnUrl = payments.returnUrls.get(pi.id);
        const status = result.result === 'succeeded' ? 'succeeded' : 'failed';
        if (!returnUrl) {
          return html(res, 200, statusPage({ title: status === 'succeeded' ? 'Payment confirmed' : 'Payment not confirmed', message: 'You can close this page.' }));
        }
        const target = new URL(returnUrl);
        target.searchParams.set('payment_intent', pi.id);
        target.searchParams.set('payment_intent_client_secret', pi.client_secret ?? '');
        target.searchParams.set('redirect_status', status);
        return res.redirect(303, target.toString());
      }
    }
  });

  router.get('/receipts/:charge', (req, res) => {
    const charge = store.charges.get(req.params.charge);
    if (!charge || charge.status !== 'succeeded') return notFound(res);
    html(res, 200, receiptPage(charge));
  });

  return router;
}
