import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { data, useParams, type LoaderFunctionArgs } from 'react-router';
import { TEMPLATE_NAMES, type TemplateName } from '@shared/schemas/documents';
import { Alert } from '@/components/ui/alert';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner } from '@/components/ui/spinner';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage, isApiError } from '@/lib/api';
import { BookingPicker, type PickedBooking } from '@/features/bookings/components/booking-picker';
import { templateQueryOptions, useTemplate } from '@/features/templates/api/get-template';
import { templatesQueryOptions, useTemplates } from '@/features/templates/api/get-templates';
import { TemplateEditor } from '@/features/templates/components/template-editor';
import { templateTitle } from '@/features/templates/components/template-labels';
import { requireMe } from '../../../guards';

export const clientLoader = (queryClient: QueryClient) => async ({ request, params }: LoaderFunctionArgs) => {
  await requireMe(queryClient, request);
  if (!TEMPLATE_NAMES.includes(params.name as TemplateName)) throw data('No such template', { status: 404 });
  void queryClient.prefetchQuery(templateQueryOptions(params.name ?? ''));
  // Who may change templates comes with the list.
  void queryClient.prefetchQuery(templatesQueryOptions());
  return null;
};

export default function TemplateRoute() {
  const { name = '' } = useParams();
  const template = useTemplate(name);
  const library = useTemplates();
  const canEdit = library.data?.can.update ?? false;
  const [booking, setBooking] = useState<PickedBooking | null>(null);
  const title = templateTitle(name);
  if (template.isError && isApiError(template.error) && template.error.status === 404) throw template.error;

  return (
    <>
      <p className="mb-2 text-sm">
        <TextLink to={paths.app.settingsTemplates.getHref()}>Back to document templates</TextLink>
      </p>
      <PageHeader
        title={`${title} template`}
        description={
          library.isPending
            ? undefined
            : canEdit
            ? 'Edit the text, insert variables where the cursor is, and check the preview with a real booking before saving.'
            : 'The text this document is made from, with a preview from a real booking.'
        }
      />
      {template.isPending || library.isPending ? (
        <PageSpinner label="Loading the template…" />
      ) : template.isError ? (
        <Alert tone="danger" title="The template could not be loaded.">
          {errorMessage(template.error)}
        </Alert>
      ) : (
        <TemplateEditor
          template={template.data}
          canEdit={canEdit}
          bookingId={booking?.id ?? null}
          bookingPicker={<BookingPicker label="Preview with booking" value={booking} onChange={setBooking} pickFirst />}
        />
      )}
    </>
  );
}
