// The browser facade against a stand-in worker: ordering, progress, cancellation, errors, idle stop.
import { describe, expect, it, vi } from 'vitest';
import {
  createPoseClient,
  type PoseFrameRequest,
  type QueuedFrame,
  type WorkerRequest,
  type WorkerResponse,
} from '@/lib/pose-client';

/** Answers detect requests after `delay(n)` ms, so later frames can finish first. */
class FakeWorker {
  onmessage: ((event: MessageEvent<WorkerResponse>) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  received: WorkerRequest[] = [];
  terminated = false;
  private cancelled = new Set<string>();
  constructor(private delay: (n: number) => number = () => 1) {}
  postMessage(message: WorkerRequest): void {
    this.received.push(message);
    const reply = (m: WorkerResponse, after = 0) =>
      setTimeout(() => this.onmessage?.({ data: m } as MessageEvent<WorkerResponse>), after);
    if (message.type === 'detect') {
      const { id, queueId, req } = message;
      setTimeout(() => {
        if (queueId && this.cancelled.has(queueId)) return reply({ type: 'cancelled', id });
        if (req.frameIndex === 99) return reply({ type: 'error', id, message: 'model failed to load' });
        if (queueId) reply({ type: 'progress', queueId, id });
        reply({
          type: 'result',
          id,
          result: {
            ...req,
            keypoints: [],
            score: null,
            metrics: {},
            reasons: {},
            confidence: {},
            width: 1,
            height: 1,
            timings: { detectMs: 1, totalMs: 1, passes: 1 },
            backend: 'fake',
          } as never,
        });
      }, this.delay(this.received.length));
    } else if (message.type === 'cancel') {
      this.cancelled.add(message.queueId);
      reply({ type: 'done', id: message.id });
    } else {
      reply({ type: 'done', id: message.id });
    }
  }
  terminate(): void {
    this.terminated = true;
  }
}

const bitmap = () => ({ close: vi.fn(), width: 1, height: 1 }) as unknown as ImageBitmap;
const req = (frameIndex: number): PoseFrameRequest => ({
  frameIndex,
  timeMs: frameIndex * 40,
  model: 'lightning',
  view: 'front',
});
const frames = (n: number): QueuedFrame[] =>
  Array.from({ length: n }, (_, i) => ({ bitmap: bitmap(), req: req(i) }));

describe('pose client', () => {
  it('returns queue results in frame order even when the worker answers out of order', async () => {
    const worker = new FakeWorker((n) => (n % 2 === 0 ? 1 : 15));
    const client = createPoseClient({ createWorker: () => worker as unknown as Worker });
    const progress: [number, number][] = [];
    const results = await client.analyzeQueue(frames(6), {
      total: 6,
      onProgress: (d, t) => progress.push([d, t]),
    });
    expect(results.map((r) => r.frameIndex)).toEqual([0, 1, 2, 3, 4, 5]);
    expect(progress).toEqual([1, 2, 3, 4, 5, 6].map((d) => [d, 6]));
    // Never more than two frames handed over before one comes back.
    expect(worker.received.filter((m) => m.type === 'detect')).toHaveLength(6);
    client.dispose();
  });

  it('stops on abort: rejects with AbortError and closes frames it never sent', async () => {
    const worker = new FakeWorker(() => 5);
    const client = createPoseClient({ createWorker: () => worker as unknown as Worker });
    const controller = new AbortController();
    const list = frames(10);
    const run = client.analyzeQueue(list, {
      signal: controller.signal,
      onProgress: (done) => done === 2 && controller.abort(),
    });
    await expect(run).rejects.toMatchObject({ name: 'AbortError' });
    const sent = worker.received.filter((m) => m.type === 'detect').length;
    expect(sent).toBeLessThan(10);
    expect(
      list.slice(sent).every((f) => (f.bitmap.close as ReturnType<typeof vi.fn>).mock.calls.length === 1),
    ).toBe(true);
    expect(worker.received.some((m) => m.type === 'cancel')).toBe(true);
    client.dispose();
  });

  it('passes worker errors on to the caller', async () => {
    const client = createPoseClient({ createWorker: () => new FakeWorker() as unknown as Worker });
    await expect(client.detect(bitmap(), req(99))).rejects.toThrow('model failed to load');
    client.dispose();
  });

  it('starts the worker lazily and stops it after the idle time', async () => {
    vi.useFakeTimers();
    try {
      let started = 0;
      const worker = new FakeWorker(() => 1);
      const client = createPoseClient({
        idleMs: 1000,
        createWorker: () => {
          started++;
          return worker as unknown as Worker;
        },
      });
      await client.reset(); // nothing running: nothing to reset, nothing started
      expect(started).toBe(0);
      const pending = client.detect(bitmap(), req(0));
      await vi.advanceTimersByTimeAsync(5);
      await pending;
      expect(started).toBe(1);
      await vi.advanceTimersByTimeAsync(900);
      expect(worker.terminated).toBe(false);
      await vi.advanceTimersByTimeAsync(200);
      expect(worker.terminated).toBe(true);
    } finally {
      vi.useRealTimers();
    }
  });
});
