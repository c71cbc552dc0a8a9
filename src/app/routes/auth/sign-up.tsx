import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { Alert, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { SignUpForm } from '@/features/auth/components/sign-up-form';
import { redirectIfSignedIn } from '../../guards';

export const clientLoader = (queryClient: QueryClient) => ({ request }: LoaderFunctionArgs) => redirectIfSignedIn(queryClient, request);

export default function SignUpRoute() {
  // The same answer for every address: the e-mail says whether a link or a note came.
  const [sent, setSent] = useState<{ message: string; email: string } | null>(null);
  const footer = (
    <>
      Already have an account? <TextLink to={paths.auth.signIn.getHref()}>Sign in</TextLink>
    </>
  );

  if (sent) {
    return (
      <AuthLayout title="Check your e-mail" footer={footer}>
        <LiveRegion>
          <Alert tone="success" title={sent.message}>
            We wrote to {sent.email}. Open the link in that e-mail to finish (if the address already has an account, the e-mail says so instead); check the spam folder if nothing arrives in a few minutes.
          </Alert>
        </LiveRegion>
        <Button variant="secondary" className="mt-4" onClick={() => setSent(null)}>
          Use another address
        </Button>
      </AuthLayout>
    );
  }

  return (
    <AuthLayout
      title="Create your company's account"
      description="You become the owner: you can invite your office, crew and bookkeeper afterwards. We e-mail you a link to finish."
      footer={footer}
    >
      <SignUpForm onSuccess={(answer, email) => setSent({ message: answer.message, email })} />
    </AuthLayout>
  );
}
