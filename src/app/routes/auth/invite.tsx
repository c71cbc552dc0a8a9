import { useNavigate, useSearchParams, Link } from 'react-router';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { Alert } from '@/components/ui/alert';
import { buttonClasses } from '@/components/ui/button';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { errorMessage, isApiError } from '@/lib/api';
import { useInvite } from '@/features/auth/api/get-invite';
import { AcceptInviteForm } from '@/features/auth/components/accept-invite-form';

function InvalidInvite({ text }: { text: string }) {
  return (
    <AuthLayout title="Invitation not valid">
      <Alert tone="warning" title={text}>
        Ask the person who invited you to send the invitation again.
      </Alert>
      <Link className={buttonClasses('secondary', 'md', 'mt-4')} to={paths.auth.signIn.getHref()}>
        Go to sign in
      </Link>
    </AuthLayout>
  );
}

export default function InviteRoute() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const navigate = useNavigate();
  const invite = useInvite(token);

  if (!token) return <InvalidInvite text="This invitation link is incomplete." />;
  if (invite.isPending) {
    return (
      <AuthLayout title="Join your team">
        <PageSpinner label="Opening the invitation…" />
      </AuthLayout>
    );
  }
  if (invite.isError) {
    const notFound = isApiError(invite.error) && invite.error.status === 404;
    return <InvalidInvite text={notFound ? 'This invitation has expired or has already been used.' : errorMessage(invite.error)} />;
  }

  return (
    <AuthLayout title={`Join ${invite.data.organizationName}`} description="You have been invited to work in Guyline. Choose a password to accept.">
      <AcceptInviteForm token={token} invite={invite.data} onSuccess={() => navigate(paths.app.root.getHref(), { replace: true })} />
    </AuthLayout>
  );
}
