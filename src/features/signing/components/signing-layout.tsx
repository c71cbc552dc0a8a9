import type { ReactNode } from 'react';
import { Logo } from '@/components/ui/logo';

/**
 * The customer's signing page: outside the app shell, no sign-in, phone first. The company's
 * name leads, because that is who the customer deals with; Guyline only says it carries the page.
 */
export function SigningLayout({ companyName, title, children }: { companyName: string | null; title: string; children: ReactNode }) {
  return (
    <div className="flex min-h-dvh flex-col bg-canvas-100">
      <title>{companyName ? `${title} · ${companyName}` : title}</title>
      <header className="border-b border-canvas-200 bg-white">
        <div className="mx-auto flex max-w-3xl items-center px-4 py-3 sm:px-6">
          <p className="truncate text-lg font-bold tracking-tight text-pine-800">{companyName ?? 'Rental agreement'}</p>
        </div>
      </header>
      <main className="mx-auto w-full max-w-3xl flex-1 px-4 pt-5 pb-10 sm:px-6 sm:pt-8">
        <h1 className="text-2xl font-bold tracking-tight text-canvas-900 sm:text-3xl">{title}</h1>
        <div className="mt-4">{children}</div>
      </main>
      <footer className="flex items-center justify-center gap-2 px-4 pb-6 text-xs text-canvas-600">
        <span>Signing page provided through</span>
        <Logo className="scale-75 text-base" />
      </footer>
    </div>
  );
}

/** How to reach the company: name, phone and e-mail as links a phone can act on. */
export function CompanyContact({ company }: { company: { name: string; phone: string; email: string } }) {
  return (
    <address className="mt-3 rounded-md border border-canvas-200 bg-canvas-50 px-4 py-3 text-sm not-italic text-canvas-900">
      <p className="font-semibold">{company.name}</p>
      {company.phone ? (
        <p className="mt-1">
          Phone:{' '}
          <a className="font-semibold text-pine-700 underline hover:text-pine-900" href={`tel:${company.phone.replace(/[^\d+]/g, '')}`}>
            {company.phone}
          </a>
        </p>
      ) : null}
      {company.email ? (
        <p className="mt-1 break-all">
          E-mail:{' '}
          <a className="font-semibold text-pine-700 underline hover:text-pine-900" href={`mailto:${company.email}`}>
            {company.email}
          </a>
        </p>
      ) : null}
    </address>
  );
}
