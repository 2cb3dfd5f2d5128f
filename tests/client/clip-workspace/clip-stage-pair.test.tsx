// @vitest-environment happy-dom
import { act, cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { http, HttpResponse } from 'msw';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { ToastProvider } from '@/components/ui/toast';
import { ClipStage } from '@/features/clip-workspace/components/stage/clip-stage';
import { useStage, useStageFrame } from '@/features/clip-workspace/components/stage/stage-context';
import { StageClock } from '@/features/clip-workspace/lib/stage-clock';
import { configureApiClient } from '@/lib/api-client';
import { createQueryClient } from '@/lib/react-query';
import { clipFixture } from '../helpers/demo-data';
import { createApiMock, ORIGIN } from '../helpers/render-app';

// Two clips on one page (what Compare needs): each stage keeps its own frame, zoom and play state.
const left = clipFixture({
  id: '70000000-0000-4000-8000-0000000000a1',
  originalName: 'baseline.mp4',
  fps: 25,
  frameCount: 100,
  durationMs: 4000,
});
const right = clipFixture({
  id: '70000000-0000-4000-8000-0000000000a2',
  originalName: 'later.mp4',
  fps: 50,
  frameCount: 300,
  durationMs: 6000,
});
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

function serveClips() {
  for (const clip of [left, right]) {
    api.use(
      http.get(`${ORIGIN}/api/clips/${clip.id}`, () => HttpResponse.json({ clip })),
      http.get(`${ORIGIN}/api/clips/${clip.id}/frames`, () =>
        HttpResponse.json({ model: 'lightning', frames: [], series: null, flags: [] }),
      ),
      http.get(`${ORIGIN}/api/clips/${clip.id}/notes`, () => HttpResponse.json({ notes: [] })),
    );
  }
  api.use(http.get(`${ORIGIN}/api/tolerance-bands`, () => HttpResponse.json({ bands: [] })));
}

/** The controls a page puts beside a stage; it reads that stage's contexts only. */
function StageControls({ name }: { name: string }) {
  const stage = useStage();
  const frame = useStageFrame();
  return (
    <div role="group" aria-label={name}>
      <output data-testid="frame">{frame}</output>
      <output data-testid="zoom">{stage.viewTransform.zoom}</output>
      <button onClick={() => stage.stepFrames(1)}>step</button>
      <button onClick={() => stage.zoomAt(2)}>zoom</button>
      <button onClick={stage.play}>play</button>
    </div>
  );
}

function renderPair(clocks?: { a?: StageClock; b?: StageClock }) {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <ToastProvider>
        <ClipStage clipId={left.id} readOnly clock={clocks?.a}>
          <StageControls name="left" />
        </ClipStage>
        <ClipStage clipId={right.id} readOnly clock={clocks?.b}>
          <StageControls name="right" />
        </ClipStage>
      </ToastProvider>
    </QueryClientProvider>,
  );
}

const videoOf = (name: string) => screen.getByLabelText(`Video of ${name}`) as HTMLVideoElement;

describe('two clip stages on one page', () => {
  it('load their own clips and step each on its own', async () => {
    serveClips();
    renderPair();
    await waitFor(() => expect(videoOf('baseline.mp4')).toBeTruthy());
    await waitFor(() => expect(videoOf('later.mp4')).toBeTruthy());
    const a = within(screen.getByRole('group', { name: 'left' }));
    const b = within(screen.getByRole('group', { name: 'right' }));

    for (let i = 0; i < 3; i++) fireEvent.click(a.getByText('step'));
    fireEvent.click(b.getByText('step'));
    // Each stage seeks its own video to the middle of its own frame: (3 + 0.5) / 25 and (1 + 0.5) / 50.
    expect(videoOf('baseline.mp4').currentTime).toBeCloseTo(0.14, 9);
    expect(videoOf('later.mp4').currentTime).toBeCloseTo(0.03, 9);

    act(() => {
      videoOf('baseline.mp4').dispatchEvent(new Event('seeked'));
      videoOf('later.mp4').dispatchEvent(new Event('seeked'));
    });
    expect(a.getByTestId('frame').textContent).toBe('3');
    expect(b.getByTestId('frame').textContent).toBe('1');
  });

  it('zoom one stage and leave the other as it was', async () => {
    serveClips();
    renderPair();
    await waitFor(() => expect(screen.getAllByTestId('zoom')).toHaveLength(2));
    const a = within(screen.getByRole('group', { name: 'left' }));
    const b = within(screen.getByRole('group', { name: 'right' }));
    fireEvent.click(b.getByText('zoom'));
    expect(b.getByTestId('zoom').textContent).toBe('2');
    expect(a.getByTestId('zoom').textContent).toBe('1');
  });

  it('follow a clock the page owns: the page reads each frame and steps a stage from outside', async () => {
    serveClips();
    const a = new StageClock();
    const b = new StageClock();
    renderPair({ a, b });
    await waitFor(() => expect(videoOf('later.mp4')).toBeTruthy());
    act(() => b.seekToFrame(120));
    // Frame 120 at 50 fps: (120 + 0.5) / 50 = 2.41 s; the other stage does not move.
    expect(videoOf('later.mp4').currentTime).toBeCloseTo(2.41, 9);
    expect(videoOf('baseline.mp4').currentTime).toBe(0);
    act(() => {
      videoOf('later.mp4').dispatchEvent(new Event('seeked'));
    });
    expect(b.get().frame).toBe(120);
    expect(a.get().frame).toBe(0);
  });
});
