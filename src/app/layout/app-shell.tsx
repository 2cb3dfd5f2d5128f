import { Link, NavLink, Outlet } from 'react-router-dom';
import { LogOut } from 'lucide-react';
import { Wordmark } from '@/components/ui/logo';
import { paths } from '@/config/paths';
import { useMe } from '@/features/auth/api/get-me';
import { useLogout } from '@/features/auth/api/logout';
import { BackgroundIndicator } from '@/features/clip-workspace/background/background-status';
import { useUser } from '@/lib/auth';
import { cn } from '@/lib/format';
import { landingPathFor, navFor, ROLE_LABELS } from '@/lib/permissions';

export function AppShell() {
  const user = useUser();
  const me = useMe();
  const logout = useLogout();
  const nav = navFor(user.role);

  return (
    <div className="flex min-h-screen flex-col">
      <header className="bg-glacier-950 text-white">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-8 gap-y-2 px-4 py-3">
          <Link to={landingPathFor(user.role)} aria-label="Stanceline, start page">
            <Wordmark inverted />
          </Link>
          <nav aria-label="Main" className="order-3 w-full sm:order-none sm:w-auto">
            <ul className="flex flex-wrap gap-1">
              {nav.map((item) => (
                <li key={item.to}>
                  <NavLink
                    to={item.to}
                    end={item.to === '/'}
                    className={({ isActive }) =>
                      cn(
                        'block rounded-md px-3 py-1.5 text-sm font-medium transition-colors',
                        isActive
                          ? 'bg-glacier-800 text-white'
                          : 'text-glacier-200 hover:bg-glacier-900 hover:text-white',
                      )
                    }
                  >
                    {item.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>
          <div className="ml-auto flex items-center gap-4">
            <BackgroundIndicator uploadHref={paths.upload.href()} />
            <div className="text-right leading-tight">
              <Link
                to={paths.account.href()}
                className="text-sm font-medium hover:underline"
                title="Your account"
              >
                {user.name}
              </Link>
              <p className="text-xs text-glacier-300">
                {ROLE_LABELS[user.role]}
                {me.data ? ` · ${me.data.club.name}` : ''}
              </p>
            </div>
            <button
              type="button"
              onClick={() => logout.mutate()}
              disabled={logout.isPending}
              className="inline-flex items-center gap-1.5 rounded-md border border-glacier-700 px-2.5 py-1.5 text-sm text-glacier-100 hover:bg-glacier-900"
            >
              <LogOut aria-hidden="true" className="h-4 w-4" />
              Sign out
            </button>
          </div>
        </div>
        <div
          aria-hidden="true"
          className="h-1 bg-gradient-to-r from-glacier-500 via-glacier-300 to-signal-400"
        />
      </header>
      <main className="mx-auto w-full max-w-6xl flex-1 px-4 py-8">
        <Outlet />
      </main>
    </div>
  );
}
