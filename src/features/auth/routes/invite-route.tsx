import { useState } from 'react';
import { Link, Navigate, useParams } from 'react-router-dom';
import { Button, ButtonLink } from '@/components/ui/button';
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
  const { state, signOut } = useAuth();
  const invitation = useInvitation(token);
  const [joining, setJoining] = useState(false);

  if (state.status === 'signed-in' && joining)
    return <Navigate to={landingPathFor(state.user.role)} replace />;
  if (state.status === 'signed-in') {
    // An invitation is for a new sign-in; accepting it while signed in as someone else would mix the two.
    return (
      <AuthLayout title="Accept your invitation">
        <p className="text-sm text-granite-700">
          You are signed in as <strong>{state.user.email}</strong>. Sign out first to accept this invitation,
          or go on as yourself.
        </p>
        <div className="mt-4 flex gap-2">
          <Button onClick={() => void signOut()}>Sign out</Button>
          <ButtonLink variant="secondary" to={landingPathFor(state.user.role)}>
            Continue as {state.user.name}
          </ButtonLink>
        </div>
      </AuthLayout>
    );
  }

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
            <strong>{ROLE_LABELS[invitation.data.role].toLowerCase()}</strong>
            {invitation.data.athleteName ? ` for ${invitation.data.athleteName}` : ''}. Set your name and
            password to join.
          </p>
          <AcceptInvitationForm token={token} email={invitation.data.email} onSubmitting={setJoining} />
        </>
      ) : null}
    </AuthLayout>
  );
}
