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

/** A pay link that can't be used; signing in by e-mail shows the same invoices, so that is the way on. */
export function PayLinkProblem({ error }: { error: unknown }) {
  const expired = isApiError(error) && (error.status === 410 || /expired/.test(error.code));
  return (
    <LinkProblem
      title={expired ? 'This pay link has expired' : 'This pay link doesn’t work'}
      // An unknown link gets our own words; an ended one, the server's reason.
      message={expired && isApiError(error) ? error.message : null}
      advice={
        expired
          ? 'Pay links work for a limited time. Sign in with your e-mail address to see what you owe and pay it there.'
          : 'Check that the whole address from the e-mail is in your browser. You can also sign in with your e-mail address to see what you owe and pay it.'
      }
      company={companyOf(error)}
      actionLabel="Sign in to your rentals"
    />
  );
}

/** Whether a failed load is about the link itself (rather than a hiccup worth retrying). */
export const isDeadLink = (error: unknown) => isApiError(error) && (error.status === 404 || error.status === 410 || error.status === 400);
