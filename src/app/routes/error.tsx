import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { buttonClasses } from '@/components/ui/button';
import { Title } from '@/components/ui/title';
import { paths } from '@/config/paths';
import { ApiError } from '@/lib/api';

function describe(error: unknown): { title: string; text: string } {
  const status = isRouteErrorResponse(error) ? error.status : error instanceof ApiError ? error.status : 0;
  if (status === 404) return { title: 'Page not found', text: 'There is nothing at this address. It may have moved, or the link may be mistyped.' };
  if (status === 403) return { title: 'Not part of your role', text: 'Your role in this company does not include this page. Ask the owner if you need it.' };
  if (error instanceof ApiError && error.status === 0) return { title: 'Guyline is out of reach', text: error.message };
  // Nothing from the error itself is shown: stack traces and server details stay out of sight.
  return { title: 'Something went wrong', text: 'This page could not be shown. Try again; if it keeps happening, tell whoever looks after Guyline for your company.' };
}

/** The route error element: a plain explanation and a way on, never the internals. */
export function RouteError() {
  const error = useRouteError();
  const { title, text } = describe(error);
  if (import.meta.env.DEV) console.error(error);
  return (
    <div className="mx-auto max-w-xl px-4 py-16">
      <Title>{title}</Title>
      <h1 className="text-2xl font-bold text-canvas-900">{title}</h1>
      <p className="mt-2 text-canvas-700">{text}</p>
      <div className="mt-6 flex flex-wrap gap-3">
        <button type="button" className={buttonClasses('secondary')} onClick={() => window.location.reload()}>
          Try again
        </button>
        <Link className={buttonClasses('primary')} to={paths.app.root.getHref()}>
          Go to Home
        </Link>
      </div>
    </div>
  );
}
