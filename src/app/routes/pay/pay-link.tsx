import { useState } from 'react';
import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router';
import { Card, SectionCard } from '@/components/ui/card';
import { PageSpinner } from '@/components/ui/spinner';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { payLinkDocumentUrl, payLinkQueryOptions, usePayLink } from '@/features/portal/api/get-pay-link';
import { useStartPayLinkCheckout } from '@/features/portal/api/start-pay-link-checkout';
import { CompanyContact } from '@/features/portal/components/company-contact';
import { DocumentLink } from '@/features/portal/components/document-link';
import { InvoiceFigures, InvoiceStatus } from '@/features/portal/components/invoice-card';
import { formatDay, invoiceTitle, money } from '@/features/portal/components/labels';
import { goToPaymentPage, PayForm } from '@/features/portal/components/pay-form';
import { isDeadLink, PayLinkProblem } from '@/features/portal/components/pay-link-problem';
import { PortalLayout } from '@/features/portal/components/portal-layout';
import { QueryProblem } from '@/features/portal/components/query-problem';

export { PortalRouteError as ErrorBoundary } from '@/features/portal/components/portal-route-error';

export const clientLoader = (queryClient: QueryClient) => async ({ params }: LoaderFunctionArgs) => {
  if (params.token) void queryClient.prefetchQuery(payLinkQueryOptions(params.token));
  return null;
};

/** An e-mailed pay link: one invoice, paid by card, no sign-in. */
export default function PayLinkRoute() {
  const { token = '' } = useParams();
  const link = usePayLink(token);
  const checkout = useStartPayLinkCheckout();
  const [leaving, setLeaving] = useState(false);

  if (link.isPending) {
    return (
      <PortalLayout title="Pay your invoice">
        <PageSpinner label="Opening your invoice…" />
      </PortalLayout>
    );
  }
  if (link.isError) {
    if (isDeadLink(link.error)) return <PayLinkProblem error={link.error} />;
    return (
      <PortalLayout title="Pay your invoice">
        <QueryProblem error={link.error} what="your invoice" onRetry={() => void link.refetch()} />
      </PortalLayout>
    );
  }

  const { invoice, company, currency, timeZone } = link.data;
  const title = invoiceTitle(invoice);
  const owing = invoice.balanceCents > 0 && invoice.status !== 'void' && invoice.kind !== 'credit_note';

  return (
    <PortalLayout title={owing ? `Pay ${title}` : title} company={company}>
      <div className="space-y-5">
        <Card>
          <div className="flex flex-wrap items-start justify-between gap-2">
            <p className="text-canvas-800">
              For {link.data.customerName}, booking {link.data.bookingReference}
              {link.data.eventStart ? <>, event on {formatDay(link.data.eventStart, timeZone)}</> : null}.
            </p>
            <InvoiceStatus invoice={invoice} />
          </div>
          <div className="mt-4">
            <InvoiceFigures invoice={invoice} currency={currency} timeZone={timeZone} />
          </div>
          {owing ? (
            <p className="mt-4 text-lg font-semibold text-canvas-900">
              Left to pay: <span className="tabular-nums">{money(invoice.balanceCents, currency)}</span>
            </p>
          ) : (
            <p className="mt-4 font-semibold text-pine-800">{invoice.status === 'void' ? 'This invoice was cancelled: there is nothing to pay.' : 'Nothing left to pay. Thank you.'}</p>
          )}
          {invoice.documentId ? <DocumentLink className="mt-4" href={payLinkDocumentUrl(token, invoice.documentId)} label={`Download ${title} (PDF)`} /> : null}
          {owing && invoice.canPay ? (
            <div className="mt-5 border-t border-canvas-200 pt-4">
              <PayForm
                balanceCents={invoice.balanceCents}
                currency={currency}
                what={title}
                companyName={company.name}
                isPending={checkout.isPending}
                leaving={leaving}
                error={checkout.error}
                onPay={(body) => checkout.mutate({ token, body }, { onSuccess: ({ url }) => setLeaving(goToPaymentPage(url)) })}
              />
            </div>
          ) : owing ? (
            <p className="mt-4 text-sm text-canvas-700">Card payment isn’t available online for this invoice. Contact {company.name} to pay it another way.</p>
          ) : null}
        </Card>
        <SectionCard title="Everything in one place">
          <p className="text-canvas-700">
            Sign in with your e-mail address to see all your bookings with {company.name}: what you rent, your agreement, invoices and receipts.
          </p>
          <TextLink className="mt-3 inline-block" to={paths.portal.signIn.getHref()}>
            Sign in to your rentals
          </TextLink>
        </SectionCard>
        <SectionCard title={`Contact ${company.name}`}>
          <CompanyContact company={company} />
        </SectionCard>
      </div>
    </PortalLayout>
  );
}
