import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PortalMe } from '@shared/schemas/portal';
import { api } from '@/lib/api';
import { getPortalMe, portalMeQueryOptions } from './get-portal-me';
import { portalBaseKey } from './keys';

const isMe = (value: unknown): value is PortalMe => typeof value === 'object' && value !== null && 'email' in value;

/**
 * Trades the e-mailed link's one-time token for the session cookie. A POST, never a GET: mail
 * scanners open links, and opening must not use up the token. The answer is the customer (with
 * where the link meant to land); when the server sends no body, /me is asked instead.
 */
export async function startSession(token: string): Promise<PortalMe> {
  const answer = await api.post<unknown>('/api/portal/sessions', { token });
  if (isMe(answer)) return answer;
  const me = await getPortalMe();
  if (!me) throw new Error('The session did not start.');
  return me;
}

/*
 * One request per token per page load. React runs effects twice in development, and a second POST
 * would find the token already used and call a good link dead.
 */
const started = new Map<string, Promise<PortalMe>>();
export function startSessionOnce(token: string): Promise<PortalMe> {
  let pending = started.get(token);
  if (!pending) {
    pending = startSession(token);
    started.set(token, pending);
    // A failure may be a hiccup worth another try ("Try again" asks the server afresh).
    pending.catch(() => started.delete(token));
  }
  return pending;
}

export function useStartSession() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: startSessionOnce,
    onSuccess: (me) => {
      // Whatever was cached belonged to whoever was signed in before.
      queryClient.removeQueries({ queryKey: portalBaseKey });
      const signedIn: PortalMe = { ...me, next: null };
      queryClient.setQueryData(portalMeQueryOptions().queryKey, signedIn);
    },
  });
}
