import { Link, useNavigate } from 'react-router';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { Alert } from '@/components/ui/alert';
import { Button, buttonClasses } from '@/components/ui/button';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { errorMessage, isApiError } from '@/lib/api';
import { useConfirmSignup } from '@/features/auth/api/confirm-signup';
import { useLinkToken } from '@/lib/use-link-token';

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

/** Where the e-mailed sign-up link lands: trades the token for the company, then opens the app as its owner. */
export default function ConfirmSignUpRoute() {
  const navigate = useNavigate();
  const confirm = useConfirmSignup();
  const { complete, start } = useLinkToken((token) =>
    confirm.mutate({ token }, { onSuccess: () => void navigate(paths.app.root.getHref(), { replace: true }) }),
  );

  if (!complete) {
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
