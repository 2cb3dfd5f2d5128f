// @vitest-environment happy-dom
import { act, cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { http, HttpResponse } from 'msw';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Keypoint } from '@shared/keypoints';
import { ToastProvider } from '@/components/ui/toast';
import { PoseOverlay } from '@/features/clip-workspace/components/overlays/pose-overlay';
import { ClipStageProvider } from '@/features/clip-workspace/components/stage/clip-stage';
import { useStageProbe } from '../helpers/stage-probe';
import { useFramePose } from '@/features/clip-workspace/hooks/use-frame-pose';
import { configureApiClient } from '@/lib/api-client';
import { createQueryClient } from '@/lib/react-query';
import { clipFixture } from '../helpers/demo-data';
import { createApiMock, ORIGIN } from '../helpers/render-app';

vi.mock('@/lib/pose-client', () => ({ getPoseClient: () => ({ detect: vi.fn(), reset: vi.fn() }) }));

// happy-dom lays nothing out: the stage and video have no size, so the video ↔ stage mapping is the
// identity and a pointer at (x, y) on the canvas is the video pixel (x, y).
const clip = clipFixture({ view: 'front', fps: 25, frameCount: 100, durationMs: 4000, referenceLine: null });
const api = createApiMock();
const stored: Keypoint[] = [
  { name: 'left_hip', x: 120, y: 150, score: 0.9 },
  { name: 'right_hip', x: 80, y: 150, score: 0.9 },
  { name: 'left_knee', x: 118, y: 200, score: 0.7 },
  { name: 'right_knee', x: 82, y: 200, score: 1 },
];

beforeAll(() => {
  configureApiClient({ baseUrl: ORIGIN });
  api.listen({ onUnhandledRequest: 'error' });
  const proto = HTMLElement.prototype as unknown as Record<string, unknown>;
  proto.setPointerCapture ??= () => undefined;
  proto.releasePointerCapture ??= () => undefined;
  proto.hasPointerCapture ??= () => false;
});
afterEach(() => {
  cleanup();
  api.resetHandlers();
});
afterAll(() => api.close());

function Readout() {
  useFramePose();
  const ws = useStageProbe();
  return (
    <>
      <video ref={ws.setVideoElement} />
      <output data-testid="knees">{ws.currentPose?.metrics.kneeSeparationRatio?.toFixed(3) ?? 'none'}</output>
      <output data-testid="origin">{ws.currentPose?.origin ?? 'none'}</output>
    </>
  );
}

async function renderOverlay(canEdit: boolean) {
  const puts: unknown[] = [];
  api.use(
    http.get(`${ORIGIN}/api/clips/${clip.id}/frames`, () =>
      HttpResponse.json({
        model: 'lightning',
        frames: [{ frameIndex: 0, timeMs: 0, keypoints: stored, metrics: {}, reasons: {}, corrected: false }],
        series: null,
        flags: [],
      }),
    ),
    http.put(`${ORIGIN}/api/clips/${clip.id}/frames/0`, async ({ request }) => {
      puts.push(await request.json());
      return HttpResponse.json({ frame: {} });
    }),
  );
  render(
    <QueryClientProvider client={createQueryClient()}>
      <ToastProvider>
        <ClipStageProvider clip={clip} renewMedia={() => Promise.resolve(null)} readOnly={!canEdit}>
          <Readout />
          <PoseOverlay />
        </ClipStageProvider>
      </ToastProvider>
    </QueryClientProvider>,
  );
  await waitFor(() => expect(screen.getByTestId('origin').textContent).toBe('stored'));
  return puts;
}

function drag(from: [number, number], to: [number, number]) {
  const canvas = screen.getByTestId('pose-overlay');
  // One event per act, as the browser renders between them.
  act(() => {
    fireEvent.pointerDown(canvas, { button: 0, pointerId: 1, clientX: from[0], clientY: from[1] });
  });
  act(() => {
    fireEvent.pointerMove(canvas, { pointerId: 1, clientX: to[0], clientY: to[1] });
  });
  act(() => {
    fireEvent.pointerUp(canvas, { pointerId: 1, clientX: to[0], clientY: to[1] });
  });
}

describe('dragging a keypoint', () => {
  it('recomputes the metrics at once and stores the frame as corrected', async () => {
    const puts = await renderOverlay(true);
    // Knees 36 px apart over hips 40 px apart: 0.9. Moving the left knee 10 px out makes 46/40 = 1.15.
    expect(screen.getByTestId('knees').textContent).toBe('0.900');
    drag([118, 200], [128, 201]);
    expect(screen.getByTestId('knees').textContent).toBe('1.150');
    expect(screen.getByTestId('origin').textContent).toBe('corrected');
    await waitFor(() => expect(puts).toHaveLength(1));
    const body = puts[0] as { model: string; keypoints: Keypoint[] };
    expect(body.model).toBe('lightning');
    expect(body.keypoints.find((k) => k.name === 'left_knee')).toEqual({
      name: 'left_knee',
      x: 128,
      y: 201,
      score: 1,
    });
    // The model's full-confidence point is capped so it does not read back as hand-placed.
    expect(body.keypoints.find((k) => k.name === 'right_knee')?.score).toBe(0.999);
  });

  it('does nothing for a role that may not change the analysis', async () => {
    const puts = await renderOverlay(false);
    drag([118, 200], [128, 201]);
    expect(screen.getByTestId('knees').textContent).toBe('0.900');
    expect(puts).toHaveLength(0);
  });
});
