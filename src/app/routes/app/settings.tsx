import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { Card, SectionCard } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner } from '@/components/ui/spinner';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { meQueryOptions, useMe } from '@/features/auth/api/get-me';
import { organizationQueryOptions, useOrganization } from '@/features/organization/api/get-organization';
import { OrganizationDetails } from '@/features/organization/components/organization-details';
import { OrganizationForm } from '@/features/organization/components/organization-form';
import { LogoPanel } from '@/features/organization/components/logo-panel';
import { hasPriceRules, rulesQueryOptions, useRules } from '@/features/organization/api/get-rules';
import { PlanningRulesDetails } from '@/features/organization/components/planning-rules';
import { RulesForm } from '@/features/organization/components/rules-form';
import { requireMe } from '../../guards';

// Any signed-in role may read the company details; the server says who may change them.
export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  await requireMe(queryClient, request);
  void queryClient.prefetchQuery(organizationQueryOptions());
  void queryClient.prefetchQuery(rulesQueryOptions());
  return null;
};

export default function SettingsRoute() {
  const queryClient = useQueryClient();
  const organization = useOrganization();
  const rules = useRules();
  // Templates and clauses are read by every role but the crew (the server's document policy).
  const { data: me } = useMe();
  const readsTemplates = me?.user.role !== 'crew';
  const readsMoney = Boolean(me?.areas.includes('invoices'));
  // The server leaves the prices out of the rules for a role that does not see them.
  const priceRules = rules.data ? hasPriceRules(rules.data) : readsMoney;

  return (
    <>
      <PageHeader title="Company settings" description="Your company’s details as they appear on quotes, rental agreements and invoices." />
      {organization.isPending ? (
        <PageSpinner label="Loading company settings…" />
      ) : organization.isError ? (
        <Alert tone="danger" title="Company settings could not be loaded.">
          {errorMessage(organization.error)}
        </Alert>
      ) : organization.data.can.update ? (
        <Card>
          <OrganizationForm
            organization={organization.data}
            // The company name also shows in the navigation, which reads it from "me".
            onSaved={() => void queryClient.invalidateQueries({ queryKey: meQueryOptions().queryKey })}
          />
        </Card>
      ) : (
        <Card>
          <p className="mb-2 text-sm text-canvas-700">You can read these details; changing them is not part of your role.</p>
          <OrganizationDetails organization={organization.data} />
        </Card>
      )}
      {organization.data ? (
        <SectionCard
          className="mt-6"
          title="Logo"
          description="Printed in the header of your rental agreements, invoices, receipts and credit notes. Documents already issued keep the logo they were printed with."
        >
          <LogoPanel organization={organization.data} />
        </SectionCard>
      ) : null}
      {readsTemplates ? (
        <SectionCard className="mt-6" title="Documents" description="What your rental agreements, invoices, receipts and their e-mails say.">
          <ul className="space-y-3">
            <li>
              <TextLink to={paths.app.settingsTemplates.getHref()}>Document templates</TextLink>
              <p className="text-sm text-canvas-700">The text and layout of each document and e-mail, with a live preview.</p>
            </li>
            <li>
              <TextLink to={paths.app.settingsClauses.getHref()}>Clause library</TextLink>
              <p className="text-sm text-canvas-700">The terms of the rental agreement, their order, and which ones ask for the customer’s initials.</p>
            </li>
          </ul>
        </SectionCard>
      ) : null}
      {readsMoney ? (
        <SectionCard className="mt-6" title="Bookkeeping" description="How invoices, payments and deposits are posted to your ledger.">
          <ul className="space-y-3">
            <li>
              <TextLink to={paths.app.settingsAccounts.getHref()}>Chart of accounts</TextLink>
              <p className="text-sm text-canvas-700">The code and name of each account, as your bookkeeper knows them, and what Guyline posts to it.</p>
            </li>
          </ul>
        </SectionCard>
      ) : null}
      <SectionCard
        className="mt-6"
        title={priceRules ? 'Pricing and planning rules' : 'Planning rules'}
        description={
          priceRules
            ? 'Tax, deposit, damage waiver, delivery fees, turnaround, permit thresholds and tent sizing: the numbers quotes and the planner use.'
            : 'Turnaround, permit thresholds, tent sizing and wind limits: the numbers the planner and the day sheets use.'
        }
      >
        {rules.isPending ? (
          <PageSpinner label="Loading the rules…" />
        ) : rules.isError ? (
          <Alert tone="danger" title="The rules could not be loaded.">
            {errorMessage(rules.error)}
          </Alert>
        ) : hasPriceRules(rules.data) ? (
          <RulesForm rules={rules.data} />
        ) : (
          <PlanningRulesDetails rules={rules.data} />
        )}
      </SectionCard>
    </>
  );
}
