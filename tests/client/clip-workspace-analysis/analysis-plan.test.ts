import { describe, expect, it } from 'vitest';
import {
  chunk,
  EtaEstimator,
  formatRoughDuration,
  formatTimeLeft,
  framesToAnalyze,
  roughDurationMs,
  carefulPasses,
} from '@/features/clip-workspace/components/analysis/analysis-plan';

describe('frames to analyse', () => {
  it('visits every Nth frame from the first', () => {
    expect(framesToAnalyze(10, 3)).toEqual([0, 3, 6, 9]);
    expect(framesToAnalyze(4, 1)).toEqual([0, 1, 2, 3]);
    expect(framesToAnalyze(0, 2)).toEqual([]);
  });

  it('refuses a step that is not a whole number of at least 1', () => {
    expect(() => framesToAnalyze(10, 0)).toThrow(RangeError);
    expect(() => framesToAnalyze(10, 1.5)).toThrow(RangeError);
  });

  it('splits work into batches with the remainder last', () => {
    expect(chunk([1, 2, 3, 4, 5], 2)).toEqual([[1, 2], [3, 4], [5]]);
    expect(chunk([], 3)).toEqual([]);
  });
});

describe('time left', () => {
  it('is unknown before one frame has finished', () => {
    const eta = new EtaEstimator(10);
    expect(eta.remainingMs(0)).toBeNull();
    eta.start(0);
    expect(eta.remainingMs(0)).toBeNull();
  });

  it('extrapolates the mean frame time over the frames left', () => {
    // Worked example: frames finish at 100, 200, 300 ms after the start: 100 ms a frame; 7 of 10 left → 700 ms.
    const eta = new EtaEstimator(10);
    eta.start(0);
    [100, 200, 300].forEach((t) => eta.tick(t));
    expect(eta.msPerFrame()).toBe(100);
    expect(eta.remainingMs(3)).toBe(700);
  });

  it('follows a change of pace within its window', () => {
    // Window of 2 frames: stamps 0, 100, 200, 400 keep the last three (100, 200, 400) → 150 ms a frame.
    const eta = new EtaEstimator(10, 2);
    eta.start(0);
    [100, 200, 400].forEach((t) => eta.tick(t));
    expect(eta.msPerFrame()).toBe(150);
    expect(eta.remainingMs(4)).toBe(900);
  });

  it('never goes below zero', () => {
    const eta = new EtaEstimator(2);
    eta.start(0);
    eta.tick(50);
    expect(eta.remainingMs(5)).toBe(0);
  });

  it('words the estimate without false precision', () => {
    expect(formatTimeLeft(null)).toBe('estimating time left…');
    expect(formatTimeLeft(3_000)).toBe('under 5 s left');
    expect(formatTimeLeft(37_000)).toBe('about 35 s left');
    expect(formatTimeLeft(130_000)).toBe('about 2 min 10 s left');
    expect(formatTimeLeft(179_000)).toBe('about 3 min left');
    expect(formatTimeLeft(120_000)).toBe('about 2 min left');
  });

  it('gives a rough duration before a run', () => {
    // 300 frames at the fallback 120 ms (Lightning 80 ms + 40 ms grab) = 36 s → "about 35 s".
    expect(formatRoughDuration(roughDurationMs(300, 'lightning'))).toBe('about 35 s');
    // A measured 250 ms a frame wins over the fallback: 600 × 250 ms = 150 s → "about 3 min" (2.5 rounds up).
    expect(formatRoughDuration(roughDurationMs(600, 'lightning', 250))).toBe('about 3 min');
  });

  it('counts a careful reading’s extra passes until a careful run here was measured', () => {
    expect(carefulPasses(true)).toBe(2);
    expect(carefulPasses(false)).toBe(4);
    // 300 frames × 120 ms × 2 passes = 72 s → "about 1 min"; × 4 = 144 s → "about 2 min".
    expect(formatRoughDuration(roughDurationMs(300, 'lightning', null, carefulPasses(true)))).toBe(
      'about 1 min',
    );
    expect(formatRoughDuration(roughDurationMs(300, 'lightning', null, carefulPasses(false)))).toBe(
      'about 2 min',
    );
    // A careful run's own measured pace already holds its passes.
    expect(roughDurationMs(300, 'lightning', 250, 4)).toBe(75_000);
  });
});
