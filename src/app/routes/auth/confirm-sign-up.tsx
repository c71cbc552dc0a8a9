import { useEffect, useRef } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { Alert } from '@/components/ui/alert';
import { Button, buttonClasses } from '@/components/ui/button';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { errorMessage, isApiError } from '@/lib/api';
import { useConfirmSignup } from '@/features/auth/api/confirm-signup';

const TOKEN_MIN = 20;

function LinkProblem({ title, message, to, action }: { title: string; message: string; to: string; action: string }) {
  return (
    <AuthLayout title={title}>
      <Alert tone="warning">{message}</Alert>
      <Link className={buttonClasses('primary', 'md', 'mt-4')} to={to}>
        {action}
      </Link>
    </AuthLayout>
  );
}

/**
 * Where the e-mailed sign-up link lands. It trades the token for the company with a POST, so mail
 * scanners that open links do not use it up, then goes into the app as the new owner.
 */
export default function ConfirmSignUpRoute() {
  const [search] = useSearchParams();
  const token = search.get('token') ?? '';
  const navigate = useNavigate();
  const confirm = useConfirmSignup();
  const fired = useRef(false);

  const start = () => confirm.mutate({ token }, { onSuccess: () => void navigate(paths.app.root.getHref(), { replace: true }) });

  useEffect(() => {
    if (fired.current || token.length < TOKEN_MIN) return;
    fired.current = true;
    start();
    // Once per page load (React runs effects twice in development); `start` only closes over the token.
  }, [token]);

  if (token.length < TOKEN_MIN) {
    return <LinkProblem title="This link is incomplete" message="Open the whole link from the e-mail, or sign up again." to={paths.auth.signUp.getHref()} action="Sign up again" />;
  }
  if (confirm.isError) {
    const error = confirm.error;
    if (isApiError(error, 'invalid_token') || isApiError(error, 'validation')) {
      return <LinkProblem title="This link no longer works" message={errorMessage(error)} to={paths.auth.signUp.getHref()} action="Sign up again" />;
    }
    if (isApiError(error, 'email_taken')) {
      return <LinkProblem title="You already have an account" message={errorMessage(error)} to={paths.auth.signIn.getHref()} action="Sign in" />;
    }
    return (
      <AuthLayout title="We couldn’t finish just now">
        <Alert tone="danger">
          <p>{errorMessage(error)}</p>
          <Button variant="secondary" size="sm" className="mt-3" onClick={start}>
            Try again
          </Button>
        </Alert>
      </AuthLayout>
    );
  }
  return (
    <AuthLayout title="Creating your company">
      <PageSpinner label="Setting up your company…" />
    </AuthLayout>
  );
}
