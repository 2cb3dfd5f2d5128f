// Test page for tests/e2e/pose-worker.e2e.test.ts: drives the real pose client and worker.
import {
  createPoseClient,
  type PoseFrameRequest,
  type PoseFrameResult,
  type QueuedFrame,
} from '@/lib/pose-client';

const params = new URLSearchParams(location.search);
const backends = params.get('backends')?.split(',');
const client = createPoseClient({
  config: { ...(backends ? { backends } : {}), allowSoftwareWebgl: params.has('software-webgl') },
});

async function bitmapOf(url: string): Promise<ImageBitmap> {
  const response = await fetch(url);
  if (!response.ok) throw new Error(`${url}: HTTP ${response.status}`);
  return createImageBitmap(await response.blob());
}

async function detect(url: string, req: PoseFrameRequest): Promise<PoseFrameResult> {
  return client.detect(await bitmapOf(url), req);
}

/** Runs the same still N times through the queue; aborts after `abortAfter` results when given. */
async function queue(
  url: string,
  req: PoseFrameRequest,
  count: number,
  abortAfter?: number,
): Promise<{ results: number; progress: number[]; error: string | null; heartbeats: number }> {
  const progress: number[] = [];
  const controller = new AbortController();
  // The page must stay responsive while the worker runs: count timer ticks meanwhile.
  let heartbeats = 0;
  const timer = setInterval(() => heartbeats++, 20);
  async function* frames(): AsyncGenerator<QueuedFrame> {
    for (let i = 0; i < count; i++)
      yield { bitmap: await bitmapOf(url), req: { ...req, frameIndex: i, timeMs: i * 40 } };
  }
  try {
    const results = await client.analyzeQueue(frames(), {
      total: count,
      signal: controller.signal,
      onProgress: (done) => {
        progress.push(done);
        if (abortAfter !== undefined && done >= abortAfter) controller.abort();
      },
    });
    return { results: results.length, progress, error: null, heartbeats };
  } catch (error) {
    return { results: 0, progress, error: (error as Error).name, heartbeats };
  } finally {
    clearInterval(timer);
  }
}

Object.assign(window, { poseHarness: { detect, queue, reset: () => client.reset() } });
document.getElementById('status')!.textContent = 'ready';
