import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { buttonClasses } from '@/components/ui/button';
import { SectionCard } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner } from '@/components/ui/spinner';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage, isApiError } from '@/lib/api';
import { useMe } from '@/features/auth/api/get-me';
import { useBookings } from '@/features/bookings/api/get-bookings';
import { BookingsTable } from '@/features/bookings/components/bookings-table';
import { customerQueryOptions, useCustomer } from '@/features/customers/api/get-customer';
import { CertificatePanel } from '@/features/customers/components/certificate-panel';
import { CustomerForm } from '@/features/customers/components/customer-form';
import { useCustomerCredit } from '@/features/invoices/api/get-customer-credit';
import { CustomerCreditPanel } from '@/features/invoices/components/customer-credit-panel';
import { useOrganization } from '@/features/organization/api/get-organization';
import { requireArea } from '../../../guards';

export const clientLoader = (queryClient: QueryClient) => async ({ request, params }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'customers');
  void queryClient.prefetchQuery(customerQueryOptions(params.id ?? ''));
  return null;
};

function CustomerBookings({ customerId }: { customerId: string }) {
  const bookings = useBookings({ customerId, pageSize: 100 });
  const organization = useOrganization();
  if (bookings.isPending) return <PageSpinner label="Loading bookings…" />;
  if (bookings.isError)
    return (
      <Alert tone="danger" title="The bookings could not be loaded.">
        {errorMessage(bookings.error)}
      </Alert>
    );
  if (bookings.data.data.length === 0) return <p className="text-sm text-canvas-700">No bookings yet.</p>;
  return <BookingsTable bookings={bookings.data.data} timeZone={organization.data?.timeZone ?? 'UTC'} caption="This customer’s bookings" hideCustomer />;
}

/** The customer's account credit, once there has been any; only for those who read money (the crew gets a 403). */
function CustomerCredit({ customerId, customerName, canPayBack }: { customerId: string; customerName: string; canPayBack: boolean }) {
  const credit = useCustomerCredit(customerId);
  const organization = useOrganization();
  if (credit.isPending) return null;
  if (credit.isError)
    return (
      <Alert tone="danger" title="The customer’s account credit could not be loaded.">
        {errorMessage(credit.error)}
      </Alert>
    );
  if (credit.data.creditCents === 0 && credit.data.moves.length === 0) return null;
  return (
    <SectionCard title="Account credit" description="Money the customer has with you: overpayments kept as credit and credit notes beyond what an invoice still owed.">
      <CustomerCreditPanel
        customerId={customerId}
        customerName={customerName}
        credit={credit.data}
        timeZone={organization.data?.timeZone ?? 'UTC'}
        canPayBack={canPayBack}
      />
    </SectionCard>
  );
}

export default function CustomerRoute() {
  const { id = '' } = useParams();
  const customer = useCustomer(id);
  const { data: me } = useMe();

  if (customer.isPending) return <PageSpinner label="Loading the customer…" />;
  if (customer.isError) {
    if (isApiError(customer.error) && customer.error.status === 404) throw customer.error;
    return (
      <Alert tone="danger" title="The customer could not be loaded.">
        {errorMessage(customer.error)}
      </Alert>
    );
  }
  const c = customer.data;
  return (
    <>
      <p className="mb-2 text-sm">
        <TextLink to={paths.app.customers.getHref()}>Back to customers</TextLink>
      </p>
      <PageHeader
        title={c.name}
        description={c.taxExempt ? <Badge tone="caution">Tax exempt</Badge> : null}
        actions={
          <>
            {me?.areas.includes('invoices') ? (
              <Link className={buttonClasses('secondary')} to={paths.app.customerStatement.getHref(c.id)}>
                Statement
              </Link>
            ) : null}
            {me?.areas.includes('bookings') && c.can.update ? (
              <Link className={buttonClasses('primary')} to={paths.app.bookingNew.getHref(c.id)}>
                New booking for this customer
              </Link>
            ) : null}
          </>
        }
      />
      <div className="space-y-6">
        <SectionCard title={c.can.update ? 'Details' : 'Details (read only)'}>
          <CustomerForm customer={c} readOnly={!c.can.update} />
        </SectionCard>
        {me?.areas.includes('invoices') ? <CustomerCredit customerId={c.id} customerName={c.name} canPayBack={me.user.role === 'owner'} /> : null}
        {c.can.readCertificate ? (
          <SectionCard title="Tax exemption certificate" description="A copy of the customer’s resale or exemption certificate, for your sales tax records.">
            <CertificatePanel customer={c} />
          </SectionCard>
        ) : null}
        <SectionCard title="Bookings">
          <CustomerBookings customerId={c.id} />
        </SectionCard>
      </div>
    </>
  );
}
