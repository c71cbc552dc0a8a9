import { PageHeader } from '@/components/ui/page-header';

export default function ReportsRoute() {
  return <PageHeader title="Reports" />;
}
