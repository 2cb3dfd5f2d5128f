// Each model over a 48-frame sample of the accuracy report's phantom set (the first 64 specs, less
// those filmed from behind), held to the set limits the report prints (docs/accuracy.md).
import { describe, expect, it } from 'vitest';
import { POSE_MODELS } from '@shared/keypoints';
import { createNodePoseDetector } from '@server/pose/node-detector';
import { phantomSet } from '../../fixtures/phantom/phantom-set';
import { renderPhantom } from '../../fixtures/phantom/render-phantom';
import { swapLeftRight } from '@shared/pose/keypoint-mapping';
import { detectStill, evaluateFrame, pooledErrors, type FrameEvaluation } from './phantom-eval';
import { SET_LIMITS } from './tolerances';

// Same seed and size range as tests/pose/accuracy-report.ts, so the sample is the report's first frames.
const specs = phantomSet({ count: 64, seed: 2024, minSize: 0.2, maxSize: 0.85 }).filter(
  (s) => s.pose.facing !== 'away',
);

describe.each(POSE_MODELS)('%s over the phantom set sample', (model) => {
  it('stays within the set limits', async () => {
    expect(specs).toHaveLength(48);
    const detector = await createNodePoseDetector(model);
    const evals: FrameEvaluation[] = [];
    try {
      for (const spec of specs) {
        const frame = renderPhantom(spec);
        const keypoints = await detectStill(detector, frame);
        evals.push(evaluateFrame(keypoints, frame.truth));
      }
    } finally {
      detector.dispose();
    }
    const pooled = pooledErrors(evals);
    const limit = SET_LIMITS[model];
    expect(pooled.found, 'share of frames with a skier found').toBeGreaterThanOrEqual(limit.minFound);
    expect(pooled.median, 'median joint error / torso length').toBeLessThanOrEqual(limit.medianError);
    expect(pooled.p90, '90th percentile joint error / torso length').toBeLessThanOrEqual(limit.p90Error);
  }, 180_000);
});

describe('frames filmed from behind', () => {
  it('come out with left and right swapped, and swapLeftRight puts them back', async () => {
    const behind = phantomSet({ count: 64, seed: 2024, minSize: 0.2, maxSize: 0.85 }).filter(
      (s) => s.pose.facing === 'away',
    );
    const detector = await createNodePoseDetector('lightning');
    const raw: FrameEvaluation[] = [];
    const swapped: FrameEvaluation[] = [];
    try {
      for (const spec of behind) {
        const frame = renderPhantom(spec);
        const keypoints = await detectStill(detector, frame);
        raw.push(evaluateFrame(keypoints, frame.truth));
        swapped.push(evaluateFrame(swapLeftRight(keypoints), frame.truth));
      }
    } finally {
      detector.dispose();
    }
    // As labelled, the typical joint is on the wrong side of the body: half a torso length or more.
    expect(pooledErrors(raw).median).toBeGreaterThan(0.3);
    // Swapped back, the typical joint is as close as on frames toward the camera.
    expect(pooledErrors(swapped).median).toBeLessThanOrEqual(SET_LIMITS.lightning.medianError);
  }, 180_000);
});
