import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { Button, buttonClasses } from '@/components/ui/button';
import { paths } from '@/config/paths';
import { ApiError } from '@/lib/api';
import { PortalLayout } from './portal-layout';

/** A customer page that could not be shown at all (its code did not load, a bug): a way on, never the internals. */
export function PortalRouteError() {
  const error = useRouteError();
  if (import.meta.env.DEV) console.error(error);
  const notFound = isRouteErrorResponse(error) && error.status === 404;
  const offline = error instanceof ApiError && error.status === 0;
  const title = notFound ? 'Page not found' : offline ? 'We can’t reach the server' : 'Something went wrong';
  return (
    <PortalLayout title={title}>
      <p className="text-canvas-800">
        {notFound
          ? 'There is nothing at this address. Check the link in your e-mail.'
          : offline
            ? 'Check your connection and try again.'
            : 'This page could not be shown. Try again in a moment; if it keeps happening, contact your rental company.'}
      </p>
      <div className="mt-6 flex flex-col gap-3 sm:flex-row">
        <Button variant="secondary" onClick={() => window.location.reload()}>
          Try again
        </Button>
        <Link className={buttonClasses('primary')} to={paths.portal.root.getHref()}>
          Go to your rentals
        </Link>
      </div>
    </PortalLayout>
  );
}
