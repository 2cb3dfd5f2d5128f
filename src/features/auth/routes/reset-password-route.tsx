import { useState } from 'react';
import { Link, Navigate, useParams, useSearchParams } from 'react-router-dom';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { ApiError } from '@/lib/api-client';
import { useAuth } from '@/lib/auth';
import { landingPathFor } from '@/lib/permissions';
import { usePasswordReset } from '../api/get-password-reset';
import { AuthLayout } from '../components/auth-layout';
import { ResetPasswordForm } from '../components/reset-password-form';

/** The page an e-mailed reset link opens: a new password, then straight into the app. */
export function ResetPasswordRoute() {
  const { token = '' } = useParams();
  const { state } = useAuth();
  const reset = usePasswordReset(token);
  const [saving, setSaving] = useState(false);

  // A link from a shared review carries where to go once the password is set (a path of this app only).
  const [params] = useSearchParams();
  const next = params.get('next');
  const inApp = next && next.startsWith('/') && !next.startsWith('//') ? next : null;
  if (state.status === 'signed-in' && saving)
    return <Navigate to={inApp ?? landingPathFor(state.user.role)} replace />;

  return (
    <AuthLayout title="Choose a new password">
      {reset.isPending ? <PageSpinner label="Checking the link" /> : null}
      {reset.isError ? (
        <div className="space-y-3 text-sm text-granite-700" role="alert">
          <p className="font-medium text-granite-900">
            {reset.error instanceof ApiError && reset.error.status === 410
              ? reset.error.message
              : 'This reset link is not valid. It may have been copied only in part.'}
          </p>
          <p>
            <Link className="font-medium text-glacier-700 underline" to={paths.forgotPassword.href()}>
              Ask for a new link
            </Link>{' '}
            or{' '}
            <Link className="font-medium text-glacier-700 underline" to={paths.login.href()}>
              sign in
            </Link>
            .
          </p>
        </div>
      ) : null}
      {reset.data ? (
        <ResetPasswordForm token={token} email={reset.data.email} onSubmitting={setSaving} />
      ) : null}
    </AuthLayout>
  );
}
