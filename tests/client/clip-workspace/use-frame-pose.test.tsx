// @vitest-environment happy-dom
import { act, cleanup, render, screen, waitFor } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { http, HttpResponse } from 'msw';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import type { Keypoint } from '@shared/keypoints';
import { ToastProvider } from '@/components/ui/toast';
import { ClipStageProvider } from '@/features/clip-workspace/components/stage/clip-stage';
import { useStageProbe } from '../helpers/stage-probe';
import { closestKnown, useFramePose } from '@/features/clip-workspace/hooks/use-frame-pose';
import { configureApiClient } from '@/lib/api-client';
import { createQueryClient } from '@/lib/react-query';
import { clipFixture } from '../helpers/demo-data';
import { createApiMock, ORIGIN } from '../helpers/render-app';

const detect = vi.fn();
const reset = vi.fn(() => Promise.resolve());
vi.mock('@/lib/pose-client', () => ({ getPoseClient: () => ({ detect, reset }) }));

const clip = clipFixture({ view: 'front', fps: 25, frameCount: 100, durationMs: 4000, referenceLine: null });
const api = createApiMock();
const point = (name: Keypoint['name'], x: number, score = 0.8): Keypoint => ({ name, x, y: 100, score });

beforeAll(() => {
  configureApiClient({ baseUrl: ORIGIN });
  api.listen({ onUnhandledRequest: 'error' });
  // happy-dom cannot decode video; the bitmap only has to reach the (mocked) pose client.
  vi.stubGlobal('createImageBitmap', () => Promise.resolve({ close() {} }));
});
beforeEach(() => {
  detect.mockReset();
  reset.mockClear();
});
afterEach(() => {
  cleanup();
  api.resetHandlers();
});
afterAll(() => {
  api.close();
  vi.unstubAllGlobals();
});

function Probe() {
  useFramePose();
  const ws = useStageProbe();
  return (
    <div>
      <video ref={ws.setVideoElement} data-testid="video" />
      <output data-testid="origin">{ws.currentPose?.origin ?? 'none'}</output>
      <output data-testid="read">{JSON.stringify(ws.currentPose?.liveRead ?? null)}</output>
      <output data-testid="shoulders">{ws.currentPose?.keypoints.map((k) => k.x).join(',') ?? ''}</output>
    </div>
  );
}

function framesResponse(frames: unknown[]) {
  return http.get(`${ORIGIN}/api/clips/${clip.id}/frames`, () =>
    HttpResponse.json({ model: 'lightning', frames, series: null, flags: [] }),
  );
}

async function renderReady(onClip = clip) {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <ToastProvider>
        <ClipStageProvider clip={onClip} renewMedia={() => Promise.resolve(null)} readOnly={false}>
          <Probe />
        </ClipStageProvider>
      </ToastProvider>
    </QueryClientProvider>,
  );
  const video = screen.getByTestId('video') as HTMLVideoElement;
  // The first frame is decoded: readyState HAVE_CURRENT_DATA (2).
  Object.defineProperty(video, 'readyState', { configurable: true, get: () => 2 });
  await act(async () => {
    video.dispatchEvent(new Event('loadeddata'));
  });
}

