// @vitest-environment happy-dom
import { cleanup, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClientProvider } from '@tanstack/react-query';
import { http, HttpResponse } from 'msw';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import type { NoteDto } from '@shared/schemas/note.schema';
import { ToastProvider } from '@/components/ui/toast';
import { NotesPanel } from '@/features/clip-workspace/components/notes';
import { ClipStageProvider } from '@/features/clip-workspace/components/stage/clip-stage';
import { useStageProbe } from '../helpers/stage-probe';
import { configureApiClient } from '@/lib/api-client';
import { createQueryClient } from '@/lib/react-query';
import { clipFixture } from '../helpers/demo-data';
import { createApiMock, ORIGIN } from '../helpers/render-app';

const ME = { id: 'user-coach', name: 'Tomas Reinholt', role: 'coach' as const };
vi.mock('@/lib/auth', () => ({ useUser: () => ({ ...ME, email: 'coach@example.test' }) }));

// 30 fps (the fixture): frame 45 starts at 45 / 30 s = 1500 ms.
const clip = clipFixture({ fps: 30, frameCount: 90, durationMs: 3000 });
const note = (over: Partial<NoteDto>): NoteDto => ({
  id: 'n1',
  clipId: clip.id,
  timeMs: 1500,
  frameIndex: 45,
  text: 'Hands forward',
  drawing: null,
  author: { id: ME.id, name: ME.name },
  createdAt: '2026-12-14T12:00:00.000Z',
  updatedAt: '2026-12-14T12:00:00.000Z',
  ...over,
});

const api = createApiMock();
let notes: NoteDto[] = [];
const sent: { method: string; url: string; body: unknown }[] = [];

beforeAll(() => {
  configureApiClient({ baseUrl: ORIGIN });
  api.listen({ onUnhandledRequest: 'error' });
});
afterEach(() => {
  cleanup();
  api.resetHandlers();
  sent.length = 0;
});
afterAll(() => api.close());

function handlers(options: { failCreate?: boolean } = {}) {
  api.use(
    http.get(`${ORIGIN}/api/clips/${clip.id}/notes`, () => HttpResponse.json({ notes })),
    http.get(`${ORIGIN}/api/tolerance-bands`, () => HttpResponse.json({ bands: [] })),
    http.post(`${ORIGIN}/api/clips/${clip.id}/notes`, async ({ request }) => {
      const body = (await request.json()) as Record<string, unknown>;
      sent.push({ method: 'POST', url: request.url, body });
      if (options.failCreate) {
        return HttpResponse.json(
          { error: { code: 'unavailable', message: 'The database is busy.' } },
          { status: 503 },
        );
      }
      const created = note({ id: 'n-new', ...(body as Partial<NoteDto>) });
      notes = [...notes, created];
      return HttpResponse.json({ note: created }, { status: 201 });
    }),
    http.patch(`${ORIGIN}/api/notes/:id`, async ({ request, params }) => {
      const body = (await request.json()) as Partial<NoteDto>;
      sent.push({ method: 'PATCH', url: request.url, body });
      notes = notes.map((n) => (n.id === params.id ? { ...n, ...body } : n));
      return HttpResponse.json({ note: notes.find((n) => n.id === params.id) });
    }),
    http.delete(`${ORIGIN}/api/notes/:id`, ({ request, params }) => {
      sent.push({ method: 'DELETE', url: request.url, body: null });
      notes = notes.filter((n) => n.id !== params.id);
      return new HttpResponse(null, { status: 204 });
    }),
  );
}

function Player() {
  const ws = useStageProbe();
  return <video ref={ws.setVideoElement} data-testid="video" />;
}

function renderPanel() {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <ToastProvider>
        <ClipStageProvider clip={clip} renewMedia={() => Promise.resolve(null)} readOnly={false}>
          <Player />
          <NotesPanel />
        </ClipStageProvider>
      </ToastProvider>
    </QueryClientProvider>,
  );
  return screen.getByTestId('video') as HTMLVideoElement;
}

