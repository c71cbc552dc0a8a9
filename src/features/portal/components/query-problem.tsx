import { Link } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { Button, buttonClasses } from '@/components/ui/button';
import { paths } from '@/config/paths';
import { errorMessage, isApiError } from '@/lib/api';
import { portalNext } from '../customer-pages';

/**
 * A signed-in page whose data did not load. A 401 means the session ended (the app is already on
 * its way to the sign-in page; the link is for when it is not); anything else can be tried again.
 */
export function QueryProblem({ error, what, onRetry }: { error: unknown; what: string; onRetry: () => void }) {
  if (isApiError(error) && error.status === 401) {
    return (
      <Alert tone="info" title="Your sign-in has ended.">
        <p>For your privacy, sign-ins end after a while.</p>
        <Link className={buttonClasses('primary', 'md', 'mt-3')} to={paths.portal.signIn.getHref(portalNext(window.location.pathname))}>
          Sign in again
        </Link>
      </Alert>
    );
  }
  return (
    <Alert tone="danger" title={`We couldn’t load ${what}.`}>
      <p>{errorMessage(error)}</p>
      <Button variant="secondary" size="sm" className="mt-3" onClick={onRetry}>
        Try again
      </Button>
    </Alert>
  );
}
