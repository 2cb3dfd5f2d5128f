// @vitest-environment happy-dom
import { cleanup, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { AthleteDetailDto } from '@shared/schemas/athlete.schema';
import type { UserDto } from '@shared/schemas/auth.schema';
import { ATHLETE_NO_CONSENT, userWith } from '../helpers/demo-data';
import { createApiMock, ORIGIN, renderApp, resetSession } from '../helpers/render-app';

const api = createApiMock();

function signedInAs(user: UserDto, athlete: AthleteDetailDto) {
  let record = athlete;
  const consentBodies: unknown[] = [];
  api.use(
    http.post(`${ORIGIN}/api/auth/refresh`, () => HttpResponse.json({ accessToken: 't', user })),
    http.get(`${ORIGIN}/api/me`, () =>
      HttpResponse.json({ user, club: { id: user.clubId, name: 'Test Club' } }),
    ),
    http.get(`${ORIGIN}/api/athletes/:id`, () => HttpResponse.json({ athlete: record })),
    http.get(`${ORIGIN}/api/clips`, () => HttpResponse.json({ clips: [] })),
    http.get(`${ORIGIN}/api/flags`, () => HttpResponse.json({ flags: [], total: 0, page: 1, pageSize: 10 })),
    http.get(`${ORIGIN}/api/athletes/:id/consent`, () =>
      HttpResponse.json({ events: [], guardianAccess: [] }),
    ),
    http.post(`${ORIGIN}/api/athletes/:id/consent`, async ({ request }) => {
      const body = (await request.json()) as { guardianName: string };
      consentBodies.push(body);
      record = {
        ...record,
        consent: {
          ...record.consent,
          status: 'granted',
          recordedAt: '2026-12-01T10:00:00.000Z',
          guardianName: body.guardianName,
        },
      };
      return HttpResponse.json({ athlete: record });
    }),
  );
  return consentBodies;
}

beforeAll(() => api.listen({ onUnhandledRequest: 'error' }));
afterEach(() => {
  cleanup();
  api.resetHandlers();
  resetSession();
});
afterAll(() => api.close());

describe('athlete page', () => {
  it('shows the consent caution with the form to a coach and records consent', async () => {
    const user = userEvent.setup();
    const bodies = signedInAs(userWith('coach'), ATHLETE_NO_CONSENT);
    renderApp(`/athletes/${ATHLETE_NO_CONSENT.id}`);

    await screen.findByRole('heading', { name: 'Juno Fairweather', level: 1 });
    expect(screen.getByText('Guardian consent not recorded')).toBeTruthy();
    expect(screen.getByText('rowan@home.example')).toBeTruthy();
    // No upload button while consent is missing: the server would refuse the clips.
    expect(screen.queryByRole('link', { name: 'Upload clips' })).toBeNull();

    const form = screen.getByRole('form', { name: 'Record consent' });
    expect((within(form).getByLabelText('Guardian who gave consent') as HTMLInputElement).value).toBe(
      'Rowan Fairweather',
    );
    // The second purpose is asked separately, and left unticked unless the guardian agreed.
    await user.click(within(form).getByRole('checkbox', { name: /reviews being sent by e-mail/ }));
    await user.click(within(form).getByRole('button', { name: 'Record consent' }));

    expect(await screen.findByText('Consent recorded for Juno.')).toBeTruthy();
    expect(screen.queryByText('Guardian consent not recorded')).toBeNull();
    expect(bodies).toEqual([
      { guardianName: 'Rowan Fairweather', method: 'signed_form', shareByEmail: true },
    ]);
    expect(screen.getByRole('link', { name: 'Upload clips' })).toBeTruthy();
  });

  it('shows an analyst the caution but no form, and no guardian e-mail', async () => {
    const hidden = {
      ...ATHLETE_NO_CONSENT,
      guardians: [{ ...ATHLETE_NO_CONSENT.guardians[0], email: null }],
    };
    signedInAs(userWith('analyst'), hidden);
    renderApp(`/athletes/${ATHLETE_NO_CONSENT.id}`);

    await screen.findByRole('heading', { name: 'Juno Fairweather', level: 1 });
    expect(screen.getByText('Guardian consent not recorded')).toBeTruthy();
    expect(screen.queryByRole('form', { name: 'Record consent' })).toBeNull();
    expect(screen.getByText('Contact details hidden for your role')).toBeTruthy();
  });

  it('explains a record outside the role’s reach', async () => {
    signedInAs(userWith('coach'), ATHLETE_NO_CONSENT);
    api.use(
      http.get(`${ORIGIN}/api/athletes/:id`, () =>
        HttpResponse.json({ error: { code: 'not_found', message: 'Athlete not found' } }, { status: 404 }),
      ),
    );
    renderApp(`/athletes/${ATHLETE_NO_CONSENT.id}`);
    expect(await screen.findByText('Could not load this athlete')).toBeTruthy();
    expect(screen.getByText(/outside what your role can see/)).toBeTruthy();
  });
});
