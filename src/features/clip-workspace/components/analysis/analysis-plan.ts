import type { PoseModelName } from '@shared/keypoints';

/** Frames sent per batch while analysing: small enough that Cancel keeps nearly all finished work. */
export const ANALYSIS_BATCH_SIZE = 30;

export const EVERY_NTH_CHOICES = [1, 2, 3, 5, 10] as const;

/** The frame indices a whole-clip run visits: 0, n, 2n, ... below frameCount. */
export function framesToAnalyze(frameCount: number, everyNth: number): number[] {
  if (!Number.isInteger(everyNth) || everyNth < 1)
    throw new RangeError(`every Nth must be a whole number ≥ 1`);
  const out: number[] = [];
  for (let i = 0; i < frameCount; i += everyNth) out.push(i);
  return out;
}

export function chunk<T>(items: readonly T[], size: number): T[][] {
  if (!Number.isInteger(size) || size < 1) throw new RangeError('chunk size must be a whole number ≥ 1');
  const out: T[][] = [];
  for (let i = 0; i < items.length; i += size) out.push(items.slice(i, i + size));
  return out;
}

/**
 * Time left from how fast recent frames went. A sliding window follows a speed change (the model
 * warming up, the tab in the background) sooner than the overall mean would.
 */
export class EtaEstimator {
  private readonly stamps: number[] = [];

  constructor(
    private readonly total: number,
    private readonly window = 20,
  ) {}

  /** Records that a frame finished at `nowMs` (any monotonic clock). */
  tick(nowMs: number): void {
    this.stamps.push(nowMs);
    if (this.stamps.length > this.window + 1) this.stamps.shift();
  }

  /** Starts the clock: the first frame's time then counts too. */
  start(nowMs: number): void {
    this.stamps.length = 0;
    this.stamps.push(nowMs);
  }

  /** Milliseconds per frame over the window, or null before two stamps exist. */
  msPerFrame(): number | null {
    if (this.stamps.length < 2) return null;
    return (this.stamps[this.stamps.length - 1] - this.stamps[0]) / (this.stamps.length - 1);
  }

  remainingMs(done: number): number | null {
    const rate = this.msPerFrame();
    if (rate === null) return null;
    return Math.max(0, this.total - done) * rate;
  }
}

/** "about 2 min 10 s", "about 40 s", "under 5 s": a time left, never falsely precise. */
export function formatTimeLeft(ms: number | null): string {
  if (ms === null || !Number.isFinite(ms)) return 'estimating time left…';
  const seconds = Math.round(ms / 1000);
  if (seconds < 5) return 'under 5 s left';
  if (seconds < 60) return `about ${Math.round(seconds / 5) * 5} s left`;
  const minutes = Math.floor(seconds / 60);
  const rest = Math.round((seconds % 60) / 10) * 10;
  return rest === 0 || rest === 60
    ? `about ${minutes + (rest === 60 ? 1 : 0)} min left`
    : `about ${minutes} min ${rest} s left`;
}

/**
 * Milliseconds per frame used before anything was measured on this computer: the detector times
 * measured with the Node WASM backend on 2 cores (models/README.md) plus a seek and a
 * frame grab, which takes a few tens of milliseconds in Chromium (common practice).
 */
export const FALLBACK_MS_PER_FRAME: Record<PoseModelName, number> = {
  lightning: 80 + 40,
  thunder: 380 + 40,
  blazepose: 100 + 40,
};

export function roughDurationMs(
  frames: number,
  model: PoseModelName,
  measuredMsPerFrame?: number | null,
  passesPerFrame = 1,
): number {
  return frames * (measuredMsPerFrame ?? FALLBACK_MS_PER_FRAME[model] * passesPerFrame);
}

/**
 * Model passes per frame of a careful reading against one of the usual run: a followed athlete's box
 * is read twice (it and its mirror image); a whole frame is found afresh and refined, then mirrored and
 * refined again (shared/pose/pose-detector.ts).
 */
export const carefulPasses = (followingPick: boolean): number => (followingPick ? 2 : 4);

/** "about 3 min", "about 40 s": for the empty state, before a run. */
export function formatRoughDuration(ms: number): string {
  const seconds = Math.max(1, Math.round(ms / 1000));
  if (seconds < 60) return `about ${Math.max(5, Math.round(seconds / 5) * 5)} s`;
  const minutes = Math.round(seconds / 60);
  return `about ${minutes} min`;
}
