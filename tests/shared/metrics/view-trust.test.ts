import { describe, expect, it } from 'vitest';
import { BLAZEPOSE33_NAMES, type Keypoint, type View } from '@shared/keypoints';
import { computeFrameMetrics } from '@shared/metrics';
import { FRONT_TRUST_MIN_WIDTH, SIDE_TRUST_MAX_WIDTH, bodyWidthRatio } from '@shared/metrics';
import { phantomTruth } from '../../../fixtures/phantom/render-phantom';

// When the camera is far from the view a clip says (docs/metrics.md, "Trusting a number"), the view's
// numbers give way to a reason. The skier turned about the vertical axis is the phantom's front view
// with every point's distance from the body's middle, across the image, shortened by cos(turn)
// (orthographic projection of a rotation: widths shrink, heights stay).

function phantom(view: View, turnDeg = 0): Keypoint[] {
  const truth = phantomTruth({
    pose: { view, facing: view === 'side' ? 'right' : 'toward', inclination: 12, angulation: 4 },
    width: 1280,
    height: 720,
    skierHeight: 500,
  });
  const centre = (truth.joints.left_hip[0] + truth.joints.right_hip[0]) / 2;
  const k = Math.cos((turnDeg * Math.PI) / 180);
  return BLAZEPOSE33_NAMES.map((name) => ({
    name,
    x: centre + (truth.joints[name][0] - centre) * k,
    y: truth.joints[name][1],
    score: 1,
  }));
}

const measure = (keypoints: Keypoint[], view: View) => computeFrameMetrics({ keypoints, view });

describe('trusting a number only in the view it needs', () => {
  it('keeps front numbers for a skier turned up to 30° from the camera', () => {
    for (const turn of [0, 15, 30]) {
      const m = measure(phantom('front', turn), 'front');
      expect(m.metrics.inclination, `${turn}°`).not.toBeNull();
      expect(m.metrics.standHeight, `${turn}°`).not.toBeNull();
    }
  });

  it('gives a front clip seen from the side a reason instead of numbers', () => {
    const keypoints = phantom('front', 70);
    expect(bodyWidthRatio(keypoints)!).toBeLessThan(FRONT_TRUST_MIN_WIDTH);
    const m = measure(keypoints, 'front');
    for (const key of ['inclination', 'shoulderTilt', 'kneeSeparationRatio', 'standHeight'] as const) {
      expect(m.metrics[key], key).toBeNull();
      expect(m.reasons[key], key).toMatch(/^not trusted: seen from the side/);
    }
    // A number that holds in either view stays.
    expect(m.metrics.legExtension).not.toBeNull();
  });

  it('gives a side clip seen three-quarters on a reason instead of numbers, and keeps a true side view', () => {
    const threeQuarter = phantom('front', 45);
    expect(bodyWidthRatio(threeQuarter)!).toBeGreaterThan(SIDE_TRUST_MAX_WIDTH);
    const m = measure(threeQuarter, 'side');
    for (const key of ['kneeFlexionLeft', 'torsoAngle', 'shinAngleRight'] as const) {
      expect(m.metrics[key], key).toBeNull();
      expect(m.reasons[key], key).toMatch(/^not trusted: seen three-quarters on/);
    }
    const side = measure(phantom('side'), 'side');
    expect(bodyWidthRatio(phantom('side'))!).toBeLessThan(SIDE_TRUST_MAX_WIDTH);
    expect(side.metrics.kneeFlexionRight).not.toBeNull();
    expect(side.reasons.kneeFlexionRight).toBeUndefined();
  });
});
