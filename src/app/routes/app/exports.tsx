import { PageHeader } from '@/components/ui/page-header';

export default function ExportsRoute() {
  return <PageHeader title="Exports" />;
}
