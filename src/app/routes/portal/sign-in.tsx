import { useLocation, useSearchParams } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { Card } from '@/components/ui/card';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { usePortalMe } from '@/features/portal/api/get-portal-me';
import { portalNext } from '@/features/portal/customer-pages';
import { PortalLayout } from '@/features/portal/components/portal-layout';
import { SignInForm } from '@/features/portal/components/sign-in-form';

export { PortalRouteError as ErrorBoundary } from '@/features/portal/components/portal-route-error';

/** No password: the customer asks for a one-time link by e-mail. */
export default function PortalSignInRoute() {
  const [search] = useSearchParams();
  const location = useLocation();
  const next = portalNext(search.get('next'));
  const me = usePortalMe();
  const signedOut = (location.state as { signedOut?: boolean } | null)?.signedOut === true;

  return (
    <PortalLayout title="See your rentals">
      <div className="space-y-4">
        {signedOut ? <Alert tone="success">You are signed out.</Alert> : null}
        {me.data ? (
          <Alert tone="info" title={`You are signed in as ${me.data.email}.`}>
            <TextLink to={next ?? paths.portal.root.getHref()}>{next ? 'Continue where you were going' : 'Go to your rentals'}</TextLink>
          </Alert>
        ) : null}
        <Card>
          <p className="mb-4 text-canvas-800">
            Sign, pay and download your papers for the tents and equipment you rent. Enter your e-mail address and we will send you a link to sign in; there is no
            password to remember.
          </p>
          <SignInForm next={next} />
        </Card>
      </div>
    </PortalLayout>
  );
}
