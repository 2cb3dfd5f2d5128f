import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import type { Capability } from '@/lib/permissions';
import { RequireAuth, RequireCapability } from './guards';
import { AppShell } from './layout/app-shell';
import { RouteError } from './routes/route-error';

// Each page is its own chunk, loaded on first visit.
function guarded(path: string, capability: Capability, lazy: RouteObject['lazy']): RouteObject {
  return { path, element: <RequireCapability capability={capability} />, children: [{ index: true, lazy }] };
}

export const routes: RouteObject[] = [
  {
    errorElement: <RouteError />,
    // Shown while the first page's code loads.
    hydrateFallbackElement: <PageSpinner label="Opening Stanceline" />,
    children: [
      {
        path: paths.login.path,
        lazy: async () => ({ Component: (await import('@/features/auth/routes/login-route')).LoginRoute }),
      },
      {
        path: paths.forgotPassword.path,
        lazy: async () => ({
          Component: (await import('@/features/auth/routes/forgot-password-route')).ForgotPasswordRoute,
        }),
      },
      {
        path: paths.resetPassword.path,
        lazy: async () => ({
          Component: (await import('@/features/auth/routes/reset-password-route')).ResetPasswordRoute,
        }),
      },
      {
        path: paths.invite.path,
        lazy: async () => ({ Component: (await import('@/features/auth/routes/invite-route')).InviteRoute }),
      },
      {
        element: <RequireAuth />,
        children: [
          {
            element: <AppShell />,
            children: [
              { index: true, lazy: async () => ({ Component: (await import('./routes/home')).HomePage }) },
              guarded(paths.athletes.path, 'athletes.view', async () => ({
                Component: (await import('@/features/athletes/routes/athletes-route')).AthletesRoute,
              })),
              guarded(paths.athlete.path, 'athletes.view', async () => ({
                Component: (await import('./routes/athlete')).AthletePage,
              })),
              guarded(paths.sessions.path, 'sessions.view', async () => ({
                Component: (await import('@/features/sessions/routes/sessions-route')).SessionsRoute,
              })),
              guarded(paths.session.path, 'sessions.view', async () => ({
                Component: (await import('./routes/session')).SessionPage,
              })),
              guarded(paths.upload.path, 'clips.upload', async () => ({
                Component: (await import('./routes/upload')).UploadPage,
              })),
              guarded(paths.tolerances.path, 'tolerances.view', async () => ({
                Component: (await import('@/features/standards/routes/tolerances-route')).TolerancesRoute,
              })),
              guarded(paths.exports.path, 'exports.view', async () => ({
                Component: (await import('@/features/exports/routes/exports-route')).ExportsRoute,
              })),
              guarded(paths.club.path, 'club.manage', async () => ({
                Component: (await import('./routes/club')).ClubPage,
              })),
              {
                // Open to every role: anyone holding an export file may look up its columns.
                path: paths.codebook.path,
                lazy: async () => ({
                  Component: (await import('@/features/exports/routes/codebook-route')).CodebookRoute,
                }),
              },
              {
                path: paths.account.path,
                lazy: async () => ({
                  Component: (await import('@/features/auth/routes/account-route')).AccountRoute,
                }),
              },
              {
                path: paths.clip.path,
                lazy: async () => ({
                  Component: (await import('@/features/clip-workspace/routes/clip-workspace-route'))
                    .ClipWorkspaceRoute,
                }),
              },
              {
                // Athletes and guardians read published reviews; staff preview any within their reach.
                path: paths.review.path,
                lazy: async () => ({
                  Component: (await import('@/features/clip-workspace/routes/review-route')).ReviewRoute,
                }),
              },
              guarded(paths.reviewEdit.path, 'reviews.write', async () => ({
                Component: (await import('@/features/reviews/routes/review-edit-route')).ReviewEditRoute,
              })),
              {
                // Any role: each side shows only clips the caller may see (the server checks each).
                path: paths.compare.path,
                lazy: async () => ({
                  Component: (await import('@/features/clip-workspace/routes/compare-route')).CompareRoute,
                }),
              },
              {
                path: '*',
                lazy: async () => ({ Component: (await import('./routes/not-found')).NotFoundPage }),
              },
            ],
          },
        ],
      },
    ],
  },
];

export function createAppRouter() {
  return createBrowserRouter(routes);
}
