import { useCallback, useEffect, useState } from 'react';
import { CONFIRM_WAIT_MS } from '../api/polling';

/** How long a page reached through Cancel listens for a refusal that happened just before. */
export const CANCELLED_WAIT_MS = 5_000;

/**
 * The time the return page keeps asking for the confirmation: `until` for the poll, `timedOut`
 * to say it is slow, `restart` for "Check again".
 */
export function useConfirmWindow() {
  const [until, setUntil] = useState(() => Date.now() + CONFIRM_WAIT_MS);
  const [timedOut, setTimedOut] = useState(false);

  useEffect(() => {
    const timer = window.setTimeout(() => setTimedOut(true), Math.max(0, until - Date.now()));
    return () => window.clearTimeout(timer);
  }, [until]);

  const restart = useCallback(() => {
    setTimedOut(false);
    setUntil(Date.now() + CONFIRM_WAIT_MS);
  }, []);

  return { until, timedOut, restart };
}
