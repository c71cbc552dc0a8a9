import type { QueryClient } from '@tanstack/react-query';
import { useNavigate, type LoaderFunctionArgs } from 'react-router';
import { Card } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { CustomerForm } from '@/features/customers/components/customer-form';
import { requireArea } from '../../../guards';

export const clientLoader = (queryClient: QueryClient) => ({ request }: LoaderFunctionArgs) => requireArea(queryClient, request, 'customers').then(() => null);

export default function NewCustomerRoute() {
  const navigate = useNavigate();
  return (
    <>
      <p className="mb-2 text-sm">
        <TextLink to={paths.app.customers.getHref()}>Back to customers</TextLink>
      </p>
      <PageHeader title="New customer" />
      <Card>
        <CustomerForm customer={null} onSaved={(c) => navigate(paths.app.customer.getHref(c.id), { replace: true })} />
      </Card>
    </>
  );
}
