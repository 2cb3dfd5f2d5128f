// Browser facade for pose detection. Components and hooks call getPoseClient(); only this file
// talks to src/workers/pose.worker.ts (started lazily, stopped after a while without work).
//
//   const pose = getPoseClient();
//   const result = await pose.detect(bitmap, { frameIndex: 0, timeMs: 0, model: 'lightning', view: 'front' });
//   const all = await pose.analyzeQueue(frames, { onProgress: (done, total) => ..., signal });
//
// detect() transfers the ImageBitmap to the worker (it is closed there). Keypoints are in pixels of
// that bitmap; metrics come from shared/metrics, the same code the server and CLI run. Frames of one
// clip keep the detector's tracking state; call reset() before an unrelated clip or image.
// analyzeQueue() keeps two frames in flight, reports progress, and rejects with an AbortError when
// the signal aborts (frames not yet sent are closed, the worker drops the ones still waiting).

import type { Keypoint, PoseModelName, ReferenceLine, SkierFacing, View } from '@shared/keypoints';
import type { FollowState, PickPoint } from '@shared/pose/follow';
import type { MetricKey } from '@shared/metrics';

export interface PoseFrameRequest {
  frameIndex: number;
  /** Time of the frame in its clip, ms (drives the detectors' temporal smoothing). */
  timeMs: number;
  model: PoseModelName;
  view: View;
  referenceLine?: ReferenceLine | null;
  /** Front view filmed from behind: the worker swaps left and right back to the skier's own. */
  facing?: SkierFacing;
  /**
   * Follow one athlete among several people: `pick` finds them at a point of this frame (source
   * pixels) and starts following; `next` reads this frame around where they were in the last one;
   * `near` reads it around where they were in a frame already known (stored or read), `framesApart`
   * from this one (source pixels; the box grows with the distance).
   */
  follow?:
    { pick: PickPoint } | { next: true } | { near: { keypoints: Keypoint[]; framesApart: number } } | null;
  /** A still image rather than a clip frame: tracking reset before it, no temporal smoothing. */
  still?: boolean;
  /** Careful reading: the frame (or the followed region) read with its mirror image too, averaged. */
  careful?: boolean;
}

export interface PoseFrameResult extends PoseFrameRequest {
  /** Pixels of the bitmap as given (y down); empty when no skier was found. */
  keypoints: Keypoint[];
  /** The model's pose score, 0..1, null when no skier was found. */
  score: number | null;
  metrics: Record<MetricKey, number | null>;
  reasons: Partial<Record<MetricKey, string>>;
  confidence: Partial<Record<MetricKey, number>>;
  width: number;
  height: number;
  /** detectMs: the model passes; totalMs: the whole frame in the worker, pixels to metrics. */
  timings: { detectMs: number; totalMs: number; passes: number };
  backend: string;
  /** With `follow`: whether the athlete was found in this frame, and why not. */
  followed?: { state: FollowState; reason: string | null };
}

export interface WorkerConfig {
  modelBase: string;
  wasmBase: string;
  /** Tried in order; default webgl, wasm, cpu. */
  backends: string[];
  /** Use WebGL even when the browser draws it in software (much slower than WASM there). */
  allowSoftwareWebgl: boolean;
  /** Frames with a longer side are downscaled before detection; keypoints are scaled back. */
  maxSide: number;
}

export type WorkerRequest =
  | { type: 'configure'; id: number; config: Partial<WorkerConfig> }
  | { type: 'load'; id: number; model: PoseModelName }
  | { type: 'detect'; id: number; queueId?: string; bitmap: ImageBitmap; req: PoseFrameRequest }
  | { type: 'cancel'; id: number; queueId: string }
  | { type: 'reset'; id: number };

export type WorkerResponse =
  | { type: 'done'; id: number }
  | { type: 'loaded'; id: number; model: PoseModelName; backend: string; loadMs: number; warmupMs: number }
  | { type: 'result'; id: number; result: PoseFrameResult }
  | { type: 'progress'; queueId: string; id: number }
  | { type: 'cancelled'; id: number }
  | { type: 'error'; id: number; message: string };

export interface PoseClient {
  detect(bitmap: ImageBitmap, req: PoseFrameRequest): Promise<PoseFrameResult>;
  analyzeQueue(
    frames: AsyncIterable<QueuedFrame> | Iterable<QueuedFrame>,
    opts?: { onProgress?(done: number, total: number): void; signal?: AbortSignal; total?: number },
  ): Promise<PoseFrameResult[]>;
  /** Loads a model ahead of the first frame; resolves with the backend and load/warm-up times. */
  load(model: PoseModelName): Promise<{ backend: string; loadMs: number; warmupMs: number }>;
  reset(): Promise<void>;
  dispose(): void;
}

export interface QueuedFrame {
  bitmap: ImageBitmap;
  req: PoseFrameRequest;
}

export interface PoseClientOptions {
  config?: Partial<WorkerConfig>;
  /** Stop the worker (and free the model) after this long without work, ms. Default 120 s. */
  idleMs?: number;
  /** For tests and embedding: how to start the worker. */
  createWorker?: () => Worker;
}

type Pending = { resolve(value: WorkerResponse): void; reject(error: Error): void };

