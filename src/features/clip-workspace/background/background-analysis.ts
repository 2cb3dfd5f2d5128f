import type { ClipResponse, ServerAnalysisResponse } from '@shared/schemas/clip.schema';
import { api, errorMessage } from '@/lib/api-client';
import { createPoseClient, type PoseClient } from '@/lib/pose-client';
import { postClipFrames } from '../api/post-clip-frames';
import { DecodedFrameSource, WebCodecsUnavailableError } from '../components/analysis/decoded-frames';
import { runWholeClip } from '../components/analysis/run-whole-clip';

export type BackgroundState =
  'waiting' | 'preparing' | 'analysing' | 'paused' | 'done' | 'cancelled' | 'server' | 'failed';

export interface BackgroundItem {
  clipId: string;
  name: string;
  state: BackgroundState;
  done: number;
  total: number;
  /** Why the clip went to the server or failed, in words for the coach. */
  message: string | null;
}

export interface BackgroundSnapshot {
  items: readonly BackgroundItem[];
  paused: boolean;
}

const POLL_MS = 1500;
const sleep = (ms: number, signal: AbortSignal) =>
  new Promise<void>((resolve, reject) => {
    const timer = setTimeout(resolve, ms);
    signal.addEventListener('abort', () => {
      clearTimeout(timer);
      reject(new DOMException('stopped', 'AbortError'));
    });
  });
const isAbort = (error: unknown) => error instanceof DOMException && error.name === 'AbortError';

/**
 * Clips just uploaded from this computer, analysed here one after another from the local files while
 * the coach goes on in the app (decoded with WebCodecs, read by a pose worker of its own so the clip
 * page's readouts are not disturbed). Each clip's server analysis is held while frames arrive; a clip
 * this browser cannot decode, a cancelled one, or one left when the tab closes is read by the server.
 */
export class BackgroundAnalysis {
  private snapshot: BackgroundSnapshot = { items: [], paused: false };
  private readonly files = new Map<string, File>();
  private readonly listeners = new Set<() => void>();
  private current: { clipId: string; stop: AbortController } | null = null;
  private pose: PoseClient | null = null;

  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  getSnapshot = (): BackgroundSnapshot => this.snapshot;

  /** Queues a clip uploaded from `file`; the server is asked to wait for this browser. */
  add(clipId: string, file: File): void {
    if (this.snapshot.items.some((i) => i.clipId === clipId)) return;
    this.files.set(clipId, file);
    this.set({
      items: [
        ...this.snapshot.items,
        { clipId, name: file.name, state: 'waiting', done: 0, total: 0, message: null },
      ],
    });
    void api
      .post(`/api/clips/${encodeURIComponent(clipId)}/server-analysis`, { holdForBrowser: true })
      .catch(() => undefined);
    void this.pump();
  }

  /** Stops after the frames posted so far; they stay stored, and `resume` goes on from there. */
  pause(): void {
    this.set({ paused: true });
    this.current?.stop.abort();
  }

  resume(): void {
    this.set({
      paused: false,
      items: this.snapshot.items.map((i) => (i.state === 'paused' ? { ...i, state: 'waiting' } : i)),
    });
    void this.pump();
  }

  /** Leaves the clip to the server (at once, not after the hold): frames done here stay stored. */
  cancel(clipId: string): void {
    if (this.current?.clipId === clipId) this.current.stop.abort();
    this.update(clipId, { state: 'cancelled', message: 'Left to the server' });
    this.files.delete(clipId);
    void api.post(`/api/clips/${encodeURIComponent(clipId)}/server-analysis`, {}).catch(() => undefined);
    void this.pump();
  }

  private set(patch: Partial<BackgroundSnapshot>): void {
    this.snapshot = { ...this.snapshot, ...patch };
    for (const listener of this.listeners) listener();
  }

  private update(clipId: string, patch: Partial<BackgroundItem>): void {
    this.set({ items: this.snapshot.items.map((i) => (i.clipId === clipId ? { ...i, ...patch } : i)) });
  }

