import { PageHeader } from '@/components/ui/page-header';

// The booking editor lands in the next commit.
export default function BookingEditorPlaceholder() {
  return <PageHeader title="Booking" description="The booking editor is being built." />;
}