describe('pose of the frame on screen', () => {
  it('shows the stored analysis without running the detector', async () => {
    api.use(
      framesResponse([
        {
          frameIndex: 0,
          timeMs: 0,
          keypoints: [point('left_shoulder', 120), point('right_shoulder', 80)],
          metrics: {},
          reasons: {},
          corrected: false,
        },
      ]),
    );
    await renderReady();
    await waitFor(() => expect(screen.getByTestId('origin').textContent).toBe('stored'));
    expect(screen.getByTestId('shoulders').textContent).toBe('120,80');
    expect(detect).not.toHaveBeenCalled();
  });

  it('marks points placed by hand (score 1) on a stored corrected frame', async () => {
    api.use(
      framesResponse([
        {
          frameIndex: 0,
          timeMs: 0,
          keypoints: [point('left_shoulder', 121, 1), point('right_shoulder', 80)],
          metrics: {},
          reasons: {},
          corrected: true,
        },
      ]),
    );
    await renderReady();
    await waitFor(() => expect(screen.getByTestId('origin').textContent).toBe('corrected'));
  });

  it('detects a still frame that has no stored result, once, without temporal smoothing', async () => {
    api.use(framesResponse([]));
    detect.mockResolvedValue({
      frameIndex: 0,
      timeMs: 0,
      keypoints: [point('left_shoulder', 130), point('right_shoulder', 70)],
      width: 640,
      height: 360,
    });
    await renderReady();
    await waitFor(() => expect(screen.getByTestId('origin').textContent).toBe('live'));
    expect(screen.getByTestId('shoulders').textContent).toBe('130,70');
    expect(detect).toHaveBeenCalledTimes(1);
    expect(detect.mock.calls[0][1]).toMatchObject({
      frameIndex: 0,
      model: 'lightning',
      view: 'front',
      still: true,
    });
    // Each paused frame is read afresh, whatever was detected before it.
    expect(reset).toHaveBeenCalledTimes(1);
  });

  describe('with a picked athlete', () => {
    const picked = { ...clip, athletePick: { frameIndex: 40, x: 320, y: 200 } };
    const body = [point('left_shoulder', 130), point('right_shoulder', 70)];
    const stored = (frameIndex: number) => ({
      frameIndex,
      timeMs: frameIndex * 40,
      keypoints: body,
      metrics: {},
      reasons: {},
      corrected: false,
    });
    beforeEach(() => {
      detect.mockImplementation((_bitmap, req: { frameIndex: number }) =>
        Promise.resolve({
          frameIndex: req.frameIndex,
          timeMs: 0,
          keypoints: body,
          width: 640,
          height: 360,
          followed: { state: 'following', reason: null },
        }),
      );
    });

    it('reads a frame without stored points around the athlete of the closest stored frame', async () => {
      api.use(framesResponse([stored(3), stored(9)]));
      await renderReady(picked);
      await waitFor(() => expect(screen.getByTestId('origin').textContent).toBe('live'));
      expect(detect.mock.calls[0][1].follow).toEqual({ near: { keypoints: body, framesApart: 3 } });
      expect(JSON.parse(screen.getByTestId('read').textContent!)).toEqual({
        how: 'followed',
        fromFrame: 3,
        lost: null,
      });
    });

    it('says the whole picture was read when no frame near this one is known', async () => {
      api.use(framesResponse([stored(30)]));
      await renderReady(picked);
      await waitFor(() => expect(screen.getByTestId('origin').textContent).toBe('live'));
      expect(detect.mock.calls[0][1].follow).toBeNull();
      expect(JSON.parse(screen.getByTestId('read').textContent!)).toEqual({
        how: 'whole-frame',
        pickFrame: 40,
      });
    });
  });

  it('finds the closest known frame within the follow gap, the earlier on a tie', () => {
    const known =
      (frames: number[], empty: number[] = []) =>
      (f: number) =>
        frames.includes(f)
          ? {
              frameIndex: f,
              timeMs: 0,
              model: 'lightning' as const,
              keypoints: empty.includes(f) ? [] : [point('nose', 1)],
              width: 1,
              height: 1,
              origin: 'stored' as const,
              correctedPoints: [],
            }
          : undefined;
    expect(closestKnown(50, known([47, 53]))?.frameIndex).toBe(47);
    expect(closestKnown(50, known([44, 52]))?.frameIndex).toBe(52);
    // A frame where the athlete was not found is no place to start from.
    expect(closestKnown(50, known([49, 55], [49]))?.frameIndex).toBe(55);
    expect(closestKnown(50, known([61, 39]))).toBeNull();
    expect(closestKnown(2, known([0]))?.frameIndex).toBe(0);
  });
});
