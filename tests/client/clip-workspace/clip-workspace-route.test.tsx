// @vitest-environment happy-dom
import { cleanup, screen } from '@testing-library/react';
import { http, HttpResponse } from 'msw';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Role } from '@shared/schemas/auth.schema';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { clipFixture, userWith } from '../helpers/demo-data';
import { createApiMock, ORIGIN, renderApp, resetSession } from '../helpers/render-app';

// No worker in happy-dom; these tests are about the page, not detection.
vi.mock('@/lib/pose-client', () => ({
  getPoseClient: () => ({ detect: vi.fn(), reset: () => Promise.resolve(), analyzeQueue: vi.fn() }),
}));

const api = createApiMock();
const base = clipFixture({
  view: 'front',
  thumbnails: null,
  referenceLine: null,
  defaultModel: 'lightning',
  ageGroup: { id: '40000000-0000-4000-8000-000000000014', name: 'U14' },
  analysis: null,
  rotation: 0,
});

beforeAll(() => api.listen({ onUnhandledRequest: 'error' }));
afterEach(() => {
  cleanup();
  api.resetHandlers();
  resetSession();
});
afterAll(() => api.close());

function serve(role: Role, clips: () => ClipDto) {
  const user = userWith(role);
  api.use(
    http.post(`${ORIGIN}/api/auth/refresh`, () => HttpResponse.json({ accessToken: 't', user })),
    http.get(`${ORIGIN}/api/me`, () => HttpResponse.json({ user, club: { id: user.clubId, name: 'Club' } })),
    http.get(`${ORIGIN}/api/clips/${base.id}`, () => HttpResponse.json({ clip: clips() })),
    http.get(`${ORIGIN}/api/clips/${base.id}/frames`, () =>
      HttpResponse.json({ model: 'lightning', frames: [], series: null, flags: [] }),
    ),
    http.get(`${ORIGIN}/api/clips/${base.id}/notes`, () => HttpResponse.json({ notes: [] })),
    http.get(`${ORIGIN}/api/tolerance-bands`, () => HttpResponse.json({ bands: [] })),
  );
}

describe('clip workspace page', () => {
  it('waits while the server prepares the clip, then opens the workspace by itself', async () => {
    let calls = 0;
    serve('coach', () => {
      calls += 1;
      return { ...base, status: calls === 1 ? 'processing' : 'ready' };
    });
    renderApp(`/clips/${base.id}`);
    await screen.findByText('Preparing the clip');
    // The page polls every 2 s; the workspace appears without a reload.
    await screen.findByRole('region', { name: 'Readouts' });
    for (const name of ['Play', 'Previous frame', 'Next frame']) {
      expect(screen.getByRole('button', { name })).toBeTruthy();
    }
    expect(screen.getByRole('button', { name: 'Set snow line' })).toBeTruthy();
    expect(screen.getByText('2D estimates, not medical advice')).toBeTruthy();
    // Every front-view metric is listed with its label as text, not measured yet.
    const readouts = screen.getByRole('region', { name: 'Readouts' });
    expect(readouts.textContent).toContain('Shoulder tilt');
    expect(readouts.textContent).toContain('Knee separation');
    expect(readouts.textContent).not.toContain('Knee flexion');
  });

  it('says why a clip could not be prepared', async () => {
    serve('coach', () => ({ ...base, status: 'failed', failureReason: 'The file has no video stream.' }));
    renderApp(`/clips/${base.id}`);
    await screen.findByText('This clip could not be prepared');
    expect(screen.getByText('The file has no video stream.')).toBeTruthy();
    expect(screen.queryByRole('region', { name: 'Readouts' })).toBeNull();
  });

  it('gives an athlete the same views without the editing tools', async () => {
    serve('athlete', () => ({ ...base, status: 'ready' }));
    renderApp(`/clips/${base.id}`);
    await screen.findByRole('region', { name: 'Readouts' });
    expect(screen.getByRole('checkbox', { name: 'Skeleton' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Set snow line' })).toBeNull();
  });
});
