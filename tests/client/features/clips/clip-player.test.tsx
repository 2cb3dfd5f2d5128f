// @vitest-environment happy-dom
import { act, cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { ClipPlayer } from '@/features/clips/components/clip-player';

const clip: ClipDto = {
  id: '70000000-0000-4000-8000-000000000009',
  sessionId: '60000000-0000-4000-8000-000000000001',
  athletes: [],
  view: 'side',
  status: 'ready',
  failureReason: null,
  originalName: 'turns.mp4',
  sizeBytes: 1000,
  codec: 'h264',
  width: 640,
  height: 360,
  fps: 30,
  frameCount: 90,
  durationMs: 3000,
  createdAt: '2026-12-14T12:00:00.000Z',
  mediaUrl: '/api/clips/70000000-0000-4000-8000-000000000009/media?token=first',
  posterUrl: null,
};

afterEach(cleanup);

describe('clip player', () => {
  it('renews the media link once silently, then says what went wrong', async () => {
    const renew = vi.fn(() => Promise.resolve());
    render(<ClipPlayer clip={clip} onRenewUrl={renew} />);
    const video = screen.getByLabelText('Video of turns.mp4') as HTMLVideoElement;
    expect(video.getAttribute('src')).toBe(clip.mediaUrl);

    await act(async () => {
      fireEvent.error(video);
    });
    expect(renew).toHaveBeenCalledTimes(1);
    expect(screen.queryByText('Playback problem')).toBeNull();

    await act(async () => {
      fireEvent.error(video);
    });
    expect(renew).toHaveBeenCalledTimes(1);
    expect(screen.getByText('Playback problem')).toBeTruthy();
  });

  it('renews again after the renewed link has loaded', async () => {
    const renew = vi.fn(() => Promise.resolve());
    render(<ClipPlayer clip={clip} onRenewUrl={renew} />);
    const video = screen.getByLabelText('Video of turns.mp4');
    await act(async () => {
      fireEvent.error(video);
    });
    fireEvent.loadedMetadata(video);
    await act(async () => {
      fireEvent.error(video);
    });
    expect(renew).toHaveBeenCalledTimes(2);
    expect(screen.queryByText('Playback problem')).toBeNull();
  });
});
