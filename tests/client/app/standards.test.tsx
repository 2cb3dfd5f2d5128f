// @vitest-environment happy-dom
import { cleanup, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { UserDto } from '@shared/schemas/auth.schema';
import type { JobDto, ToleranceBandDto, ToleranceBandListResponse } from '@shared/schemas/tolerance.schema';
import { outsideMeaning } from '@shared/tolerance';
import { U14, userWith } from '../helpers/demo-data';
import { createApiMock, ORIGIN, renderApp, resetSession } from '../helpers/render-app';

const api = createApiMock();
const U16 = { id: '00000000-0000-4000-8000-000000000016', name: 'U16' };

const band = (
  ageGroup: { id: string; name: string },
  metric: 'stanceWidthRatio',
  min: number,
  max: number,
): ToleranceBandDto => ({
  id: `${ageGroup.name}-${metric}`,
  ageGroupId: ageGroup.id,
  ageGroup: ageGroup.name,
  metric,
  view: 'front',
  min,
  max,
  target: 1,
  source: 'common practice',
  version: 1,
  meaning: outsideMeaning(metric, min, max),
  updatedAt: '2026-11-20T10:00:00.000Z',
  updatedBy: null,
});

const JOB: JobDto = {
  id: 'job-1',
  kind: 'flag-reevaluation',
  status: 'running',
  total: 5000,
  done: 1200,
  label: 'U14 stance width changed',
  error: null,
  createdAt: '2026-12-02T10:00:00.000Z',
  finishedAt: null,
};

function serve(user: UserDto, onPut: (body: unknown) => Response) {
  const list: ToleranceBandListResponse = {
    bands: [band(U14, 'stanceWidthRatio', 0.8, 1.3), band(U16, 'stanceWidthRatio', 0.8, 1.3)],
    editableAgeGroupIds: user.role === 'head_coach' ? [U14.id, U16.id] : user.coachedAgeGroupIds,
    job: null,
  };
  api.use(
    http.post(`${ORIGIN}/api/auth/refresh`, () => HttpResponse.json({ accessToken: 't', user })),
    http.get(`${ORIGIN}/api/me`, () =>
      HttpResponse.json({ user, club: { id: user.clubId, name: 'Test Club' } }),
    ),
    http.get(`${ORIGIN}/api/tolerance-bands`, () => HttpResponse.json(list)),
    http.get(`${ORIGIN}/api/tolerance-bands/history`, () => HttpResponse.json({ changes: [] })),
    http.get(`${ORIGIN}/api/jobs/:id`, () => HttpResponse.json(JOB)),
    http.put(`${ORIGIN}/api/tolerance-bands/:group/:metric`, async ({ request }) =>
      onPut(await request.json()),
    ),
  );
}

beforeAll(() => api.listen({ onUnhandledRequest: 'error' }));
afterEach(() => {
  cleanup();
  api.resetHandlers();
  resetSession();
});
afterAll(() => api.close());

describe('standards page', () => {
  it('refuses a band with the lowest above the highest, or text for a number, beside the field', async () => {
    const sent: unknown[] = [];
    serve(userWith('coach', { coachedAgeGroupIds: [U14.id] }), (body) => {
      sent.push(body);
      return HttpResponse.json({ band: band(U14, 'stanceWidthRatio', 0.8, 1.1), job: JOB });
    });
    const user = userEvent.setup();
    renderApp('/tolerances');
    await user.click(await screen.findByRole('button', { name: 'Edit Stance width for U14' }));
    const dialog = screen.getByRole('dialog');
    const highest = within(dialog).getByLabelText('Highest');
    await user.clear(highest);
    await user.type(highest, '0.5');
    await user.click(within(dialog).getByRole('button', { name: 'Save band' }));
    expect(await within(dialog).findByText('The lowest value is above the highest; swap them')).toBeTruthy();
    await user.clear(highest);
    await user.type(highest, 'wide');
    await user.click(within(dialog).getByRole('button', { name: 'Save band' }));
    expect(await within(dialog).findByText('Enter a number, or leave it empty for no limit')).toBeTruthy();
    expect(sent).toEqual([]);

    await user.clear(highest);
    await user.type(highest, '1.1');
    expect(
      within(dialog).getByText(
        /Feet closer together than 0\.80 of hip width, or feet wider apart than 1\.10/,
      ),
    ).toBeTruthy();
    await user.click(within(dialog).getByRole('button', { name: 'Save band' }));
    // The re-check the change queued shows its progress.
    expect(await screen.findByRole('progressbar', { name: 'Frames checked' })).toBeTruthy();
    expect(sent).toEqual([{ min: 0.8, max: 1.1, target: 1 }]);
  });

  it('shows the server’s reason beside the field it names', async () => {
    serve(userWith('coach', { coachedAgeGroupIds: [U14.id] }), () =>
      HttpResponse.json(
        {
          error: {
            code: 'validation_failed',
            message: 'min: Stance width can only be between -5 and 5',
            details: { issues: [{ path: ['min'], message: 'Stance width can only be between -5 and 5' }] },
          },
        },
        { status: 400 },
      ),
    );
    const user = userEvent.setup();
    renderApp('/tolerances');
    await user.click(await screen.findByRole('button', { name: 'Edit Stance width for U14' }));
    const dialog = screen.getByRole('dialog');
    await user.click(within(dialog).getByRole('button', { name: 'Save band' }));
    const lowest = within(dialog).getByLabelText('Lowest');
    expect(await within(dialog).findAllByText('Stance width can only be between -5 and 5')).not.toHaveLength(
      0,
    );
    expect(lowest.getAttribute('aria-describedby')).toMatch(/error/);
  });

  it('lets a coach edit only the groups they coach, and an analyst none', async () => {
    serve(userWith('coach', { coachedAgeGroupIds: [U14.id] }), () => HttpResponse.json({}));
    const user = userEvent.setup();
    renderApp('/tolerances');
    await screen.findByRole('button', { name: 'Edit Stance width for U14' });
    await user.click(screen.getByRole('button', { name: 'U16' }));
    expect(
      await screen.findByText(/Only the head coach and the coaches of a group change its bands/),
    ).toBeTruthy();
    expect(screen.queryByRole('button', { name: /^Edit / })).toBeNull();
    cleanup();
    resetSession();
    api.resetHandlers();
    serve(userWith('analyst'), () => HttpResponse.json({}));
    renderApp('/tolerances');
    await screen.findByRole('table', { name: /Tolerance bands of U14/ });
    expect(screen.queryByRole('button', { name: /^Edit / })).toBeNull();
  });
});
