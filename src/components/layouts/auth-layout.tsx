import type { ReactNode } from 'react';
import { Link } from 'react-router';
import { Logo } from '@/components/ui/logo';
import { Title } from '@/components/ui/title';
import { paths } from '@/config/paths';

/** The narrow, centred page for signing in, signing up and following e-mailed links. */
export function AuthLayout({ title, description, children, footer }: { title: string; description?: ReactNode; children: ReactNode; footer?: ReactNode }) {
  return (
    <div className="flex min-h-dvh flex-col items-center bg-canvas-100 px-4 py-10 sm:py-16">
      <Title>{title}</Title>
      <header className="mb-8">
        <Link to={paths.home.getHref()} className="block rounded-md" aria-label="Guyline home">
          <Logo />
        </Link>
      </header>
      <main className="w-full max-w-md">
        <div className="rounded-lg border border-canvas-200 bg-white p-6 shadow-sm sm:p-8">
          <h1 className="text-2xl font-bold tracking-tight text-canvas-900">{title}</h1>
          {description ? <div className="mt-2 text-canvas-700">{description}</div> : null}
          <div className="mt-6">{children}</div>
        </div>
        {footer ? <div className="mt-6 text-center text-sm text-canvas-700">{footer}</div> : null}
      </main>
    </div>
  );
}
