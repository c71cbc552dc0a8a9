import { Link } from 'react-router';
import { buttonClasses } from '@/components/ui/button';
import { Title } from '@/components/ui/title';
import { paths } from '@/config/paths';

export default function NotFoundRoute() {
  return (
    <div className="mx-auto max-w-xl px-4 py-16">
      <Title>Page not found</Title>
      <p className="text-sm font-semibold text-canvas-600">404</p>
      <h1 className="mt-1 text-2xl font-bold text-canvas-900">Page not found</h1>
      <p className="mt-2 text-canvas-700">There is nothing at this address. It may have moved, or the link may be mistyped.</p>
      <Link className={buttonClasses('primary', 'md', 'mt-6')} to={paths.app.root.getHref()}>
        Go to Home
      </Link>
    </div>
  );
}
