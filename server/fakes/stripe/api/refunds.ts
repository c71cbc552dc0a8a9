import { Router } from 'express';
import { feeLookupRefused, noSuch, Params } from '../params';
import type { Payments } from '../payments';
import { createRefund } from '../refunds';
import { expand, expandPaths, paginate } from './lists';
import { requestInfo } from './middleware';

/** Refunds, and the charges, balance transactions and events they and the payments leave behind (read only). */
export function refundsRouter(payments: Payments): Router {
  const router = Router();
  const store = payments.store;

  router.post('/refunds', (req, res) => {
    const p = Params.of(req.body).only(['payment_intent', 'charge', 'amount', 'reason', 'metadata', 'expand']);
    const refund = createRefund(
      payments,
      {
        paymentIntentId: p.string('payment_intent'),
        chargeId: p.string('charge'),
        amount: p.integer('amount', { min: 1 }),
        reason: p.enum('reason', ['duplicate', 'fraudulent', 'requested_by_customer'] as const) ?? null,
        metadata: p.metadata() ?? {},
      },
      requestInfo(res),
    );
    res.json(expand(refund, expandPaths(p), store));
  });

  router.get('/refunds', (req, res) => {
    const p = Params.of(req.query).only(['limit', 'starting_after', 'ending_before', 'payment_intent', 'charge', 'expand']);
    const pi = p.string('payment_intent');
    const charge = p.string('charge');
    const refunds = [...store.refunds.values()].filter(
      (r) => (pi === undefined || r.payment_intent === pi) && (charge === undefined || r.charge === charge),
    );
    res.json(expand(paginate(refunds, p, '/v1/refunds', 'refund'), expandPaths(p), store));
  });

  router.get('/refunds/:id', (req, res) => {
    const p = Params.of(req.query).only(['expand']);
    const refund = store.refunds.get(req.params.id);
    if (!refund) throw noSuch('refund', req.params.id);
    res.json(expand(refund, expandPaths(p), store));
  });

  router.get('/charges', (req, res) => {
    const p = Params.of(req.query).only(['limit', 'starting_after', 'ending_before', 'payment_intent', 'expand']);
    const pi = p.string('payment_intent');
    const charges = [...store.charges.values()].filter((c) => pi === undefined || c.payment_intent === pi);
    res.json(expand(paginate(charges, p, '/v1/charges', 'charge'), expandPaths(p), store));
  });

  router.get('/charges/:id', (req, res) => {
    const p = Params.of(req.query).only(['expand']);
    const charge = store.charges.get(req.params.id);
    if (!charge) throw noSuch('charge', req.params.id);
    res.json(expand(charge, expandPaths(p), store));
  });

  router.get('/balance_transactions/:id', (req, res) => {
    const p = Params.of(req.query).only(['expand']);
    const txn = store.balanceTransactions.get(req.params.id);
    if (!txn) throw noSuch('balance transaction', req.params.id);
    if (store.refusesFeeLookup(txn.id)) throw feeLookupRefused(txn.id);
    res.json(expand(txn, expandPaths(p), store));
  });

  router.get('/events', (req, res) => {
    const p = Params.of(req.query).only(['limit', 'starting_after', 'ending_before', 'type', 'types']);
    const type = p.string('type');
    const types = p.stringList('types');
    // `type` takes one wildcard, as the real filter does: `checkout.session.*`.
    const matches = (t: string) =>
      (type === undefined || (type.endsWith('*') ? t.startsWith(type.slice(0, -1)) : t === type)) &&
      (types.length === 0 || types.includes(t));
    const events = [...store.events.values()].filter((e) => matches(e.type));
    res.json(paginate(events, p, '/v1/events', 'event'));
  });

  router.get('/events/:id', (req, res) => {
    Params.of(req.query).only(['expand']);
    const event = store.events.get(req.params.id);
    if (!event) throw noSuch('event', req.params.id);
    res.json(event);
  });

  return router;
}
