// Test-time flipping (docs/accuracy.md, "Test-time flipping against the library"): the mirror image's
// read, swapped back and averaged in, is never worse than the library's read on a phantom sample, and
// the averaging itself weights each point by its score.
import { describe, expect, it } from 'vitest';
import { followBox } from '@shared/pose/follow';
import { averageKeypoints } from '@shared/pose/pose-detector';
import { createNodePoseDetector } from '@server/pose/node-detector';
import { renderPhantom } from '../../fixtures/phantom/render-phantom';
import { evaluateFrame, pooledErrors } from './phantom-eval';
import { JOINT_TOLERANCE } from './tolerances';
import { flipRun } from './flip-eval';

describe('test-time flipping', () => {
  it('averages two reads of a point by score, keeping a point only one read has', () => {
    const a = [
      { name: 'left_knee' as const, x: 10, y: 20, score: 0.9 },
      { name: 'nose' as const, x: 5, y: 5, score: 0.5 },
    ];
    const b = [{ name: 'left_knee' as const, x: 20, y: 40, score: 0.3 }];
    expect(averageKeypoints(a, b)).toEqual([
      { name: 'left_knee', x: (10 * 0.9 + 20 * 0.3) / 1.2, y: (20 * 0.9 + 40 * 0.3) / 1.2, score: 0.6 },
      { name: 'nose', x: 5, y: 5, score: 0.5 },
    ]);
  });

  it('is at least as good as the library on a phantom sample (Lightning)', async () => {
    const run = await flipRun('lightning', 96, 2024); // the report's sample
    const raw = pooledErrors(run.raw);
    const flipped = pooledErrors(run.flipped);
    // The report over 96 stills: 0.066 → 0.063 median, 0.175 → 0.170 p90.
    expect(flipped.found).toBe(raw.found);
    expect(flipped.median).toBeLessThanOrEqual(raw.median * 1.02);
    expect(flipped.p90).toBeLessThanOrEqual(raw.p90 * 1.02);
  }, 180_000);

  it('reads a followed region and its mirror, the skier’s sides kept (careful reading of a picked athlete)', async () => {
    // A skier facing the camera leaning hard to one side, so left and right joints are far apart.
    const frame = renderPhantom({
      pose: { view: 'front', facing: 'toward', inclination: 20, angulation: 8, kneeFlexion: 45 },
      width: 960,
      height: 540,
      skierHeight: 240,
      origin: [360, 470],
    });
    const xs = Object.values(frame.truth.joints).map(([x]) => x);
    const ys = Object.values(frame.truth.joints).map(([, y]) => y);
    const outline = {
      x: Math.min(...xs),
      y: Math.min(...ys),
      width: Math.max(...xs) - Math.min(...xs),
      height: Math.max(...ys) - Math.min(...ys),
    };
    const region = followBox(outline, frame);
    const detector = await createNodePoseDetector('lightning');
    try {
      const image = { data: frame.rgba, width: frame.width, height: frame.height, channels: 4 as const };
      const once = await detector.detect(image, { region });
      const careful = await detector.detect(image, { region, flipAverage: true });
      expect(once.timings.passes).toBe(1);
      expect(careful.timings.passes).toBe(2);
      const error = evaluateFrame(careful.keypoints, frame.truth).jointError;
      for (const joint of [
        'left_knee',
        'right_knee',
        'left_ankle',
        'right_ankle',
        'left_hip',
        'right_hip',
      ] as const)
        expect(error[joint]!, joint).toBeLessThan(JOINT_TOLERANCE[joint]);
      // Averaging with an unswapped mirror would pull both knees to the middle of the two.
      const knee = (name: string) => careful.keypoints.find((k) => k.name === name)!;
      const [left, right] = [frame.truth.joints.left_knee, frame.truth.joints.right_knee];
      expect(Math.abs(knee('left_knee').x - left[0])).toBeLessThan(Math.abs(knee('left_knee').x - right[0]));
    } finally {
      detector.dispose();
    }
  }, 60_000);
});
