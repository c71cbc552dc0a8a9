import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner } from '@/components/ui/spinner';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { accountsQueryOptions, useAccounts } from '@/features/invoices/api/get-accounts';
import { AccountsTable } from '@/features/invoices/components/accounts-table';
import { requireArea } from '../../../guards';

// The roles that read invoices read the chart; the server says whether this user may change it.
export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'invoices');
  void queryClient.prefetchQuery(accountsQueryOptions());
  return null;
};

export default function AccountsRoute() {
  const accounts = useAccounts();
  return (
    <>
      <p className="mb-2 text-sm">
        <TextLink to={paths.app.settings.getHref()}>Back to company settings</TextLink>
      </p>
      <PageHeader
        title="Chart of accounts"
        description="The accounts every invoice, payment and deposit is posted to. Give them the codes and names your bookkeeper uses; what each one is used for stays the same."
      />
      {accounts.isPending ? (
        <PageSpinner label="Loading the accounts…" />
      ) : accounts.isError ? (
        <Alert tone="danger" title="The accounts could not be loaded.">
          {errorMessage(accounts.error)}
        </Alert>
      ) : (
        <div className="space-y-3">
          {accounts.data.can.update ? (
            <p className="text-sm text-canvas-700">Change a code or a name and save that row. Entries already posted show the new code and name too.</p>
          ) : (
            <p className="text-sm text-canvas-700">You can read the chart of accounts; changing it is the owner’s.</p>
          )}
          <AccountsTable accounts={accounts.data.data} canUpdate={accounts.data.can.update} />
        </div>
      )}
    </>
  );
}
