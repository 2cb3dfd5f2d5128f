import { Navigate, useLocation } from 'react-router-dom';
import { Notice } from '@/components/ui/notice';
import { useAuth } from '@/lib/auth';
import { landingPathFor } from '@/lib/permissions';
import { AuthLayout } from '../components/auth-layout';
import { LoginForm } from '../components/login-form';

export function LoginRoute() {
  const { state } = useAuth();
  const location = useLocation();
  const from = (location.state as { from?: string } | null)?.from;

  if (state.status === 'signed-in') {
    return <Navigate to={from && from !== '/login' ? from : landingPathFor(state.user.role)} replace />;
  }

  return (
    <AuthLayout title="Sign in">
      {state.status === 'signed-out' && state.reason === 'expired' ? (
        <Notice tone="info" className="mb-4">
          Your session expired. Sign in again to carry on.
        </Notice>
      ) : null}
      <LoginForm />
    </AuthLayout>
  );
}
