import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { Card } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner } from '@/components/ui/spinner';
import { errorMessage } from '@/lib/api';
import { meQueryOptions } from '@/features/auth/api/get-me';
import { organizationQueryOptions, useOrganization } from '@/features/organization/api/get-organization';
import { OrganizationDetails } from '@/features/organization/components/organization-details';
import { OrganizationForm } from '@/features/organization/components/organization-form';
import { requireMe } from '../../guards';

// Any signed-in role may read the company details; the server says who may change them.
export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  await requireMe(queryClient, request);
  void queryClient.prefetchQuery(organizationQueryOptions());
  return null;
};

export default function SettingsRoute() {
  const queryClient = useQueryClient();
  const organization = useOrganization();

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
    </>
  );
}
