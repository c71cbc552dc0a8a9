import { Link } from 'react-router';
import { ROLE_LABELS } from '@shared/types';
import { SectionCard } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { Spinner } from '@/components/ui/spinner';
import { linkClasses } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { useMe } from '@/features/auth/api/get-me';
import { useDashboard } from '@/features/dashboard/api/get-dashboard';
import { GettingStarted, type GettingStartedStep } from '@/features/dashboard/components/getting-started';
import { RoleSummary } from '@/features/dashboard/components/role-summary';
import { TodayFigures } from '@/features/dashboard/components/today-figures';
import { errorMessage } from '@/lib/api';
import { useOrganization } from '@/features/organization/api/get-organization';
import { OrganizationDetails } from '@/features/organization/components/organization-details';

export default function DashboardRoute() {
  const { data: me } = useMe();
  const organization = useOrganization();
  const summary = useDashboard();
  if (!me) return null;

  // Steps follow the areas the server opened for this user, not the role, and go once the company has its details.
  const steps: GettingStartedStep[] = [];
  const detailsMissing = organization.data ? !organization.data.addressLine1 || !organization.data.phone : false;
  if (me.areas.includes('settings') && detailsMissing) {
    steps.push({
      title: 'Fill in your company details',
      text: 'Address, phone, e-mail, currency and time zone appear on quotes, rental agreements and invoices.',
      to: paths.app.settings.getHref(),
      linkLabel: 'Open Company settings',
    });
  }
  if (me.areas.includes('users') && detailsMissing) {
    steps.push({
      title: 'Invite your team',
      text: 'Add your office staff, crew and bookkeeper. Each gets an e-mail to choose a password.',
      to: paths.app.users.getHref(),
      linkLabel: 'Open Users',
    });
  }

  const firstName = me.user.name.trim().split(/\s+/)[0] || me.user.name;
  return (
    <>
      <PageHeader title={`Welcome, ${firstName}`} documentTitle="Home" description={`This is ${me.organization.name} in Guyline.`} />
      <div className="grid gap-6 lg:grid-cols-2">
        <SectionCard title="Today" className="lg:col-span-2">
          {summary.isPending ? (
            <Spinner label="Loading today’s figures…" className="text-canvas-600" />
          ) : summary.isError ? (
            <p className="text-canvas-700">Today’s figures could not be loaded just now. {errorMessage(summary.error)}</p>
          ) : (
            <TodayFigures summary={summary.data} deskWork={me.areas.includes('invoices')} />
          )}
        </SectionCard>
        <SectionCard title="What you can do here" className={steps.length > 0 ? undefined : 'lg:col-span-2'}>
          <RoleSummary role={me.user.role} roleLabel={ROLE_LABELS[me.user.role]} />
        </SectionCard>
        {steps.length > 0 ? (
          <SectionCard title="Getting started" description="A few things to set up before the first booking.">
            <GettingStarted steps={steps} />
          </SectionCard>
        ) : null}
        <SectionCard
          title="Your company"
          className="lg:col-span-2"
          actions={
            me.areas.includes('settings') ? (
              <Link className={`${linkClasses} text-sm`} to={paths.app.settings.getHref()}>
                Edit in Company settings
              </Link>
            ) : null
          }
        >
          {organization.isPending ? (
            <Spinner label="Loading…" className="text-canvas-600" />
          ) : organization.isError ? (
            <p className="text-canvas-700">The company details could not be loaded just now.</p>
          ) : (
            <OrganizationDetails organization={organization.data} />
          )}
        </SectionCard>
      </div>
    </>
  );
}
