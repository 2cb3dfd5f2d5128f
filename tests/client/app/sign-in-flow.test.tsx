// @vitest-environment happy-dom
import { cleanup, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { AthleteListResponse } from '@shared/schemas/athlete.schema';
import { ATHLETE_WITH_CONSENT, U14, userWith } from '../helpers/demo-data';
import { createApiMock, ORIGIN, renderApp, resetSession } from '../helpers/render-app';

const api = createApiMock();
const coach = userWith('coach');
const noCookie = http.post(`${ORIGIN}/api/auth/refresh`, () =>
  HttpResponse.json({ error: { code: 'unauthorized', message: 'No session' } }, { status: 401 }),
);
const common = [
  http.get(`${ORIGIN}/api/me`, () =>
    HttpResponse.json({ user: coach, club: { id: coach.clubId, name: 'Test Club' } }),
  ),
  http.get(`${ORIGIN}/api/age-groups`, () => HttpResponse.json({ ageGroups: [U14] })),
];

beforeAll(() => api.listen({ onUnhandledRequest: 'error' }));
afterEach(() => {
  cleanup();
  api.resetHandlers();
  resetSession();
});
afterAll(() => api.close());

describe('signing in', () => {
  it('sends a signed-out visitor to sign in, checks the form, and returns to the page asked for', async () => {
    const user = userEvent.setup();
    api.use(
      noCookie,
      ...common,
      http.post(`${ORIGIN}/api/auth/login`, async ({ request }) => {
        const body = (await request.json()) as { email: string; password: string };
        return body.password === 'right-password'
          ? HttpResponse.json({ accessToken: 'token-1', user: coach })
          : HttpResponse.json(
              { error: { code: 'invalid_credentials', message: 'Wrong email or password' } },
              { status: 401 },
            );
      }),
      http.get(`${ORIGIN}/api/athletes`, ({ request }) =>
        request.headers.get('authorization') === 'Bearer token-1'
          ? HttpResponse.json<AthleteListResponse>({ athletes: [ATHLETE_WITH_CONSENT] })
          : HttpResponse.json({ error: { code: 'unauthorized', message: 'Sign in' } }, { status: 401 }),
      ),
    );
    const { router } = renderApp('/athletes');

    await screen.findByRole('button', { name: 'Sign in' });
    expect(router.state.location.pathname).toBe('/login');

    // The shared zod schema checks the form before anything is sent.
    await user.type(screen.getByLabelText('Email'), 'not-an-address');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('Enter a valid email address')).toBeTruthy();
    expect(screen.getByText('Enter your password')).toBeTruthy();

    await user.clear(screen.getByLabelText('Email'));
    await user.type(screen.getByLabelText('Email'), 'Coach@Club.example');
    await user.type(screen.getByLabelText('Password'), 'wrong');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect((await screen.findByRole('alert')).textContent).toBe('Wrong email or password');

    await user.clear(screen.getByLabelText('Password'));
    await user.type(screen.getByLabelText('Password'), 'right-password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByRole('link', { name: 'Pia Underhill' })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/athletes');
    const nav = screen.getByRole('navigation', { name: 'Main' });
    expect(Array.from(nav.querySelectorAll('a')).map((a) => a.textContent)).toEqual([
      'Home',
      'Athletes',
      'Sessions',
      'Upload',
      'Standards',
      'Exports',
    ]);
  });

  it('restores the session from the refresh cookie on load', async () => {
    api.use(
      ...common,
      http.post(`${ORIGIN}/api/auth/refresh`, () =>
        HttpResponse.json({ accessToken: 'token-2', user: coach }),
      ),
      http.get(`${ORIGIN}/api/athletes`, () => HttpResponse.json<AthleteListResponse>({ athletes: [] })),
    );
    renderApp('/athletes');
    expect(await screen.findByText('No athletes yet')).toBeTruthy();
  });

  it('says the session expired when the token runs out and the refresh fails', async () => {
    let refreshes = 0;
    api.use(
      ...common,
      http.post(`${ORIGIN}/api/auth/refresh`, () => {
        refreshes += 1;
        return refreshes === 1
          ? HttpResponse.json({ accessToken: 'token-3', user: coach })
          : HttpResponse.json(
              { error: { code: 'unauthorized', message: 'Refresh token revoked' } },
              { status: 401 },
            );
      }),
      http.get(`${ORIGIN}/api/athletes`, () =>
        HttpResponse.json({ error: { code: 'token_expired', message: 'Expired' } }, { status: 401 }),
      ),
    );
    const { router } = renderApp('/athletes');
    expect(await screen.findByText(/Your session expired/)).toBeTruthy();
    await waitFor(() => expect(router.state.location.pathname).toBe('/login'));
    // One refresh at start-up, one on the expired request; no loop.
    expect(refreshes).toBe(2);
  });
});
