import { PageSpinner } from '@/components/ui/spinner';

/** Being built: the customer's pages (issue 7). */
export default function CustomerPagePlaceholder() {
  return <PageSpinner />;
}
