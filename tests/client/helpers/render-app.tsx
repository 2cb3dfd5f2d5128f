import { configure, render } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { setupServer } from 'msw/node';
import { AppProvider } from '@/app/provider';
import { routes } from '@/app/router';
import { authSession, configureApiClient } from '@/lib/api-client';

// The first render loads each page's code on demand; with the whole suite running on two cores that can take
// longer than Testing Library's 1 s default wait. This is a ceiling for waiting, not a speed check.
configure({ asyncUtilTimeout: 15_000 });

/** happy-dom's page origin; the API client sends requests here and msw answers them. */
export const ORIGIN = 'http://localhost:3000';

export function createApiMock() {
  return setupServer();
}

/** The whole app (providers, router, guards) at one URL, with a fresh query cache. */
export function renderApp(path: string) {
  configureApiClient({ baseUrl: ORIGIN });
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  const view = render(
    <AppProvider>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return { ...view, router };
}

export function resetSession() {
  authSession.end('signed-out');
}
