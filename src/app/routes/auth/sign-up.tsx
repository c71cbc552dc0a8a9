import type { QueryClient } from '@tanstack/react-query';
import { useNavigate, type LoaderFunctionArgs } from 'react-router';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { SignUpForm } from '@/features/auth/components/sign-up-form';
import { redirectIfSignedIn } from '../../guards';

export const clientLoader = (queryClient: QueryClient) => ({ request }: LoaderFunctionArgs) => redirectIfSignedIn(queryClient, request);

export default function SignUpRoute() {
  const navigate = useNavigate();
  return (
    <AuthLayout
      title="Create your company's account"
      description="You become the owner: you can invite your office, crew and bookkeeper afterwards."
      footer={
        <>
          Already have an account? <TextLink to={paths.auth.signIn.getHref()}>Sign in</TextLink>
        </>
      }
    >
      <SignUpForm onSuccess={() => navigate(paths.app.root.getHref(), { replace: true })} />
    </AuthLayout>
  );
}
