// @vitest-environment happy-dom
import { act, cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { http, HttpResponse } from 'msw';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Keypoint, ReferenceLine } from '@shared/keypoints';
import { ToastProvider } from '@/components/ui/toast';
import { ClipStageProvider } from '@/features/clip-workspace/components/stage/clip-stage';
import { useStageProbe } from '../helpers/stage-probe';
import { useWorkspaceKeys } from '@/features/clip-workspace/hooks/use-workspace-keys';
import { configureApiClient } from '@/lib/api-client';
import { createQueryClient } from '@/lib/react-query';
import { clipFixture } from '../helpers/demo-data';
import { createApiMock, ORIGIN } from '../helpers/render-app';

const clip = clipFixture({ view: 'front', fps: 25, frameCount: 100, durationMs: 4000, referenceLine: null });
const api = createApiMock();

beforeAll(() => {
  configureApiClient({ baseUrl: ORIGIN });
  api.listen({ onUnhandledRequest: 'error' });
});
afterEach(() => {
  cleanup();
  api.resetHandlers();
});
afterAll(() => api.close());

// Shoulders level in the image, the left one on the image right, 40 px apart.
const shoulders: Keypoint[] = [
  { name: 'left_shoulder', x: 100, y: 100, score: 0.9 },
  { name: 'right_shoulder', x: 60, y: 100, score: 0.9 },
];

function Probe() {
  const ws = useStageProbe();
  useWorkspaceKeys({ toggleHelp: () => undefined });
  return (
    <div>
      <textarea aria-label="note" />
      <video ref={ws.setVideoElement} data-testid="video" />
      <output data-testid="frame">{ws.currentFrame}</output>
      <output data-testid="tilt">{ws.currentPose?.metrics.shoulderTilt?.toFixed(4) ?? 'none'}</output>
      <output data-testid="line">{JSON.stringify(ws.referenceLine)}</output>
      <button onClick={() => ws.stepFrames(1)}>step</button>
      <button
        onClick={() =>
          ws.setFrameKeypoints({
            frameIndex: ws.currentFrame,
            timeMs: 0,
            model: 'lightning',
            keypoints: shoulders,
            width: 640,
            height: 360,
            origin: 'live',
            correctedPoints: [],
          })
        }
      >
        pose
      </button>
      <button
        onClick={() =>
          ws.setReferenceLine([
            [0, 200],
            [100, 190],
          ] satisfies ReferenceLine)
        }
      >
        line
      </button>
      <button
        onClick={() =>
          ws.setFrameReferenceLine(ws.currentFrame, [
            [0, 200],
            [100, 190],
          ])
        }
      >
        frame line
      </button>
    </div>
  );
}

function renderWorkspace() {
  return render(
    <QueryClientProvider client={createQueryClient()}>
      <ToastProvider>
        <ClipStageProvider clip={clip} renewMedia={() => Promise.resolve(null)} readOnly={false}>
          <Probe />
        </ClipStageProvider>
      </ToastProvider>
    </QueryClientProvider>,
  );
}

