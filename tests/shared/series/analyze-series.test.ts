import { describe, expect, it } from 'vitest';
import { computeFrameMetrics } from '@shared/metrics';
import {
  analyzeSeries,
  fillGaps,
  frameStep,
  segmentTurns,
  SeriesInputError,
  stretchGapFrames,
} from '@shared/series';
import { toKeypoints } from '../figures';
import { clip, frontPose } from './synthetic-clip';

// Inclination 20°·sin(2π(t + 250 ms)/2000 ms): zero crossings at 750, 1750 and 2750 ms, peaks of
// +20° (left turns) and −20° (right turns) in between. At 25 fps a frame is 40 ms, so the
// crossings fall at frames 18.75, 43.75, 68.75 (nearest frames 19, 44, 69) and the peaks, at 250,
// 1250, 2250 and 3250 ms, at frames 6.25, 31.25, 56.25, 81.25 (frames 6, 31, 56, 81).
const FPS = 25;
const FRAMES = 88; // 0 … 3480 ms
const incl = (t: number) => 20 * Math.sin((2 * Math.PI * (t + 250)) / 2000);
const CROSSINGS_MS = [750, 1750, 2750];
const nearTransition = (t: number) => CROSSINGS_MS.some((c) => Math.abs(t - c) <= 80);

const frames = clip(FRAMES, FPS, (t) => ({
  inclinationDeg: incl(t),
  // Within 80 ms of each transition the skier stands 10 % taller (4.4 against 4.0 hip widths): a
  // known rise of 0.10 (docs/metrics.md, transition rise).
  legExtension: nearTransition(t) ? 0.95 : 0.85,
  standHeight: nearTransition(t) ? 4.4 : 4.0,
  // Inside shoulder 5° low at the apex: tilt = −0.25 × inclination.
  shoulderTiltDeg: -0.25 * incl(t),
}));

describe('the synthetic skier', () => {
  it('measures what it was built with', () => {
    const m = computeFrameMetrics({
      keypoints: toKeypoints(frontPose({ inclinationDeg: 12, legExtension: 0.9, shoulderTiltDeg: -3 })),
      view: 'front',
    }).metrics;
    expect(m.inclination).toBeCloseTo(12, 9);
    expect(m.legExtension).toBeCloseTo(0.9, 9);
    expect(m.shoulderTilt).toBeCloseTo(-3, 9);
    expect(m.stanceWidthRatio).toBeCloseTo(1.5, 9);
  });
});

describe('turn segmentation from inclination zero crossings', () => {
  const result = analyzeSeries(frames, { view: 'front', fps: FPS, filter: { kind: 'none' } });

  it('finds the known transitions', () => {
    expect(result.transitions.map((t) => t.frameIndex)).toEqual([19, 44, 69]);
    result.transitions.forEach((t, i) => expect(Math.abs(t.timeMs - CROSSINGS_MS[i])).toBeLessThan(0.5));
  });

  it('finds the known turns, directions, apexes and durations', () => {
    expect(result.turns.map((t) => [t.direction, t.startFrame, t.apexFrame, t.endFrame, t.complete])).toEqual(
      [
        ['left', 0, 6, 19, false],
        ['right', 19, 31, 44, true],
        ['left', 44, 56, 69, true],
        ['right', 69, 81, 87, false],
      ],
    );
    const [, right, left] = result.turns;
    expect(right.durationMs).toBeCloseTo(1000, 0);
    expect(right.insideSide).toBe('right');
    expect(left.insideSide).toBe('left');
    expect(right.apexValues.inclination).toBeCloseTo(incl(31 * 40), 6);
    expect(left.apexValues.inclination).toBeCloseTo(incl(56 * 40), 6);
  });

  it('gives the known transition rise and inside shoulder drop', () => {
    const [first, right, left, last] = result.turns;
    for (const t of [first, right, left]) expect(t.transitionRise).toBeCloseTo(0.1, 9);
    expect(last.transitionRise).toBeNull(); // the clip ends before the next transition
    // Inside shoulder lower by 0.25 × |apex inclination| in both directions.
    expect(right.insideShoulderDrop).toBeCloseTo(0.25 * Math.abs(incl(31 * 40)), 6);
    expect(left.insideShoulderDrop).toBeCloseTo(0.25 * Math.abs(incl(56 * 40)), 6);
    // Foot lead needs the side view's fore-aft offset, which a front view cannot measure.
    expect(left.insideFootLead).toBeNull();
  });

  it('keeps the transitions where they are after zero-lag smoothing', () => {
    const smoothed = analyzeSeries(frames, { view: 'front', fps: FPS });
    expect(smoothed.filter.name).toBe('butterworth-zero-lag');
    expect(smoothed.transitions.map((t) => t.frameIndex)).toEqual([19, 44, 69]);
    smoothed.transitions.forEach((t, i) => expect(Math.abs(t.timeMs - CROSSINGS_MS[i])).toBeLessThan(2));
  });

  it('summarises each metric over the clip and per turn direction', () => {
    expect(result.summary.stanceWidthRatio).toMatchObject({ count: FRAMES });
    expect(result.summary.stanceWidthRatio.median).toBeCloseTo(1.5, 9);
    expect(result.summary.legExtension.min).toBeCloseTo(0.85, 9);
    expect(result.summary.legExtension.max).toBeCloseTo(0.95, 9);
    expect(result.summary.legExtension.median).toBeCloseTo(0.85, 9);
    expect(result.summary.inclination.max!).toBeCloseTo(20, 1);
    expect(result.summary.kneeFlexionLeft).toEqual({ median: null, min: null, max: null, count: 0 });
    const byDirection = result.summary.byDirection!;
    expect(byDirection.left.inclination.median!).toBeGreaterThan(10);
    expect(byDirection.right.inclination.median!).toBeLessThan(-10);
    expect(byDirection.left.inclination.count + byDirection.right.inclination.count).toBe(FRAMES);
  });

  it('ignores jitter around zero that never reaches the turn threshold', () => {
    const jitter = segmentTurns([5, 1, -1, 1, -1, 1, 6, -4, -8, -2], [0, 1, 2, 3, 4, 5, 6, 7, 8, 9], 3);
    // Only the swing from +6 to −4 reaches 3° on the other side: one transition, 6/10 of the way
    // from sample 6 to 7, filed under sample 7 (−4 is nearer zero than +6).
    expect(jitter.transitions).toEqual([{ index: 7, timeMs: 6 + 6 / 10 }]);
    expect(jitter.turns.map((t) => t.direction)).toEqual([1, -1]);
  });

  it('has no turns in a side view', () => {
    const side = analyzeSeries(frames.slice(0, 5), { view: 'side', fps: FPS });
    expect(side.turns).toEqual([]);
    expect(side.transitions).toEqual([]);
  });
});

