import type { ReactNode } from 'react';
import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { LogoMark } from '@/components/ui/logo';
import { Notice } from '@/components/ui/notice';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { useAuth, useUser } from '@/lib/auth';
import { can, landingPathFor, type Capability } from '@/lib/permissions';

export function RequireAuth() {
  const { state, retryRestore } = useAuth();
  const location = useLocation();

  if (state.status === 'restoring') {
    return (
      <div className="flex min-h-screen flex-col items-center justify-center gap-4">
        <LogoMark className="h-12 w-12" />
        <PageSpinner label="Opening Stanceline" />
      </div>
    );
  }
  if (state.status === 'unreachable') {
    return (
      <div className="mx-auto flex min-h-screen max-w-md flex-col justify-center gap-4 px-4">
        <Notice tone="error" title="Stanceline cannot be reached">
          {state.message}
        </Notice>
        <Button onClick={retryRestore}>Try again</Button>
      </div>
    );
  }
  if (state.status === 'signed-out') {
    // After a deliberate sign-out the next person starts at their own landing page, not at this one.
    const from = state.reason === 'signed-out' ? undefined : `${location.pathname}${location.search}`;
    return <Navigate to={paths.login.href()} replace state={from ? { from } : null} />;
  }
  return <Outlet />;
}

/** Hides a section from roles that may not use it; the server refuses their requests anyway. */
export function RequireCapability({ capability }: { capability: Capability }) {
  const user = useUser();
  if (!can(user.role, capability)) {
    return (
      <Notice tone="info" title="Not available to your role">
        This part of Stanceline is for other roles in the club. Use the menu above to get to your own pages.
      </Notice>
    );
  }
  return <Outlet />;
}

/** "/" is Home for roles that have one and their first section for the others. */
export function HomeOrLanding({ children }: { children: ReactNode }) {
  const user = useUser();
  if (!can(user.role, 'home.view')) return <Navigate to={landingPathFor(user.role)} replace />;
  return children;
}
