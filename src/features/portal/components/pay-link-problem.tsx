import type { PortalCompany } from '@shared/schemas/portal';
import { isApiError } from '@/lib/api';
import { LinkProblem } from './link-problem';

/** The company from a 404/410 body, when the server says which company the link was for. */
function companyOf(error: unknown): Pick<PortalCompany, 'name' | 'phone' | 'email'> | null {
  if (!isApiError(error)) return null;
  const body = error.body as { company?: Partial<PortalCompany> | null; error?: { company?: Partial<PortalCompany> | null } } | null;
  const c = body?.company ?? body?.error?.company;
  return c?.name ? { name: c.name, phone: c.phone ?? '', email: c.email ?? '' } : null;
}

/**
 * A pay link that can't be used. An ended one (its time is up, or the company withdrew it) comes
 * with the server's reason, which tells the customer to ask the company for a new link; signing in
 * by e-mail shows the same invoices, so that is the other way on.
 */
export function PayLinkProblem({ error }: { error: unknown }) {
  const ended = isApiError(error) && (error.status === 410 || /expired/.test(error.code));
  const company = companyOf(error);
  return (
    <LinkProblem
      title={ended ? 'This pay link no longer works' : 'This pay link doesn’t work'}
      // An unknown link gets our own words; an ended one, the server's reason.
      message={ended && isApiError(error) ? error.message : null}
      advice={
        ended
          ? `Pay links work for a limited time, and the company can withdraw one. A new link from ${company?.name ?? 'the company'} works as before.`
          : 'Check that the whole address from the e-mail is in your browser. You can also sign in with your e-mail address to see what you owe and pay it.'
      }
      company={company}
      actionLabel="Sign in to your rentals"
    />
  );
}

/** Whether a failed load is about the link itself (rather than a hiccup worth retrying). */
export const isDeadLink = (error: unknown) => isApiError(error) && (error.status === 404 || error.status === 410 || error.status === 400);