describe('gap filling', () => {
  it('interpolates dropouts of up to 3 frames linearly and leaves longer ones', () => {
    expect(fillGaps([0, 9, 9, 3], [true, false, false, true], 3).values).toEqual([0, 1, 2, 3]);
    const long = fillGaps([0, 9, 9, 9, 9, 5], [true, false, false, false, false, true], 3);
    expect(long.valid).toEqual([true, false, false, false, false, true]);
    expect(long.filled.every((f) => !f)).toBe(true);
    // Nothing to draw between at the ends.
    expect(fillGaps([9, 1, 9], [false, true, false], 3).valid).toEqual([false, true, false]);
  });

  it('marks interpolated frames and measures through short dropouts only', () => {
    const dropped = frames.map((f) => ({
      ...f,
      keypoints: f.keypoints.map((k) =>
        k.name === 'left_knee' &&
        ((f.frameIndex >= 10 && f.frameIndex <= 11) || (f.frameIndex >= 50 && f.frameIndex <= 53))
          ? { ...k, score: 0.1 }
          : k,
      ),
    }));
    const r = analyzeSeries(dropped, { view: 'front', fps: FPS, filter: { kind: 'none' } });
    expect(r.frames[10].interpolated).toBe(true);
    expect(r.frames[10].interpolatedKeypoints).toEqual(['left_knee']);
    expect(r.frames[10].metrics.kneeSeparationRatio).not.toBeNull();
    expect(r.frames[9].interpolated).toBe(false);
    expect(r.frames[51].interpolated).toBe(false);
    expect(r.frames[51].metrics.kneeSeparationRatio).toBeNull();
    expect(r.frames[51].reasons.kneeSeparationRatio).toBe('low confidence: left_knee');
    expect(r.gapFill.maxGapFrames).toBe(3);
    const wider = analyzeSeries(dropped, {
      view: 'front',
      fps: FPS,
      filter: { kind: 'none' },
      maxGapFrames: 4,
    });
    expect(wider.frames[51].interpolated).toBe(true);
  });
});

describe('bad options', () => {
  it('refuses a missing frame rate or a negative gap length with a clear error', () => {
    expect(() => analyzeSeries(frames, { view: 'front', fps: 0 })).toThrow(SeriesInputError);
    expect(() => analyzeSeries(frames, { view: 'front', fps: 25, maxGapFrames: -1 })).toThrow(/maxGapFrames/);
  });

  it('accepts an empty clip', () => {
    const r = analyzeSeries([], { view: 'front', fps: 25 });
    expect(r.frames).toEqual([]);
    expect(r.turns).toEqual([]);
    expect(r.summary.inclination.count).toBe(0);
  });
});

describe('frame step and flag stretches (shared/series/frame-rate)', () => {
  it('finds the analysis step and a quarter-second stretch gap never below it', () => {
    expect(frameStep([{ frameIndex: 0 }, { frameIndex: 3 }, { frameIndex: 6 }])).toBe(3);
    expect(frameStep([{ frameIndex: 4 }])).toBe(1);
    // 25 fps: a quarter second is 6.25 frames, rounded to 6; every 10th frame analysed: 10.
    expect(stretchGapFrames([{ frameIndex: 0 }, { frameIndex: 1 }], 25)).toBe(6);
    expect(stretchGapFrames([{ frameIndex: 0 }, { frameIndex: 10 }], 25)).toBe(10);
  });
});