describe('notes panel', () => {
  it('lists notes in clip order and seeks to a note when it is clicked', async () => {
    notes = [
      note({ id: 'late', timeMs: 2000, frameIndex: 60, text: 'Late edge' }),
      note({
        id: 'early',
        timeMs: 500,
        frameIndex: 15,
        text: 'Early pole plant',
        author: { id: 'x', name: 'Ada Fenwick' },
      }),
    ];
    handlers();
    const video = renderPanel();
    const list = await screen.findByRole('list', { name: 'Notes on this clip' });
    const items = within(list).getAllByRole('listitem');
    expect(items.map((li) => li.textContent)).toEqual([
      expect.stringContaining('Early pole plant'),
      expect.stringContaining('Late edge'),
    ]);
    // Only one's own notes can be changed.
    expect(within(items[0]).queryByRole('button', { name: /Edit/ })).toBeNull();
    expect(within(items[1]).getByRole('button', { name: /Edit/ })).toBeTruthy();

    await userEvent.click(within(items[1]).getByRole('button', { name: /^Go to 0:02\.000, frame 60/ }));
    // Seeks aim at the middle of the frame: (60 + 0.5) / 30 s.
    expect(video.currentTime).toBeCloseTo(60.5 / 30, 9);
  });

  it('refuses an empty note with the schema message and sends nothing', async () => {
    notes = [];
    handlers();
    renderPanel();
    await screen.findByText(/No notes on this clip yet/);
    await userEvent.click(screen.getByRole('button', { name: 'Add note' }));
    await screen.findByText('Write the note first');
    expect(sent).toEqual([]);
  });

  it('pins a new note to the frame on screen and clears the form', async () => {
    notes = [];
    handlers();
    renderPanel();
    await screen.findByText(/No notes on this clip yet/);
    await userEvent.type(screen.getByLabelText(/Note text/), '  Knees apart at the apex  ');
    await userEvent.click(screen.getByRole('button', { name: 'Add note' }));
    await screen.findByText('Knees apart at the apex');
    // The player has not moved: frame 0, time 0; text trimmed by the shared schema.
    expect(sent).toEqual([
      {
        method: 'POST',
        url: `${ORIGIN}/api/clips/${clip.id}/notes`,
        body: { frameIndex: 0, timeMs: 0, text: 'Knees apart at the apex' },
      },
    ]);
    expect((screen.getByLabelText(/Note text/) as HTMLTextAreaElement).value).toBe('');
  });

  it('keeps the text when saving fails and says why', async () => {
    notes = [];
    handlers({ failCreate: true });
    renderPanel();
    await screen.findByText(/No notes on this clip yet/);
    await userEvent.type(screen.getByLabelText(/Note text/), 'Inside hand drops');
    await userEvent.click(screen.getByRole('button', { name: 'Add note' }));
    await screen.findByText('The note was not saved: The database is busy.');
    expect((screen.getByLabelText(/Note text/) as HTMLTextAreaElement).value).toBe('Inside hand drops');
  });

  it('edits and deletes one of one’s own notes', async () => {
    notes = [note({})];
    handlers();
    renderPanel();
    const list = await screen.findByRole('list', { name: 'Notes on this clip' });
    await userEvent.click(within(list).getByRole('button', { name: /Edit/ }));
    const box = screen.getByLabelText('Edit note text');
    await userEvent.clear(box);
    await userEvent.type(box, 'Hands forward and low');
    await userEvent.click(screen.getByRole('button', { name: 'Save note' }));
    await within(list).findByText('Hands forward and low');
    expect(sent.at(-1)).toEqual({
      method: 'PATCH',
      url: `${ORIGIN}/api/notes/n1`,
      body: { text: 'Hands forward and low' },
    });

    await userEvent.click(within(list).getByRole('button', { name: /Delete/ }));
    await screen.findByText('Delete this note?');
    expect(sent.filter((s) => s.method === 'DELETE')).toEqual([]);
    await userEvent.click(screen.getByRole('button', { name: 'Delete' }));
    await screen.findByText(/No notes on this clip yet/);
    expect(sent.at(-1)).toEqual({ method: 'DELETE', url: `${ORIGIN}/api/notes/n1`, body: null });
    await waitFor(() => expect(screen.queryByRole('list', { name: 'Notes on this clip' })).toBeNull());
  });
});