function abortError(): Error {
  return new DOMException('pose analysis cancelled', 'AbortError');
}

export function createPoseClient(options: PoseClientOptions = {}): PoseClient {
  const idleMs = options.idleMs ?? 120_000;
  const start =
    options.createWorker ??
    (() =>
      new Worker(new URL('../workers/pose.worker.ts', import.meta.url), { type: 'module', name: 'pose' }));
  let worker: Worker | null = null;
  let nextId = 1;
  let queueCount = 0;
  let idleTimer: ReturnType<typeof setTimeout> | null = null;
  const pending = new Map<number, Pending>();
  const progressListeners = new Map<string, () => void>();

  function ensureWorker(): Worker {
    if (idleTimer) clearTimeout(idleTimer);
    idleTimer = null;
    if (worker) return worker;
    const w = start();
    w.onmessage = (event: MessageEvent<WorkerResponse>) => {
      const message = event.data;
      if (message.type === 'progress') {
        progressListeners.get(message.queueId)?.();
        return;
      }
      const entry = pending.get(message.id);
      if (!entry) return;
      pending.delete(message.id);
      if (message.type === 'error') entry.reject(new Error(message.message));
      else if (message.type === 'cancelled') entry.reject(abortError());
      else entry.resolve(message);
      scheduleIdle();
    };
    w.onerror = (event) => {
      const error = new Error(`pose worker failed: ${event.message || 'unknown error'}`);
      for (const entry of pending.values()) entry.reject(error);
      pending.clear();
      w.terminate();
      if (worker === w) worker = null;
    };
    worker = w;
    if (options.config) send({ type: 'configure', id: nextId++, config: options.config });
    return w;
  }

  function scheduleIdle(): void {
    if (pending.size > 0 || !worker || idleTimer) return;
    idleTimer = setTimeout(() => {
      idleTimer = null;
      if (pending.size === 0) dispose();
    }, idleMs);
  }

  function send(message: WorkerRequest, transfer: Transferable[] = []): Promise<WorkerResponse> {
    const w = ensureWorker();
    return new Promise<WorkerResponse>((resolve, reject) => {
      pending.set(message.id, { resolve, reject });
      w.postMessage(message, transfer);
    });
  }

  function detectIn(bitmap: ImageBitmap, req: PoseFrameRequest, queueId?: string): Promise<PoseFrameResult> {
    return send({ type: 'detect', id: nextId++, queueId, bitmap, req }, [bitmap]).then(
      (m) => (m as Extract<WorkerResponse, { type: 'result' }>).result,
    );
  }

  async function analyzeQueue(
    frames: AsyncIterable<QueuedFrame> | Iterable<QueuedFrame>,
    opts: { onProgress?(done: number, total: number): void; signal?: AbortSignal; total?: number } = {},
  ): Promise<PoseFrameResult[]> {
    const { signal } = opts;
    if (signal?.aborted) throw abortError();
    const queueId = `q${++queueCount}`;
    const results: PoseFrameResult[] = [];
    const inFlight = new Set<Promise<void>>();
    let seen = 0;
    let done = 0;
    let failure: unknown = null;
    const total = () => opts.total ?? Math.max(seen, done);
    progressListeners.set(queueId, () => {
      done++;
      opts.onProgress?.(done, total());
    });
    const onAbort = () => {
      void send({ type: 'cancel', id: nextId++, queueId }).catch(() => undefined);
    };
    signal?.addEventListener('abort', onAbort, { once: true });
    try {
      for await (const frame of frames as AsyncIterable<QueuedFrame>) {
        if (signal?.aborted || failure) {
          frame.bitmap.close();
          continue;
        }
        const index = seen++;
        const job = detectIn(frame.bitmap, frame.req, queueId).then(
          (result) => {
            results[index] = result;
          },
          (error: unknown) => {
            failure ??= error;
          },
        );
        const tracked = job.finally(() => inFlight.delete(tracked));
        inFlight.add(tracked);
        if (inFlight.size >= 2) await Promise.race(inFlight);
      }
      await Promise.all(inFlight);
    } finally {
      signal?.removeEventListener('abort', onAbort);
      progressListeners.delete(queueId);
    }
    if (signal?.aborted) throw abortError();
    if (failure) throw failure;
    return results;
  }

  function dispose(): void {
    if (idleTimer) clearTimeout(idleTimer);
    idleTimer = null;
    for (const entry of pending.values()) entry.reject(new Error('pose client disposed'));
    pending.clear();
    worker?.terminate();
    worker = null;
  }

  return {
    detect: (bitmap, req) => detectIn(bitmap, req),
    analyzeQueue,
    async load(model) {
      const m = (await send({ type: 'load', id: nextId++, model })) as Extract<
        WorkerResponse,
        { type: 'loaded' }
      >;
      return { backend: m.backend, loadMs: m.loadMs, warmupMs: m.warmupMs };
    },
    async reset() {
      // Nothing to forget when the worker is not running.
      if (!worker) return;
      await send({ type: 'reset', id: nextId++ });
    },
    dispose,
  };
}

let shared: PoseClient | null = null;

/** The app-wide pose client (one worker, one loaded model per kind). */
export function getPoseClient(): PoseClient {
  shared ??= createPoseClient();
  return shared;
}
