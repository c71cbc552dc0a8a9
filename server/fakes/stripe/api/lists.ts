import type Stripe from 'stripe';
import { feeLookupRefused, invalidRequest, noSuch, type Params } from '../params';
import { snapshot, type CardFakeStore } from '../store';

export type ApiList<T> = Stripe.ApiList<T>;

/**
 * One page of a list, newest first, with the real `limit` (1 to 100, default 10),
 * `starting_after` and `ending_before` cursors. `items` are in creation order.
 */
export function paginate<T extends { id: string }>(items: T[], params: Params, url: string, objectName: string): ApiList<T> {
  const limit = params.integer('limit', { min: 1, max: 100 }) ?? 10;
  const after = params.string('starting_after');
  const before = params.string('ending_before');
  if (after && before) {
    throw invalidRequest('You may only specify one of these parameters: starting_after, ending_before.', {
      param: 'starting_after',
    });
  }
  const newestFirst = [...items].reverse();
  let page: T[];
  let hasMore: boolean;
  if (before) {
    const at = newestFirst.findIndex((i) => i.id === before);
    if (at < 0) throw noSuch(objectName, before, 'ending_before');
    const earlier = newestFirst.slice(0, at);
    page = earlier.slice(Math.max(0, earlier.length - limit));
    hasMore = earlier.length > limit;
  } else {
    const start = after ? newestFirst.findIndex((i) => i.id === after) + 1 : 0;
    if (after && start === 0) throw noSuch(objectName, after, 'starting_after');
    page = newestFirst.slice(start, start + limit);
    hasMore = newestFirst.length > start + limit;
  }
  return { object: 'list', data: page.map((i) => snapshot(i)), has_more: hasMore, url };
}

/** Reads `expand[]` from the request. */
export function expandPaths(params: Params): string[] {
  return params.stringList('expand');
}

type Expandable = Record<string, unknown>;

/**
 * Replaces ids by their objects along each dotted `expand` path (`payment_intent`,
 * `payment_intent.latest_charge`, `latest_charge.balance_transaction`, `data.charge` on lists). `line_items` on a session is its own
 * list. A path the fake cannot expand is refused as the real API refuses it.
 */
export function expand<T>(value: T, paths: string[], store: CardFakeStore): T {
  if (paths.length === 0) return value;
  const out = snapshot(value) as unknown as Expandable;
  paths.forEach((path, index) => {
    const parts = path.split('.');
    if (parts.length > 4) {
      throw invalidRequest(`You cannot expand more than 4 levels of a property. Property: ${path}`, {
        param: `expand[${index}]`,
      });
    }
    expandAt(out, parts, path, index, store);
  });
  return out as unknown as T;
}

function expandAt(target: Expandable, parts: string[], path: string, index: number, store: CardFakeStore) {
  const [head, ...rest] = parts;
  if (head === 'data' && Array.isArray(target.data)) {
    for (const item of target.data as Expandable[]) expandAt(item, rest, path, index, store);
    return;
  }
  if (head === 'line_items' && target.object === 'checkout.session') {
    const record = store.sessions.get(target.id as string);
    target.line_items = {
      object: 'list',
      data: snapshot(record?.lineItems ?? []),
      has_more: false,
      url: `/v1/checkout/sessions/${target.id as string}/line_items`,
    };
    return;
  }
  const current = target[head];
  const cannot = () =>
    invalidRequest(`This property cannot be expanded (${path}).`, { param: `expand[${index}]` });
  if (!(head in target)) throw cannot();
  if (current === null) return;
  let object: Expandable;
  if (typeof current === 'string') {
    const found = store.findById(current);
    if (!found) throw cannot();
    if (found.object === 'balance_transaction' && store.refusesFeeLookup(found.id)) throw feeLookupRefused(found.id);
    object = snapshot(found) as unknown as Expandable;
    target[head] = object;
  } else if (typeof current === 'object' && !Array.isArray(current) && rest.length > 0) {
    object = current as Expandable;
  } else {
    throw cannot();
  }
  if (rest.length > 0) expandAt(object, rest, path, index, store);
}
