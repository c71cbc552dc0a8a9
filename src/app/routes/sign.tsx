import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { PageSpinner } from '@/components/ui/spinner';
import { errorMessage } from '@/lib/api';
import { signingPageQueryOptions, useSigningPage } from '@/features/signing/api/get-signing-page';
import { LinkStateView, linkStateFromError } from '@/features/signing/components/link-state';
import { SIGNING_TITLE, SigningFlow } from '@/features/signing/components/signing-flow';
import { SigningLayout } from '@/features/signing/components/signing-layout';

/** No sign-in: the token in the address is the customer's key to this one agreement. */
export const clientLoader = (queryClient: QueryClient) => async ({ params }: LoaderFunctionArgs) => {
  if (params.token) void queryClient.prefetchQuery(signingPageQueryOptions(params.token));
  return null;
};

export default function SignRoute() {
  const { token = '' } = useParams();
  const page = useSigningPage(token);

  if (page.isPending) {
    return (
      <SigningLayout companyName={null} title={SIGNING_TITLE}>
        <PageSpinner label="Opening your agreement…" />
      </SigningLayout>
    );
  }
  if (page.isError) {
    const state = linkStateFromError(page.error);
    if (state) return <LinkStateView code={state.code} message={state.message} company={state.company} />;
    return (
      <SigningLayout companyName={null} title={SIGNING_TITLE}>
        <Alert tone="danger" title="The agreement could not be opened.">
          {errorMessage(page.error)} Reload the page to try again.
        </Alert>
      </SigningLayout>
    );
  }
  // Keyed by token so a different link starts its own way through the steps.
  return <SigningFlow key={token} token={token} page={page.data} />;
}