  private async pump(): Promise<void> {
    if (this.current || this.snapshot.paused) return;
    const next = this.snapshot.items.find((i) => i.state === 'waiting');
    if (!next) {
      this.pose?.dispose();
      this.pose = null;
      return;
    }
    const stop = new AbortController();
    this.current = { clipId: next.clipId, stop };
    try {
      await this.run(next.clipId, stop.signal);
    } catch (error) {
      if (isAbort(error)) {
        const item = this.snapshot.items.find((i) => i.clipId === next.clipId);
        if (item?.state !== 'cancelled') this.update(next.clipId, { state: 'paused' });
      } else this.update(next.clipId, { state: 'failed', message: errorMessage(error) });
    } finally {
      this.current = null;
    }
    void this.pump();
  }

  private async run(clipId: string, signal: AbortSignal): Promise<void> {
    const path = `/api/clips/${encodeURIComponent(clipId)}`;
    this.update(clipId, { state: 'preparing' });
    // The server makes the playable copy first (and learns the frame count and rate).
    let clip: ClipResponse['clip'];
    for (;;) {
      clip = (await api.get<ClipResponse>(path, { signal })).clip;
      if (clip.status === 'ready') break;
      if (clip.status === 'failed') throw new Error(clip.failureReason ?? 'the clip could not be prepared');
      await sleep(POLL_MS, signal);
    }
    const status = await api.get<ServerAnalysisResponse>(`${path}/server-analysis`, { signal });
    const frameCount = clip.frameCount ?? 0;
    if (frameCount > 0 && status.storedFrames >= frameCount) {
      this.update(clipId, { state: 'done', done: frameCount, total: frameCount });
      return;
    }
    if (status.serverAnalysis?.status === 'running') {
      this.update(clipId, { state: 'server', message: 'The server was already analysing it' });
      return;
    }
    const file = this.files.get(clipId);
    if (!file || !clip.fps || frameCount === 0) {
      this.update(clipId, { state: 'server', message: 'Left to the server' });
      await api.post(`${path}/server-analysis`, {});
      return;
    }
    const source = new DecodedFrameSource(file);
    try {
      try {
        await source.open(signal);
      } catch (error) {
        if (!(error instanceof WebCodecsUnavailableError)) throw error;
        // This browser cannot read the file: the server reads it with its own decoder, now.
        this.update(clipId, {
          state: 'server',
          message: `This browser cannot decode it (${error.message}); the server analyses it`,
        });
        await api.post(`${path}/server-analysis`, {});
        return;
      }
      this.pose ??= createPoseClient();
      const model = clip.defaultModel;
      await this.pose.load(model);
      await this.pose.reset();
      // Frames already stored (an earlier run here, paused) are not read again.
      const from = Math.min(status.storedFrames, frameCount);
      const pick = clip.athletePick && clip.athletePick.frameIndex >= from ? clip.athletePick : null;
      const first = pick ? pick.frameIndex : from;
      const frames = Array.from({ length: frameCount - first }, (_, i) => first + i);
      this.update(clipId, { state: 'analysing', done: 0, total: frames.length });
      const pose = this.pose;
      await runWholeClip(
        {
          frames,
          fps: clip.fps,
          model,
          view: clip.view,
          facing: clip.facing,
          referenceLine: clip.referenceLine,
          pick,
        },
        {
          grab: (i, s) => source.grab(i, s),
          detect: (bitmap, req) => pose.detect(bitmap, req),
          postBatch: (input, s) => postClipFrames(clipId, input, s),
          now: () => performance.now(),
          discard: (bitmap) => bitmap.close(),
        },
        { signal, onProgress: (p) => this.update(clipId, { done: p.done, total: p.total }) },
      );
      if (signal.aborted) throw new DOMException('stopped', 'AbortError');
      this.update(clipId, { state: 'done' });
    } finally {
      source.close();
    }
  }
}

/** The app's one background queue (module-wide: it outlives the page that filled it). */
export const backgroundAnalysis = new BackgroundAnalysis();
