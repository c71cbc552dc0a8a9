import type { ReactNode, RefObject } from 'react';
import { Link, useNavigate } from 'react-router';
import type { PortalCompany } from '@shared/schemas/portal';
import { Button } from '@/components/ui/button';
import { Logo } from '@/components/ui/logo';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage, isApiError } from '@/lib/api';
import { useSignOut } from '../api/sign-out';
import { telHref } from './company-contact';

interface PortalLayoutProps {
  /** The page's h1 and the document's title. */
  title: string;
  /** The rental company, when the page knows it: its name leads the header, as the customer deals with them. */
  company?: Pick<PortalCompany, 'name' | 'phone' | 'email'> | null;
  /** Signed-in pages get "Your rentals" and "Sign out" in the header. */
  signedIn?: boolean;
  /** Above the h1: a way back. */
  back?: ReactNode;
  /** Beside the h1 (a status badge). */
  aside?: ReactNode;
  headingRef?: RefObject<HTMLHeadingElement | null>;
  children: ReactNode;
}

/**
 * The customer's pages: outside the staff app, phone first, the company's name on top. Guyline
 * only says it carries the page.
 */
export function PortalLayout({ title, company, signedIn, back, aside, headingRef, children }: PortalLayoutProps) {
  return (
    <div className="flex min-h-dvh flex-col bg-canvas-100">
      <title>{company ? `${title} · ${company.name}` : title}</title>
      <header className="border-b border-canvas-200 bg-white">
        <div className="mx-auto flex max-w-3xl flex-wrap items-center justify-between gap-x-4 gap-y-2 px-4 py-3 sm:px-6">
          <div className="min-w-0">
            <p className="truncate text-lg font-bold tracking-tight text-pine-800">{company?.name ?? 'Your rentals'}</p>
            {company && (company.phone || company.email) ? (
              <p className="flex flex-wrap gap-x-3 text-sm">
                {company.phone ? (
                  <a className={linkClasses} href={telHref(company.phone)}>
                    <span className="sr-only">Call {company.name}: </span>
                    {company.phone}
                  </a>
                ) : null}
                {company.email ? (
                  <a className={`${linkClasses} break-all`} href={`mailto:${company.email}`}>
                    <span className="sr-only">E-mail {company.name}: </span>
                    {company.email}
                  </a>
                ) : null}
              </p>
            ) : null}
          </div>
          {signedIn ? <SignedInMenu /> : null}
        </div>
      </header>
      <main className="mx-auto w-full max-w-3xl flex-1 px-4 pt-5 pb-10 sm:px-6 sm:pt-8">
        {back ? <div className="mb-3 text-sm">{back}</div> : null}
        <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
          <h1 ref={headingRef} tabIndex={-1} className="text-2xl font-bold tracking-tight text-canvas-900 focus:outline-none sm:text-3xl">
            {title}
          </h1>
          {aside}
        </div>
        <div className="mt-4">{children}</div>
      </main>
      <footer className="flex items-center justify-center gap-2 px-4 pb-6 text-xs text-canvas-600">
        <span>Customer pages provided through</span>
        <Logo className="scale-75 text-base" />
      </footer>
    </div>
  );
}

function SignedInMenu() {
  const navigate = useNavigate();
  const signOut = useSignOut();
  return (
    <nav aria-label="Your account" className="flex flex-wrap items-center justify-end gap-2">
      <Link to={paths.portal.root.getHref()} className="rounded-md px-2 py-1 text-sm font-semibold text-pine-800 hover:bg-canvas-100">
        Your rentals
      </Link>
      <Button
        size="sm"
        variant="secondary"
        isLoading={signOut.isPending}
        onClick={() =>
          signOut.mutate(undefined, {
            onSuccess: () => void navigate(paths.portal.signIn.getHref(), { replace: true, state: { signedOut: true } }),
          })
        }
      >
        Sign out
      </Button>
      {signOut.isError && !(isApiError(signOut.error) && signOut.error.status === 401) ? (
        <p role="alert" className="w-full text-right text-sm font-semibold text-rust-700">
          You are still signed in: {errorMessage(signOut.error)}
        </p>
      ) : null}
    </nav>
  );
}
