import type { QueryClient } from '@tanstack/react-query';
import { useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { TextLink } from '@/components/ui/text-link';
import { paths, safeNext } from '@/config/paths';
import { SignInForm } from '@/features/auth/components/sign-in-form';
import { redirectIfSignedIn } from '../../guards';

export const clientLoader = (queryClient: QueryClient) => ({ request }: LoaderFunctionArgs) => redirectIfSignedIn(queryClient, request);

export default function SignInRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const next = safeNext(params.get('next'));
  return (
    <AuthLayout
      title="Sign in"
      description="Sign in to your company's Guyline."
      footer={
        <>
          New to Guyline? <TextLink to={paths.auth.signUp.getHref()}>Create an account for your company</TextLink>
        </>
      }
    >
      <SignInForm onSuccess={() => navigate(next, { replace: true })} />
    </AuthLayout>
  );
}
