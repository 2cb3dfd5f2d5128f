// Frame time convention of the whole workspace: frame i is on screen from i/fps to (i+1)/fps, and a
// seek aims at the middle of that span so rounding in the decoder cannot land on a neighbour.

/** Index of the frame whose presentation span contains `mediaTimeS` (seconds). */
export function frameFromMediaTime(mediaTimeS: number, fps: number): number {
  // The small epsilon absorbs timestamps stored a hair below a frame boundary (e.g. 0.33333 s at 3 fps).
  return Math.max(0, Math.floor(mediaTimeS * fps + 1e-3));
}

/** Seek target (seconds) for frame `frameIndex`: the middle of its presentation span. */
export function seekTimeForFrame(frameIndex: number, fps: number): number {
  return (frameIndex + 0.5) / fps;
}

/** Start of frame `frameIndex` in milliseconds. */
export function frameStartMs(frameIndex: number, fps: number): number {
  return (frameIndex * 1000) / fps;
}

/** Frame shown at `ms` milliseconds into the clip, clamped to the clip. */
export function frameAtMs(ms: number, fps: number, frameCount: number): number {
  return clampFrame(frameFromMediaTime(ms / 1000, fps), frameCount);
}

export function clampFrame(frameIndex: number, frameCount: number): number {
  if (frameCount <= 0) return 0;
  return Math.min(frameCount - 1, Math.max(0, Math.round(frameIndex)));
}

/** "m:ss.mmm" for a clip time in milliseconds. */
export function formatClipTime(ms: number): string {
  const safe = Math.max(0, ms);
  const minutes = Math.floor(safe / 60_000);
  const seconds = (safe - minutes * 60_000) / 1000;
  return `${minutes}:${seconds.toFixed(3).padStart(6, '0')}`;
}
