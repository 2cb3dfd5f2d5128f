// @vitest-environment happy-dom
import { cleanup, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { InvitationPreviewResponse } from '@shared/schemas/auth.schema';
import { userWith } from '../helpers/demo-data';
import { createApiMock, ORIGIN, renderApp, resetSession } from '../helpers/render-app';

const api = createApiMock();
const TOKEN = 'invite-token-0123456789';
const invited = userWith('guardian', { email: 'new.guardian@home.example', name: 'Robin Ashgrove' });
const preview: InvitationPreviewResponse = {
  invitation: {
    email: invited.email,
    role: 'guardian',
    club: { id: invited.clubId, name: 'Test Valley Ski Club' },
    athleteName: 'Juno Fairweather',
    expiresAt: '2026-12-20T00:00:00.000Z',
  },
};

beforeAll(() => api.listen({ onUnhandledRequest: 'error' }));
afterEach(() => {
  cleanup();
  api.resetHandlers();
  resetSession();
});
afterAll(() => api.close());

describe('invitation page', () => {
  it('shows the invitation, checks the password and signs the new member in', async () => {
    const bodies: unknown[] = [];
    api.use(
      http.post(`${ORIGIN}/api/auth/refresh`, () =>
        HttpResponse.json({ error: { code: 'unauthorized', message: 'No session' } }, { status: 401 }),
      ),
      http.get(`${ORIGIN}/api/invitations/${TOKEN}`, () => HttpResponse.json(preview)),
      http.post(`${ORIGIN}/api/invitations/accept`, async ({ request }) => {
        bodies.push(await request.json());
        return HttpResponse.json({ accessToken: 'new', user: invited }, { status: 201 });
      }),
      http.get(`${ORIGIN}/api/me`, () =>
        HttpResponse.json({ user: invited, club: { id: invited.clubId, name: 'Test Valley Ski Club' } }),
      ),
    );
    const user = userEvent.setup();
    const { router } = renderApp(`/invite/${TOKEN}`);

    expect(await screen.findByText('Test Valley Ski Club')).toBeTruthy();
    expect(screen.getByText(/Juno Fairweather/)).toBeTruthy();
    expect((screen.getByLabelText('Email') as HTMLInputElement).value).toBe(invited.email);

    await user.type(screen.getByLabelText('Your name'), 'Robin Ashgrove');
    await user.type(screen.getByLabelText('Choose a password'), 'too-short');
    await user.click(screen.getByRole('button', { name: 'Join the club' }));
    // acceptInvitationSchema in shared/schemas/auth.schema.ts: at least 10 characters ("too-short" has 9).
    expect(await screen.findByText('Use at least 10 characters')).toBeTruthy();
    expect(bodies).toEqual([]);

    await user.type(screen.getByLabelText('Choose a password'), '!');
    await user.click(screen.getByRole('button', { name: 'Join the club' }));
    expect(await screen.findByRole('navigation', { name: 'Main' })).toBeTruthy();
    expect(bodies).toEqual([{ token: TOKEN, name: 'Robin Ashgrove', password: 'too-short!' }]);
    expect(router.state.location.pathname).toBe('/');
  });

  it('asks someone already signed in to sign out first', async () => {
    const coach = userWith('coach');
    api.use(
      http.post(`${ORIGIN}/api/auth/refresh`, () => HttpResponse.json({ accessToken: 't', user: coach })),
      http.get(`${ORIGIN}/api/invitations/${TOKEN}`, () => HttpResponse.json(preview)),
      http.post(`${ORIGIN}/api/auth/logout`, () => new HttpResponse(null, { status: 204 })),
    );
    const user = userEvent.setup();
    renderApp(`/invite/${TOKEN}`);
    expect(await screen.findByText(/Sign out first to accept this invitation/)).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'Sign out' }));
    expect(await screen.findByRole('button', { name: 'Join the club' })).toBeTruthy();
  });
});
