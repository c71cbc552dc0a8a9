import type { PortalCompany } from '@shared/schemas/portal';
import { linkClasses } from '@/components/ui/text-link';
import { cn } from '@/lib/cn';

type Contact = Pick<PortalCompany, 'name' | 'phone' | 'email'> & { address?: string };

export const telHref = (phone: string) => `tel:${phone.replace(/[^\d+]/g, '')}`;

/** How to reach the company: phone and e-mail as links a phone can act on, and the address. */
export function CompanyContact({ company, className }: { company: Contact; className?: string }) {
  return (
    <address className={cn('rounded-md border border-canvas-200 bg-canvas-50 px-4 py-3 text-sm not-italic text-canvas-900', className)}>
      <p className="font-semibold">{company.name}</p>
      {company.phone ? (
        <p className="mt-1">
          Phone:{' '}
          <a className={linkClasses} href={telHref(company.phone)}>
            {company.phone}
          </a>
        </p>
      ) : null}
      {company.email ? (
        <p className="mt-1 break-all">
          E-mail:{' '}
          <a className={linkClasses} href={`mailto:${company.email}`}>
            {company.email}
          </a>
        </p>
      ) : null}
      {company.address ? <p className="mt-1 whitespace-pre-line text-canvas-700">{company.address}</p> : null}
    </address>
  );
}
