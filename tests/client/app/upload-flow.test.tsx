// @vitest-environment happy-dom
import { cleanup, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { ClipDto } from '@shared/schemas/clip.schema';
import {
  ATHLETE_NO_CONSENT,
  ATHLETE_WITH_CONSENT,
  clipFixture,
  SESSION,
  userWith,
} from '../helpers/demo-data';
import { createApiMock, ORIGIN, renderApp, resetSession } from '../helpers/render-app';

const api = createApiMock();
const coach = userWith('coach');

function clipFrom(fields: Record<string, string>, file: File): ClipDto {
  return clipFixture({
    sessionId: fields.sessionId,
    view: fields.view as ClipDto['view'],
    status: 'uploaded',
    originalName: file.name,
    sizeBytes: file.size,
  });
}

beforeAll(() => api.listen({ onUnhandledRequest: 'error' }));
afterEach(() => {
  cleanup();
  api.resetHandlers();
  resetSession();
});
afterAll(() => api.close());

describe('upload page', () => {
  it('refuses a non-video file, sends a tagged clip, shows a server refusal and retries it', async () => {
    const received: Record<string, string>[] = [];
    let attempts = 0;
    api.use(
      http.post(`${ORIGIN}/api/auth/refresh`, () => HttpResponse.json({ accessToken: 't', user: coach })),
      http.get(`${ORIGIN}/api/me`, () =>
        HttpResponse.json({ user: coach, club: { id: coach.clubId, name: 'Club' } }),
      ),
      http.get(`${ORIGIN}/api/sessions`, () => HttpResponse.json({ sessions: [SESSION] })),
      http.get(`${ORIGIN}/api/athletes`, () =>
        HttpResponse.json({ athletes: [ATHLETE_WITH_CONSENT, ATHLETE_NO_CONSENT] }),
      ),
      http.post(`${ORIGIN}/api/clips`, async ({ request }) => {
        attempts += 1;
        const form = await request.formData();
        const file = form.get('file') as File;
        const fields = Object.fromEntries(
          ['sessionId', 'athleteIds', 'view'].map((key) => [key, String(form.get(key))]),
        );
        received.push({ ...fields, file: file.name });
        if (attempts === 1) {
          return HttpResponse.json(
            { error: { code: 'storage_unavailable', message: 'Clip storage is not answering; try again' } },
            { status: 503 },
          );
        }
        return HttpResponse.json({ clip: clipFrom(fields, file) }, { status: 201 });
      }),
    );
    // Drag and drop can bring any file, so the picker's accept filter is not what keeps a text file out.
    const user = userEvent.setup({ applyAccept: false });
    renderApp(`/upload?session=${SESSION.id}`);

    await screen.findByRole('heading', { name: 'Upload clips' });
    expect(screen.getByText('Filming on the hill')).toBeTruthy();
    const clip = new File([new Uint8Array(4096)], 'gs-run-3.mp4', { type: 'video/mp4' });
    const notes = new File(['times'], 'times.txt', { type: 'text/plain' });
    await user.upload(await screen.findByLabelText('Choose clips'), [clip, notes]);

    expect(screen.getByText(/times\.txt is not a video clip/)).toBeTruthy();
    const row = screen.getByRole('listitem', { name: 'gs-run-3.mp4' });

    // Without an athlete the row does not go anywhere; the message comes from the shared schema.
    await user.click(screen.getByRole('button', { name: 'Upload clip' }));
    expect(within(row).getByText('Tag at least one athlete')).toBeTruthy();
    expect(attempts).toBe(0);

    const picker = within(row).getByLabelText('Add athlete to gs-run-3.mp4') as HTMLSelectElement;
    const blocked = Array.from(picker.options).find((o) => o.text.startsWith('Juno Fairweather'));
    expect(blocked?.disabled).toBe(true);
    expect(blocked?.text).toBe('Juno Fairweather (consent missing)');
    await user.selectOptions(picker, 'Pia Underhill');
    await user.selectOptions(within(row).getByLabelText('View of gs-run-3.mp4'), 'front');
    await user.click(screen.getByRole('button', { name: 'Upload clip' }));

    expect(await within(row).findByText('Clip storage is not answering; try again')).toBeTruthy();
    await user.click(within(row).getByRole('button', { name: 'Retry gs-run-3.mp4' }));

    expect(await within(row).findByText('Uploaded')).toBeTruthy();
    const progress = within(row).getByRole('progressbar', { name: 'Upload progress of gs-run-3.mp4' });
    expect(progress.getAttribute('aria-valuenow')).toBe('100');
    expect(within(row).getByRole('link', { name: 'Open clip' }).getAttribute('href')).toBe(
      '/clips/70000000-0000-4000-8000-000000000001',
    );
    expect(received).toEqual([
      { sessionId: SESSION.id, athleteIds: ATHLETE_WITH_CONSENT.id, view: 'front', file: 'gs-run-3.mp4' },
      { sessionId: SESSION.id, athleteIds: ATHLETE_WITH_CONSENT.id, view: 'front', file: 'gs-run-3.mp4' },
    ]);
  });
});
