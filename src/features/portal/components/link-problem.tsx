import { Link } from 'react-router';
import { buttonClasses } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { paths } from '@/config/paths';
import type { PortalCompany } from '@shared/schemas/portal';
import { CompanyContact } from './company-contact';
import { PortalLayout } from './portal-layout';

/**
 * An e-mailed link that can't be used (expired, used, unknown): what is wrong, and one clear
 * way on, which is a fresh sign-in link.
 */
export function LinkProblem({
  title,
  message,
  advice,
  company,
  actionLabel = 'Send me a new sign-in link',
}: {
  title: string;
  message?: string | null;
  advice: string;
  company?: Pick<PortalCompany, 'name' | 'phone' | 'email'> | null;
  actionLabel?: string;
}) {
  return (
    <PortalLayout title={title} company={company}>
      <Card>
        <div className="space-y-2 text-canvas-800">
          {message ? <p>{message}</p> : null}
          <p>{advice}</p>
        </div>
        <Link className={buttonClasses('primary', 'md', 'mt-5 w-full sm:w-auto')} to={paths.portal.signIn.getHref()}>
          {actionLabel}
        </Link>
        {company ? (
          <>
            <p className="mt-5 text-sm font-semibold text-canvas-800">Questions? Contact</p>
            <CompanyContact company={company} className="mt-2" />
          </>
        ) : null}
      </Card>
    </PortalLayout>
  );
}
