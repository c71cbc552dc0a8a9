import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router';
import { formatMoney } from '@shared/money';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner } from '@/components/ui/spinner';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage, isApiError } from '@/lib/api';
import { formatZoned } from '@/lib/zoned-time';
import { useMe } from '@/features/auth/api/get-me';
import { useCustomerCredit } from '@/features/invoices/api/get-customer-credit';
import { customerStatementQueryOptions, useCustomerStatement } from '@/features/invoices/api/get-customer-statement';
import { StatementTable } from '@/features/invoices/components/statement-table';
import { useOrganization } from '@/features/organization/api/get-organization';
import { requireArea } from '../../../guards';

// The statement is money: the roles that read invoices (the server answers 403 to the crew).
export const clientLoader = (queryClient: QueryClient) => async ({ request, params }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'invoices');
  void queryClient.prefetchQuery(customerStatementQueryOptions(params.id ?? ''));
  return null;
};

export default function CustomerStatementRoute() {
  const { id = '' } = useParams();
  const statement = useCustomerStatement(id);
  // Account credit is kept apart from what the customer owes, so the statement names it beside the balance.
  const credit = useCustomerCredit(id);
  const organization = useOrganization();
  const { data: me } = useMe();
  const timeZone = organization.data?.timeZone ?? 'UTC';

  if (statement.isPending) return <PageSpinner label="Loading the statement…" />;
  if (statement.isError) {
    if (isApiError(statement.error) && statement.error.status === 404) throw statement.error;
    return (
      <Alert tone="danger" title="The statement could not be loaded.">
        {errorMessage(statement.error)}
      </Alert>
    );
  }
  const s = statement.data;
  const balance = s.balanceCents < 0 ? `${formatMoney(-s.balanceCents, s.currency)} in the customer’s favor` : `${formatMoney(s.balanceCents, s.currency)} owed`;
  return (
    <>
      <p className="mb-2 text-sm print:hidden">
        <TextLink to={paths.app.customer.getHref(s.customer.id)}>Back to {s.customer.name}</TextLink>
      </p>
      {organization.data ? <p className="mb-1 hidden font-semibold text-canvas-900 print:block">{organization.data.name}</p> : null}
      <PageHeader
        title={`Statement for ${s.customer.name}`}
        description={
          <>
            Every charge, payment and credit on this customer’s bookings, oldest first, as of {formatZoned(new Date().toISOString(), timeZone, false)}. Closing balance:{' '}
            <strong className="text-canvas-900 tabular-nums">{balance}</strong>.
            {credit.data && credit.data.creditCents !== 0 ? (
              <>
                {' '}
                Account credit, apart from that balance:{' '}
                <strong className="text-canvas-900 tabular-nums" data-testid="statement-credit">
                  {formatMoney(credit.data.creditCents, credit.data.currency)}
                </strong>
                .
              </>
            ) : null}
          </>
        }
        actions={
          <Button variant="secondary" className="print:hidden" onClick={() => window.print()}>
            Print the statement
          </Button>
        }
      />
      {s.lines.length === 0 ? (
        <EmptyState title="Nothing on this customer’s account yet">Lines appear when an invoice is issued or money comes in.</EmptyState>
      ) : (
        <StatementTable statement={s} timeZone={timeZone} linkBookings={Boolean(me?.areas.includes('bookings'))} />
      )}
    </>
  );
}
