import { useEffect, useRef } from 'react';
import { useSearchParams } from 'react-router';

/** A token shorter than this is a link cut short in the mail client, not one worth sending. */
const TOKEN_MIN = 20;

/**
 * The `?token=` of an e-mailed link, traded once per page load. The trade is a POST made by the
 * page, so mail scanners that open links do not use the token up. `start` runs it again (a retry).
 */
export function useLinkToken(trade: (token: string) => void): { token: string; complete: boolean; start: () => void } {
  const [search] = useSearchParams();
  const token = search.get('token') ?? '';
  const complete = token.length >= TOKEN_MIN;
  const fired = useRef(false);
  const start = () => trade(token);

  useEffect(() => {
    if (fired.current || !complete) return;
    fired.current = true;
    start();
    // Once per page load (React runs effects twice in development); `start` only closes over the token.
  }, [token]);

  return { token, complete, start };
}
