import { useState } from 'react';
import { useSearchParams } from 'react-router';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { Alert } from '@/components/ui/alert';
import { buttonClasses } from '@/components/ui/button';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { ResetPasswordForm } from '@/features/auth/components/reset-password-form';
import { Link } from 'react-router';

export default function ResetPasswordRoute() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const [done, setDone] = useState(false);

  if (!token) {
    return (
      <AuthLayout title="Choose a new password" footer={<TextLink to={paths.auth.signIn.getHref()}>Back to sign in</TextLink>}>
        <Alert tone="warning" title="This link is incomplete.">
          Open the link from the e-mail again, or ask for a new one.
        </Alert>
        <Link className={buttonClasses('primary', 'md', 'mt-4')} to={paths.auth.forgotPassword.getHref()}>
          Ask for a new link
        </Link>
      </AuthLayout>
    );
  }

  if (done) {
    return (
      <AuthLayout title="Password changed">
        <div aria-live="polite">
          <Alert tone="success">Your new password is set. Sign in with it now.</Alert>
        </div>
        <Link className={buttonClasses('primary', 'md', 'mt-4')} to={paths.auth.signIn.getHref()}>
          Sign in
        </Link>
      </AuthLayout>
    );
  }

  return (
    <AuthLayout title="Choose a new password" footer={<TextLink to={paths.auth.signIn.getHref()}>Back to sign in</TextLink>}>
      <ResetPasswordForm token={token} onSuccess={() => setDone(true)} />
    </AuthLayout>
  );
}
