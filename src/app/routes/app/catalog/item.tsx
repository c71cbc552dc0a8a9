import type { QueryClient } from '@tanstack/react-query';
import { useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { SectionCard } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner } from '@/components/ui/spinner';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage, isApiError } from '@/lib/api';
import { zonedMonth } from '@/lib/zoned-time';
import { itemQueryOptions, useItem } from '@/features/catalog/api/get-item';
import { AvailabilityMonth } from '@/features/catalog/components/availability-month';
import { ItemForm } from '@/features/catalog/components/item-form';
import { kindLabel } from '@/features/catalog/components/item-kinds';
import { organizationQueryOptions, useOrganization } from '@/features/organization/api/get-organization';
import { requireArea } from '../../../guards';

export const clientLoader = (queryClient: QueryClient) => async ({ request, params }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'catalog');
  void queryClient.prefetchQuery(itemQueryOptions(params.id ?? ''));
  void queryClient.prefetchQuery(organizationQueryOptions());
  return null;
};

export default function ItemRoute() {
  const { id = '' } = useParams();
  const [params, setParams] = useSearchParams();
  const item = useItem(id);
  const organization = useOrganization();

  if (item.isPending) return <PageSpinner label="Loading the item…" />;
  if (item.isError) {
    if (isApiError(item.error) && item.error.status === 404) throw item.error;
    return (
      <Alert tone="danger" title="The item could not be loaded.">
        {errorMessage(item.error)}
      </Alert>
    );
  }
  const timeZone = organization.data?.timeZone ?? 'UTC';
  const month = /^\d{4}-\d{2}$/.test(params.get('month') ?? '') ? (params.get('month') as string) : zonedMonth(Date.now(), timeZone);
  const data = item.data;

  return (
    <>
      <p className="mb-2 text-sm">
        <TextLink to={paths.app.catalog.getHref()}>Back to the catalog</TextLink>
      </p>
      <PageHeader
        title={data.name}
        description={
          <span className="flex flex-wrap items-center gap-2">
            {kindLabel(data.kind)}
            {data.sku ? <span className="font-mono text-sm">{data.sku}</span> : null}
            {data.active ? <Badge tone="positive">Active</Badge> : <Badge>Inactive</Badge>}
          </span>
        }
      />
      <div className="space-y-6">
        <SectionCard title={data.can.update ? 'Details' : 'Details (read only)'}>
          <ItemForm item={data} showPrices={data.can.seePrices} readOnly={!data.can.update} />
        </SectionCard>
        {data.kind !== 'service' ? (
          <SectionCard title="Availability" description="How many are free each day, counting reserved and out bookings and the turnaround after pickup.">
            {organization.data ? (
              <AvailabilityMonth itemId={data.id} month={month} timeZone={timeZone} onMonthChange={(m) => setParams({ month: m }, { replace: true })} />
            ) : (
              <PageSpinner />
            )}
          </SectionCard>
        ) : null}
      </div>
    </>
  );
}
