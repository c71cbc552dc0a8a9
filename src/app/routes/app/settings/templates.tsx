import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner } from '@/components/ui/spinner';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { templatesQueryOptions, useTemplates } from '@/features/templates/api/get-templates';
import { TemplatesTable } from '@/features/templates/components/templates-table';
import { requireMe } from '../../../guards';

export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  await requireMe(queryClient, request);
  void queryClient.prefetchQuery(templatesQueryOptions());
  return null;
};

export default function TemplatesRoute() {
  const templates = useTemplates();
  const documents = templates.data?.data.filter((t) => !t.name.startsWith('email-')) ?? [];
  const emails = templates.data?.data.filter((t) => t.name.startsWith('email-')) ?? [];
  return (
    <>
      <p className="mb-2 text-sm">
        <TextLink to={paths.app.settings.getHref()}>Back to company settings</TextLink>
      </p>
      <PageHeader
        title="Document templates"
        description={
          <>
            The text of your rental agreements, invoices, receipts and credit notes, and of the e-mails that carry them. The clauses of the rental
            agreement live in the <TextLink to={paths.app.settingsClauses.getHref()}>clause library</TextLink>.
          </>
        }
      />
      {templates.isPending ? (
        <PageSpinner label="Loading the templates…" />
      ) : templates.isError ? (
        <Alert tone="danger" title="The templates could not be loaded.">
          {errorMessage(templates.error)}
        </Alert>
      ) : (
        <div className="space-y-8">
          {templates.data.can.update ? null : <p className="text-sm text-canvas-700">You can read the templates; changing them is the owner’s.</p>}
          <section aria-labelledby="documents-heading">
            <h2 id="documents-heading" className="mb-3 text-lg font-semibold text-canvas-900">
              Documents
            </h2>
            <TemplatesTable templates={documents} hrefOf={paths.app.settingsTemplate.getHref} />
          </section>
          <section aria-labelledby="emails-heading">
            <h2 id="emails-heading" className="mb-3 text-lg font-semibold text-canvas-900">
              E-mails
            </h2>
            <TemplatesTable templates={emails} hrefOf={paths.app.settingsTemplate.getHref} />
          </section>
        </div>
      )}
    </>
  );
}
