// @vitest-environment happy-dom
import { cleanup, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { FlagDto } from '@shared/schemas/flag.schema';
import { U14, userWith } from '../helpers/demo-data';
import { createApiMock, ORIGIN, renderApp, resetSession } from '../helpers/render-app';

const api = createApiMock();

const flag = (id: string, metric: FlagDto['metric'], value: number): FlagDto => ({
  id,
  model: 'lightning',
  metric,
  value,
  min: -8,
  max: 8,
  distance: value - 8,
  side: 'above',
  frameIndex: 57,
  turnIndex: 2,
  firstFrame: 50,
  lastFrame: 64,
  frameCount: 15,
  bandVersion: 3,
  status: 'unreviewed',
  clipId: '50000000-0000-4000-8000-000000000001',
  clipName: 'gs-run-2.mp4',
  sessionDate: '2026-11-30',
  athlete: { id: '40000000-0000-4000-8000-000000000009', name: 'Juno Fairweather' },
  ageGroup: { id: U14.id, name: 'U14' },
  timeMs: 2280,
  comment: null,
  statusBy: null,
  statusAt: null,
  createdAt: '2026-12-01T10:00:00.000Z',
  thumbnails: null,
});

beforeAll(() => api.listen({ onUnhandledRequest: 'error' }));
afterEach(() => {
  cleanup();
  api.resetHandlers();
  resetSession();
});
afterAll(() => api.close());

describe('the coach’s Home', () => {
  it('lists flags to review, filters them by habit, and marks one reviewed with a comment', async () => {
    const user = userWith('coach');
    const queries: URLSearchParams[] = [];
    const patches: unknown[] = [];
    api.use(
      http.post(`${ORIGIN}/api/auth/refresh`, () => HttpResponse.json({ accessToken: 't', user })),
      http.get(`${ORIGIN}/api/me`, () =>
        HttpResponse.json({ user, club: { id: user.clubId, name: 'Test Club' } }),
      ),
      http.get(`${ORIGIN}/api/clips`, () => HttpResponse.json({ clips: [] })),
      http.get(`${ORIGIN}/api/flags`, ({ request }) => {
        const query = new URL(request.url).searchParams;
        queries.push(query);
        const all = [flag('f1', 'shoulderTilt', 12.5), flag('f2', 'stanceWidthRatio', 1.52)];
        const shown = all.filter((f) => !query.get('metric') || f.metric === query.get('metric'));
        return HttpResponse.json({ flags: shown, total: shown.length, page: 1, pageSize: 10 });
      }),
      http.patch(`${ORIGIN}/api/flags/:id`, async ({ request, params }) => {
        const body = await request.json();
        patches.push({ id: params.id, body });
        return HttpResponse.json({ ...flag(String(params.id), 'shoulderTilt', 12.5), status: 'reviewed' });
      }),
    );
    const person = userEvent.setup();
    renderApp('/');
    const inbox = await screen.findByRole('region', { name: 'Flags' });
    await within(inbox).findByText('Shoulder tilt', { selector: 'span' });
    expect(queries[0].get('status')).toBe('unreviewed');
    // Value against the band, the turn, the time and how long it lasted, and a link to the frame.
    const first = inbox.querySelector('li[data-flag="f1"]') as HTMLElement;
    expect(first.textContent).toContain('12.5° against -8.0° to 8.0° (4.5° over)');
    expect(first.textContent).toContain('turn 3 · 0:02.3 · 15 frames outside');
    expect(within(first).getByRole('link', { name: 'Open at this frame' }).getAttribute('href')).toBe(
      '/clips/50000000-0000-4000-8000-000000000001?frame=57&metric=shoulderTilt',
    );

    await person.selectOptions(within(inbox).getByLabelText('Habit'), 'Stance width');
    await within(inbox).findByText('Stance width', { selector: 'span' });
    expect(queries.at(-1)?.get('metric')).toBe('stanceWidthRatio');
    expect(within(inbox).queryByText('Shoulder tilt', { selector: 'span' })).toBeNull();

    await person.selectOptions(within(inbox).getByLabelText('Habit'), 'Every habit');
    const item = await within(inbox).findByText('Shoulder tilt', { selector: 'span' });
    const row = item.closest('li') as HTMLElement;
    await person.click(within(row).getByRole('button', { name: 'Add a comment' }));
    await person.type(within(row).getByLabelText('Comment for the other coaches'), 'Level shoulders drill');
    await person.click(within(row).getByRole('button', { name: 'Mark reviewed' }));
    await expect
      .poll(() => patches)
      .toEqual([{ id: 'f1', body: { status: 'reviewed', comment: 'Level shoulders drill' } }]);
  });
});
