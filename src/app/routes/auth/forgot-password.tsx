import { AuthLayout } from '@/components/layouts/auth-layout';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { ForgotPasswordForm } from '@/features/auth/components/forgot-password-form';

export default function ForgotPasswordRoute() {
  return (
    <AuthLayout
      title="Reset your password"
      description="Enter the e-mail address you sign in with. We will send a link to choose a new password."
      footer={<TextLink to={paths.auth.signIn.getHref()}>Back to sign in</TextLink>}
    >
      <ForgotPasswordForm />
    </AuthLayout>
  );
}