describe('workspace context', () => {
  it('counts quick steps from the frame being sought, not the one still on screen', () => {
    renderWorkspace();
    const video = screen.getByTestId('video') as HTMLVideoElement;
    for (let i = 0; i < 3; i++) fireEvent.click(screen.getByText('step'));
    // Three steps from frame 0 aim at the middle of frame 3: (3 + 0.5) / 25 = 0.14 s.
    expect(video.currentTime).toBeCloseTo(0.14, 9);
    expect(screen.getByTestId('frame').textContent).toBe('0');
  });

  it('steps with the keys, but not while the coach types a note', () => {
    renderWorkspace();
    const video = screen.getByTestId('video') as HTMLVideoElement;
    fireEvent.keyDown(screen.getByLabelText('note'), { key: 'ArrowRight' });
    expect(video.currentTime).toBe(0);
    // Shift + → jumps 10 frames: (10 + 0.5) / 25 = 0.42 s.
    fireEvent.keyDown(window, { key: 'ArrowRight', shiftKey: true });
    expect(video.currentTime).toBeCloseTo(0.42, 9);
    fireEvent.keyDown(window, { key: 'ArrowLeft' });
    expect(video.currentTime).toBeCloseTo(0.38, 9);
  });

  it('shows the frame the video reports as displayed', () => {
    // happy-dom has no frame callbacks: install one that the test fires by hand, as the browser would.
    let pending: VideoFrameRequestCallback | null = null;
    const proto = HTMLVideoElement.prototype as unknown as Record<string, unknown>;
    proto.requestVideoFrameCallback = (cb: VideoFrameRequestCallback) => {
      pending = cb;
      return 1;
    };
    proto.cancelVideoFrameCallback = () => undefined;
    try {
      renderWorkspace();
      // mediaTime 0.4 s at 25 fps is the start of frame 10 (0.4 · 25 = 10).
      act(() => pending?.(0, { mediaTime: 0.4 } as VideoFrameCallbackMetadata));
      expect(screen.getByTestId('frame').textContent).toBe('10');
      act(() => pending?.(0, { mediaTime: 0.4399 } as VideoFrameCallbackMetadata));
      expect(screen.getByTestId('frame').textContent).toBe('10');
    } finally {
      cleanup();
      delete proto.requestVideoFrameCallback;
      delete proto.cancelVideoFrameCallback;
    }
  });

  it('recomputes the metrics against a new snow line and keeps it when saving fails', async () => {
    api.use(
      http.patch(`${ORIGIN}/api/clips/${clip.id}`, () =>
        HttpResponse.json({ error: { code: 'unavailable', message: 'Storage is down' } }, { status: 503 }),
      ),
    );
    renderWorkspace();
    fireEvent.click(screen.getByText('pose'));
    // Level shoulders against the image horizontal: 0° tilt.
    expect(screen.getByTestId('tilt').textContent).toBe('0.0000');
    fireEvent.click(screen.getByText('line'));
    // The line rises 10 px per 100 px to the image right (atan 0.1 = 5.7106°), so the level shoulders
    // now dip toward the left one (on the image right) by that much: −5.7106°.
    expect(screen.getByTestId('tilt').textContent).toBe('-5.7106');
    await waitFor(() =>
      expect(screen.getByRole('alert').textContent).toContain('The snow line was not saved'),
    );
    expect(screen.getByTestId('line').textContent).toBe('[[0,200],[100,190]]');
  });

  it('uses a frame’s own snow line on that frame only and saves it as such', async () => {
    const bodies: unknown[] = [];
    api.use(
      http.patch(`${ORIGIN}/api/clips/${clip.id}`, async ({ request }) => {
        bodies.push(await request.json());
        return HttpResponse.json({ clip });
      }),
    );
    renderWorkspace();
    const video = screen.getByTestId('video') as HTMLVideoElement;
    fireEvent.click(screen.getByText('pose'));
    fireEvent.click(screen.getByText('frame line'));
    // Same worked example as above: −atan 0.1 = −5.7106° on frame 0.
    expect(screen.getByTestId('tilt').textContent).toBe('-5.7106');
    await waitFor(() =>
      expect(bodies).toEqual([
        {
          frameReferenceLines: [
            {
              frameIndex: 0,
              referenceLine: [
                [0, 200],
                [100, 190],
              ],
            },
          ],
        },
      ]),
    );
    // On frame 1 the clip's line (the image level) applies again.
    fireEvent.click(screen.getByText('step'));
    act(() => {
      video.dispatchEvent(new Event('seeked'));
    });
    expect(screen.getByTestId('frame').textContent).toBe('1');
    fireEvent.click(screen.getByText('pose'));
    expect(screen.getByTestId('tilt').textContent).toBe('0.0000');
  });
});
