// @vitest-environment happy-dom
import { act, cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ClipPlayer } from '@/features/clips/components/clip-player';
import { clipFixture } from '../../helpers/demo-data';

const clip = clipFixture({
  id: '70000000-0000-4000-8000-000000000009',
  originalName: 'turns.mp4',
  mediaUrl: '/api/clips/70000000-0000-4000-8000-000000000009/media?token=first',
});

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
