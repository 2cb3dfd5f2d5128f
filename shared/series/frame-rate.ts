import { median } from 'mathjs/number';

/** A stored frame's place in the clip: its index and its presentation time in milliseconds. */
export interface TimedFrame {
  frameIndex: number;
  timeMs: number;
}

/**
 * Frames per second from the frames' own times, for a clip whose container gave no rate: the median
 * time per frame over consecutive stored frames (gaps between analysed frames divide out, a dropped
 * or doubled timestamp does not move a median). Null when no two frames tell a rate.
 */
export function estimateFrameRate(frames: readonly TimedFrame[]): number | null {
  const msPerFrame: number[] = [];
  for (let i = 1; i < frames.length; i++) {
    const span = frames[i].frameIndex - frames[i - 1].frameIndex;
    const ms = frames[i].timeMs - frames[i - 1].timeMs;
    if (span > 0 && ms > 0) msPerFrame.push(ms / span);
  }
  if (msPerFrame.length === 0) return null;
  return 1000 / median(msPerFrame);
}

/** The smallest step between analysed frames (1 for every frame, N for every Nth). */
export function frameStep(frames: readonly { frameIndex: number }[]): number {
  let step = Infinity;
  const sorted = frames.map((f) => f.frameIndex).sort((a, b) => a - b);
  for (let i = 1; i < sorted.length; i++) step = Math.min(step, sorted[i] - sorted[i - 1] || Infinity);
  return Number.isFinite(step) ? step : 1;
}

/** Frames closer than a quarter second read as one moment: one stretch of a flag outside turns. */
export const FLAG_STRETCH_GAP_S = 0.25;

/** The largest frame gap still one stretch: a quarter second, and never less than the analysis step. */
export function stretchGapFrames(frames: readonly { frameIndex: number }[], fps: number): number {
  return Math.max(frameStep(frames), Math.round(fps * FLAG_STRETCH_GAP_S));
}
