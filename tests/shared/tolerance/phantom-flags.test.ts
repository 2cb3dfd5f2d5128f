import { describe, expect, it } from 'vitest';
import { BLAZEPOSE33_NAMES, type Keypoint } from '@shared/keypoints';
import { computeFrameMetrics } from '@shared/metrics';
import { analyzeSeries } from '@shared/series';
import { groupFlags, type ToleranceBand } from '@shared/tolerance';
import { frontTurnsClip } from '../../../fixtures/phantom/phantom-clip';
import { phantomTruth } from '../../../fixtures/phantom/render-phantom';

// The synthetic "phantom" skier (fixtures/phantom), whose true angles are known by construction: four
// linked turns toward the camera, knees about hip width (0.92 to 1.04) except in the middle of two
// turns, where they pinch to 0.6 hip widths: one known stretch outside the 0.8 to 1.3 knee band
// (docs/metrics.md, common practice) in each of those two turns.
const PINCHED = 0.6;

describe('flags on the phantom skier', () => {
  it('a pinched-knee stretch in two turns gives exactly two knee flags, one in each turn', () => {
    const clip = frontTurnsClip({ turns: 4, dropShoulderIn: 99, riseAt: 99 });
    const pinchedTurns = [clip.events.turns[1], clip.events.turns[3]];
    const inStretch = (i: number) => pinchedTurns.some((t) => i >= t.from + 4 && i <= t.to - 4);
    const specs = clip.frames.map((spec, i) =>
      inStretch(i) ? { ...spec, pose: { ...spec.pose, kneeSeparation: PINCHED } } : spec,
    );
    const truths = specs.map((spec) => phantomTruth(spec));
    const frames = truths.map((truth, i) => ({
      frameIndex: i,
      timeMs: (i * 1000) / clip.fps,
      keypoints: BLAZEPOSE33_NAMES.map((name): Keypoint => ({
        name,
        x: truth.joints[name][0],
        y: truth.joints[name][1],
        score: 1,
      })),
    }));
    const referenceLine = truths[0].referenceLine;
    const series = analyzeSeries(frames, { view: 'front', fps: clip.fps, referenceLine });
    // Stored frames carry the unsmoothed metrics of each frame, as the server keeps them.
    const measured = frames.map((f) => ({
      frameIndex: f.frameIndex,
      metrics: computeFrameMetrics({ keypoints: f.keypoints, view: 'front', referenceLine }).metrics,
    }));
    const band: ToleranceBand = {
      metric: 'kneeSeparationRatio',
      ageGroup: 'U14',
      min: 0.8,
      max: 1.3,
      target: 1,
      source: 'common practice',
    };
    const flags = groupFlags(measured, series.turns, [band], { maxGapFrames: 6 });

    expect(flags).toHaveLength(2);
    for (const [k, event] of pinchedTurns.entries()) {
      const flag = flags[k];
      const mid = Math.round((event.from + event.to) / 2);
      const turn = series.turns.find((t) => t.startFrame <= mid && mid < t.endFrame)!;
      expect(flag.turnIndex).toBe(turn.index);
      expect(flag.groupKey).toBe(`t${turn.index}`);
      expect(flag.firstFrame).toBe(event.from + 4);
      expect(flag.lastFrame).toBe(event.to - 4);
      expect(flag.frameCount).toBe(event.to - event.from - 7);
      expect(flag.value).toBeCloseTo(PINCHED, 6);
      expect(flag.distance).toBeCloseTo(0.8 - PINCHED, 6);
      expect(flag.side).toBe('below');
    }
  });
});
