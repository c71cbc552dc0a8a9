import { useNavigate } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { errorMessage, isApiError } from '@/lib/api';
import { useLinkToken } from '@/lib/use-link-token';
import { useStartSession } from '@/features/portal/api/start-session';
import { portalNext } from '@/features/portal/customer-pages';
import { LinkProblem } from '@/features/portal/components/link-problem';
import { PortalLayout } from '@/features/portal/components/portal-layout';

export { PortalRouteError as ErrorBoundary } from '@/features/portal/components/portal-route-error';

/** A dead link, by what the server said about it (404 unknown, 410 expired or used, 400 incomplete). */
function linkTitle(error: unknown): { title: string; advice: string } | null {
  if (!isApiError(error)) return null;
  if (error.status === 410 || /expired|used/.test(error.code)) {
    return { title: 'This sign-in link no longer works', advice: 'Each link works once, for 15 minutes. A new one takes a moment.' };
  }
  if (error.status === 404 || error.status === 400) {
    return { title: 'This sign-in link doesn’t work', advice: 'Check that the whole address from the e-mail is in your browser, or ask for a new link.' };
  }
  return null;
}

/** Where the e-mailed sign-in link lands: trades the token for a session, then goes where the link was meant to go. */
export default function PortalWelcomeRoute() {
  const navigate = useNavigate();
  const session = useStartSession();
  const { complete, start } = useLinkToken((token) =>
    session.mutate(token, {
      onSuccess: (me) => void navigate(portalNext(me.next) ?? paths.portal.root.getHref(), { replace: true }),
    }),
  );

  if (!complete) {
    return <LinkProblem title="This sign-in link is incomplete" advice="Open the whole link from the e-mail, or ask for a new one." />;
  }
  if (session.isError) {
    const dead = linkTitle(session.error);
    if (dead) return <LinkProblem title={dead.title} message={isApiError(session.error) ? session.error.message : null} advice={dead.advice} />;
    return (
      <PortalLayout title="We couldn’t sign you in just now">
        <Alert tone="danger">
          <p>{errorMessage(session.error)}</p>
          <Button variant="secondary" size="sm" className="mt-3" onClick={start}>
            Try again
          </Button>
        </Alert>
      </PortalLayout>
    );
  }
  return (
    <PortalLayout title="Signing you in">
      <PageSpinner label="Opening your rentals…" />
    </PortalLayout>
  );
}
