// @vitest-environment happy-dom
import { act, cleanup, fireEvent, render, screen } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ToastProvider } from '@/components/ui/toast';
import { VideoStage } from '@/features/clip-workspace/components/stage/video-stage';
import { ClipStageProvider } from '@/features/clip-workspace/components/stage/clip-stage';
import { createQueryClient } from '@/lib/react-query';
import { clipFixture } from '../helpers/demo-data';

// A signed media link expires (MEDIA_TOKEN_TTL); the stage renews it once without a fuss and only a
// second failure in a row is shown to the coach.
const clip = clipFixture({
  id: '70000000-0000-4000-8000-000000000009',
  originalName: 'turns.mp4',
  mediaUrl: '/api/clips/70000000-0000-4000-8000-000000000009/media?token=first',
});

afterEach(cleanup);

function renderStage(renewMedia: () => Promise<string | null>) {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <ToastProvider>
        <ClipStageProvider clip={clip} renewMedia={renewMedia} readOnly={false}>
          <VideoStage overlay={null} />
        </ClipStageProvider>
      </ToastProvider>
    </QueryClientProvider>,
  );
  return screen.getByLabelText('Video of turns.mp4') as HTMLVideoElement;
}

describe('video stage', () => {
  it('plays the clip from its media link', () => {
    const video = renderStage(() => Promise.resolve(null));
    expect(video.getAttribute('src')).toBe(clip.mediaUrl);
  });

  it('renews the media link once silently, then says what went wrong', async () => {
    const renew = vi.fn(() => Promise.resolve(null));
    const video = renderStage(renew);
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
    const renew = vi.fn(() => Promise.resolve(null));
    const video = renderStage(renew);
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
