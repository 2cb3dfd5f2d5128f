import { Link, Navigate, useParams } from 'react-router-dom';
import { PageSpinner } from '@/components/ui/spinner';
import { QueryError } from '@/components/ui/query-error';
import { paths } from '@/config/paths';
import { useAuth } from '@/lib/auth';
import { landingPathFor, ROLE_LABELS } from '@/lib/permissions';
import { useInvitation } from '../api/get-invitation';
import { AcceptInvitationForm } from '../components/accept-invitation-form';
import { AuthLayout } from '../components/auth-layout';

export function InviteRoute() {
  const { token = '' } = useParams();
  const { state } = useAuth();
  const invitation = useInvitation(token);

  if (state.status === 'signed-in') return <Navigate to={landingPathFor(state.user.role)} replace />;

  return (
    <AuthLayout title="Accept your invitation">
      {invitation.isPending ? <PageSpinner label="Checking the invitation" /> : null}
      {invitation.isError ? (
        <div className="space-y-4">
          <QueryError error={invitation.error} what="this invitation" />
          <p className="text-sm text-granite-600">
            Invitations work once and expire. Ask the person who invited you for a new one, or{' '}
            <Link className="font-medium text-glacier-700 underline" to={paths.login.href()}>
              sign in
            </Link>{' '}
            if you already have an account.
          </p>
        </div>
      ) : null}
      {invitation.data ? (
        <>
          <p className="mb-4 text-sm text-granite-700">
            You are invited to <strong>{invitation.data.club.name}</strong> as{' '}
            <strong>{ROLE_LABELS[invitation.data.role].toLowerCase()}</strong>. Set your name and password to
            join.
          </p>
          <AcceptInvitationForm token={token} email={invitation.data.email} />
        </>
      ) : null}
    </AuthLayout>
  );
}
