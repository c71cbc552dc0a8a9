import type { QueryClient } from '@tanstack/react-query';
import { useNavigate, type LoaderFunctionArgs } from 'react-router';
import { Card } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { ItemForm } from '@/features/catalog/components/item-form';
import { requireArea } from '../../../guards';

// Adding to the price list is the owner's: the same people who see Company settings.
export const clientLoader = (queryClient: QueryClient) => ({ request }: LoaderFunctionArgs) => requireArea(queryClient, request, 'settings').then(() => null);

export default function NewItemRoute() {
  const navigate = useNavigate();
  return (
    <>
      <p className="mb-2 text-sm">
        <TextLink to={paths.app.catalog.getHref()}>Back to the catalog</TextLink>
      </p>
      <PageHeader title="New item" description="A tent, sidewall, table, chair, light, accessory, or a service or fee you charge for." />
      <Card>
        <ItemForm item={null} showPrices onSaved={(item) => navigate(paths.app.catalogItem.getHref(item.id), { replace: true })} />
      </Card>
    </>
  );
}
