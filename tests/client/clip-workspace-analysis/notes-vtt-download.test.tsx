// @vitest-environment happy-dom
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { http, HttpResponse } from 'msw';
import { setupServer } from 'msw/node';
import type { ReactNode } from 'react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, renderHook, waitFor } from '@testing-library/react';
import { ApiError, authSession, configureApiClient } from '@/lib/api-client';
import {
  getNotesVtt,
  notesVttFileName,
  useExportNotesVtt,
} from '@/features/clip-workspace/api/export-notes-vtt';
import { stillFileName } from '@/features/clip-workspace/components/export/save-file';
import { saveBlob } from '@/lib/save-file';

const BASE = 'http://stanceline.test';
const CLIP = '7d1f4a52-2b0e-4c53-9a51-3f0d5c1e8a10';
// A minimal WebVTT file in the shape the W3C WebVTT spec shows: signature line, blank line, timed cues.
const VTT = 'WEBVTT\n\n1\n00:00:01.200 --> 00:00:04.200\nKnees apart at the apex\n';

const seen: { auth: string | null }[] = [];
const server = setupServer(
  http.get(`${BASE}/api/clips/:id/notes.vtt`, ({ request, params }) => {
    seen.push({ auth: request.headers.get('authorization') });
    if (params.id !== CLIP) {
      return HttpResponse.json(
        { error: { code: 'forbidden', message: 'You cannot see the notes of this clip.' } },
        { status: 403 },
      );
    }
    return new HttpResponse(VTT, { headers: { 'Content-Type': 'text/vtt; charset=utf-8' } });
  }),
);

beforeAll(() => {
  server.listen({ onUnhandledRequest: 'error' });
  configureApiClient({ baseUrl: BASE });
  authSession.start({
    accessToken: 'token-for-test',
    user: { id: 'u1', name: 'Test Coach', email: 'c@example.test', role: 'coach' },
  } as unknown as Parameters<typeof authSession.start>[0]);
});
afterEach(() => {
  server.resetHandlers();
  seen.length = 0;
});
afterAll(() => server.close());

function wrapper({ children }: { children: ReactNode }) {
  const client = new QueryClient({
    defaultOptions: { queries: { retry: false }, mutations: { retry: false } },
  });
  return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}

describe('notes as WebVTT', () => {
  it('downloads the file byte for byte with the bearer token', async () => {
    const blob = await getNotesVtt(CLIP);
    expect(await blob.text()).toBe(VTT);
    expect(blob.type).toMatch(/^text\/vtt/);
    expect(seen).toEqual([{ auth: 'Bearer token-for-test' }]);
  });

  it('hands the blob and a file name to the saver', async () => {
    const save = vi.fn();
    const { result } = renderHook(() => useExportNotesVtt(CLIP, save), { wrapper });
    await act(() => result.current.mutateAsync('GS drill, run 2.mp4'));
    expect(save).toHaveBeenCalledTimes(1);
    const [blob, name] = save.mock.calls[0] as [Blob, string];
    expect(name).toBe('GS drill, run 2.notes.vtt');
    expect(await blob.text()).toBe(VTT);
  });

  it('passes the server refusal on as an ApiError and saves nothing', async () => {
    const save = vi.fn();
    const { result } = renderHook(() => useExportNotesVtt('someone-elses-clip', save), { wrapper });
    act(() => result.current.mutate('x.mp4'));
    await waitFor(() => expect(result.current.isError).toBe(true));
    expect(result.current.error).toBeInstanceOf(ApiError);
    expect(result.current.error?.message).toBe('You cannot see the notes of this clip.');
    expect(save).not.toHaveBeenCalled();
  });

  it('makes safe file names', () => {
    expect(notesVttFileName('clip.final.mov')).toBe('clip.final.notes.vtt');
    expect(notesVttFileName('a/b:c.mp4')).toBe('a-b-c.notes.vtt');
    expect(notesVttFileName('.mp4')).toBe('clip.notes.vtt');
    expect(stillFileName('slalom.mp4', 42)).toBe('slalom.frame-00042.png');
  });
});

describe('saving a blob', () => {
  it('clicks a download link for an object URL and removes the link', () => {
    const create = vi.spyOn(URL, 'createObjectURL').mockReturnValue('blob:stanceline/1');
    const revoke = vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => {});
    const clicked: { href: string; download: string }[] = [];
    const click = vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (
      this: HTMLAnchorElement,
    ) {
      clicked.push({ href: this.href, download: this.download });
    });
    vi.useFakeTimers();
    try {
      saveBlob(new Blob([VTT], { type: 'text/vtt' }), 'notes.vtt');
      expect(clicked).toEqual([{ href: 'blob:stanceline/1', download: 'notes.vtt' }]);
      expect(document.querySelectorAll('a[download]')).toHaveLength(0);
      expect(revoke).not.toHaveBeenCalled();
      vi.runAllTimers();
      expect(revoke).toHaveBeenCalledWith('blob:stanceline/1');
    } finally {
      vi.useRealTimers();
      create.mockRestore();
      revoke.mockRestore();
      click.mockRestore();
    }
  });
});
