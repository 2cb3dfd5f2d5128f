// @vitest-environment happy-dom
import { cleanup, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { userWith } from '../helpers/demo-data';
import { createApiMock, ORIGIN, renderApp, resetSession } from '../helpers/render-app';

const api = createApiMock();
const TOKEN = 'reset-token-0123456789';
const member = userWith('coach', { email: 'coach@test.example', name: 'Ari Coach' });

beforeAll(() => api.listen({ onUnhandledRequest: 'error' }));
afterEach(() => {
  cleanup();
  api.resetHandlers();
  resetSession();
});
afterAll(() => api.close());

const signedOut = http.post(`${ORIGIN}/api/auth/refresh`, () =>
  HttpResponse.json({ error: { code: 'unauthorized', message: 'No session' } }, { status: 401 }),
);

describe('forgotten password', () => {
  it('asks for a link from the sign-in page and says what happens next', async () => {
    const bodies: unknown[] = [];
    api.use(
      signedOut,
      http.post(`${ORIGIN}/api/auth/password-reset`, async ({ request }) => {
        bodies.push(await request.json());
        return HttpResponse.json(
          { message: 'If that address belongs to a member, a link is on its way.' },
          { status: 202 },
        );
      }),
    );
    const user = userEvent.setup();
    renderApp('/login');
    await user.click(await screen.findByRole('link', { name: 'Forgot your password?' }));
    await screen.findByRole('button', { name: 'Send the link' });
    await user.type(screen.getByLabelText('Email'), 'coach@test.example');
    await user.click(screen.getByRole('button', { name: 'Send the link' }));
    expect(
      await screen.findByText('If that address belongs to a member, a link is on its way.'),
    ).toBeTruthy();
    expect(bodies).toEqual([{ email: 'coach@test.example' }]);
  });

  it('sets a new password from the link, showing the server’s reason beside the field', async () => {
    const bodies: unknown[] = [];
    api.use(
      signedOut,
      http.get(`${ORIGIN}/api/auth/password-reset/${TOKEN}`, () =>
        HttpResponse.json({ email: member.email }),
      ),
      http.post(`${ORIGIN}/api/auth/password-reset/${TOKEN}`, async ({ request }) => {
        const body = (await request.json()) as { password: string };
        bodies.push(body);
        if (body.password === 'password1234') {
          return HttpResponse.json(
            {
              error: {
                code: 'validation_failed',
                message: 'password: choose another password: it is too easy to guess',
                details: {
                  issues: [
                    { path: ['password'], message: 'Choose another password: it is too easy to guess' },
                  ],
                },
              },
            },
            { status: 400 },
          );
        }
        return HttpResponse.json({ accessToken: 'fresh', user: member });
      }),
      // The coach lands on Athletes after signing in.
      http.get(`${ORIGIN}/api/age-groups`, () => HttpResponse.json({ ageGroups: [] })),
      http.get(`${ORIGIN}/api/athletes`, () => HttpResponse.json({ athletes: [] })),
      // A coach lands on Home: the flag inbox and the latest clips.
      http.get(`${ORIGIN}/api/flags`, () =>
        HttpResponse.json({ flags: [], total: 0, page: 1, pageSize: 10 }),
      ),
      http.get(`${ORIGIN}/api/clips`, () => HttpResponse.json({ clips: [] })),
      http.get(`${ORIGIN}/api/me`, () =>
        HttpResponse.json({ user: member, club: { id: member.clubId, name: 'Test Club' } }),
      ),
    );
    const user = userEvent.setup();
    const { router } = renderApp(`/reset-password/${TOKEN}`);
    expect(((await screen.findByLabelText('Email')) as HTMLInputElement).value).toBe(member.email);
    await user.type(screen.getByLabelText('New password'), 'password1234');
    await user.click(screen.getByRole('button', { name: 'Set the new password' }));
    expect(await screen.findByText('Choose another password: it is too easy to guess')).toBeTruthy();
    await user.clear(screen.getByLabelText('New password'));
    await user.type(screen.getByLabelText('New password'), 'harbor kite seven maples');
    await user.click(screen.getByRole('button', { name: 'Set the new password' }));
    expect(await screen.findByRole('navigation', { name: 'Main' })).toBeTruthy();
    expect(bodies).toEqual([{ password: 'password1234' }, { password: 'harbor kite seven maples' }]);
    expect(router.state.location.pathname).toBe('/');
    expect(await screen.findByText('Nothing to review')).toBeTruthy();
  });

  it('a first password from a shared review’s e-mail opens that review', async () => {
    const guardian = userWith('guardian', { email: 'kin@test.example', name: 'Kin Guardian' });
    api.use(
      signedOut,
      http.get(`${ORIGIN}/api/auth/password-reset/${TOKEN}`, () =>
        HttpResponse.json({ email: guardian.email }),
      ),
      http.post(`${ORIGIN}/api/auth/password-reset/${TOKEN}`, () =>
        HttpResponse.json({ accessToken: 'fresh', user: guardian }),
      ),
      http.get(`${ORIGIN}/api/reviews/r-1/view`, () =>
        HttpResponse.json({ error: { code: 'not_found', message: 'Review not found' } }, { status: 404 }),
      ),
      http.get(`${ORIGIN}/api/me`, () =>
        HttpResponse.json({ user: guardian, club: { id: guardian.clubId, name: 'Test Club' } }),
      ),
    );
    const user = userEvent.setup();
    const { router } = renderApp(`/reset-password/${TOKEN}?next=%2Freviews%2Fr-1`);
    await screen.findByLabelText('New password');
    await user.type(screen.getByLabelText('New password'), 'harbor kite seven maples');
    await user.click(screen.getByRole('button', { name: 'Set the new password' }));
    await screen.findByRole('heading', { name: 'Review not found' });
    expect(router.state.location.pathname).toBe('/reviews/r-1');
  });

  it('says plainly when a link was used already, with a way to ask again', async () => {
    api.use(
      signedOut,
      http.get(`${ORIGIN}/api/auth/password-reset/${TOKEN}`, () =>
        HttpResponse.json(
          { error: { code: 'reset_used', message: 'This reset link was used already; ask for a new one' } },
          { status: 410 },
        ),
      ),
    );
    renderApp(`/reset-password/${TOKEN}`);
    expect(await screen.findByText('This reset link was used already; ask for a new one')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Ask for a new link' })).toBeTruthy();
  });
});
