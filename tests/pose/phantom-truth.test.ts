// The phantom's analytic truth against the project's metrics module on the exact phantom joints: two
// independent computations of every docs/metrics.md definition that must agree.
import { describe, expect, it } from 'vitest';
import { BLAZEPOSE33_NAMES, type Keypoint, type KeypointName } from '@shared/keypoints';
import { computeFrameMetrics, METRIC_KEYS } from '@shared/metrics';
import { buildSkeleton, BODY } from '../../fixtures/phantom/phantom-pose';
import { truthMetrics } from '../../fixtures/phantom/phantom-truth';
import { phantomSet } from '../../fixtures/phantom/phantom-set';
import { phantomTruth, type PhantomTruth } from '../../fixtures/phantom/render-phantom';
import { frontTurnsClip, sideRunClip } from '../../fixtures/phantom/phantom-clip';

function exactKeypoints(truth: PhantomTruth): Keypoint[] {
  return BLAZEPOSE33_NAMES.map((name: KeypointName) => ({
    name,
    x: truth.joints[name][0],
    y: truth.joints[name][1],
    score: 1,
  }));
}

function metricsOn(truth: PhantomTruth) {
  return computeFrameMetrics({
    keypoints: exactKeypoints(truth),
    view: truth.view,
    referenceLine: truth.referenceLine,
    width: truth.width,
    height: truth.height,
  }).metrics;
}

const specs = [
  ...phantomSet({ count: 120, seed: 99 }),
  ...frontTurnsClip().frames.filter((_, i) => i % 7 === 0),
  ...sideRunClip().frames.filter((_, i) => i % 7 === 0),
];

describe('phantom truth', () => {
  it('is reproduced by shared/metrics on the exact joints, for every metric and pose', () => {
    for (const spec of specs) {
      const truth = phantomTruth(spec);
      const got = metricsOn(truth);
      for (const key of METRIC_KEYS) {
        const want = truth.metrics[key];
        if (want === null) {
          expect(got[key], `${key} is for the other view`).toBeNull();
          continue;
        }
        // The metrics module estimates the centre of mass from keypoints only (head at the ear
        // midpoint, hands at the wrists); the phantom's truth uses its own vertex, C7 and hand ends.
        const tolerance = key === 'comForeAft' ? 0.1 : 1e-6;
        expect(Math.abs((got[key] as number) - want), `${spec.pose.view} ${key}`).toBeLessThan(tolerance);
      }
    }
  });

  it('matches a side-view stance worked by hand', () => {
    // Right leg: shin 25° forward, knee flexed 60°, so the thigh points 25 - 60 = -35° from the
    // slope normal; torso 30° forward gives hip flexion 30 - (-35) = 65°. Thigh (0.245) and shin
    // (0.246) are nearly equal, so leg extension ≈ cos(60°/2) = 0.866 (isosceles triangle).
    const s = buildSkeleton({
      view: 'side',
      kneeFlexion: 60,
      shinAngle: 25,
      torsoAngle: 30,
      foreAftOffset: 0,
    });
    const m = truthMetrics(s);
    expect(m.kneeFlexionRight).toBeCloseTo(60, 9);
    expect(m.kneeFlexionLeft).toBeCloseTo(60, 9);
    expect(m.hipFlexionRight).toBeCloseTo(65, 9);
    expect(m.shinTorsoMismatch).toBeCloseTo(5, 9);
    expect(m.legExtension).toBeCloseTo(0.866, 3);
    expect(m.ankleFlexionDifference).toBeCloseTo(0, 9);
    expect(m.inclination).toBeNull();
  });

  it('matches a front-view stance worked by hand', () => {
    const s = buildSkeleton({
      view: 'front',
      inclination: 20,
      angulation: 8,
      shoulderTilt: -6,
      hipTilt: -14,
      stanceWidth: 1.2,
      kneeSeparation: 0.9,
    });
    const m = truthMetrics(s);
    expect(m.inclination).toBe(20);
    expect(m.upperBodyInclination).toBe(12);
    expect(m.stanceWidthRatio).toBe(1.2);
    expect(m.kneeFlexionRight).toBeNull();
    // Stance width 1.2 hip widths measured along a hip line tilted 14°: the boots, level on the snow,
    // stand 1.2 × 0.15 / cos 14° = 0.1855 apart.
    const gap = Math.abs(s.joints.left_ankle[0] - s.joints.right_ankle[0]);
    expect(gap).toBeCloseTo((1.2 * BODY.hipWidth) / Math.cos((14 * Math.PI) / 180), 9);
  });

  it('does not change with camera roll, scale, position or facing', () => {
    const pose = {
      view: 'front' as const,
      inclination: -18,
      angulation: -6,
      shoulderTilt: 7,
      hipTilt: 11,
      stanceWidth: 0.9,
      kneeSeparation: 1.1,
    };
    const a = phantomTruth({ pose, width: 640, height: 480, skierHeight: 300 });
    const b = phantomTruth({
      pose: { ...pose, facing: 'away' },
      width: 1280,
      height: 720,
      skierHeight: 500,
      roll: 9,
      origin: [400, 650],
    });
    for (const key of METRIC_KEYS) {
      if (a.metrics[key] === null) expect(b.metrics[key]).toBeNull();
      else expect(b.metrics[key]).toBeCloseTo(a.metrics[key] as number, 9);
    }
    // From behind the skier's left is on the image left.
    expect(b.joints.left_hip[0]).toBeLessThan(b.joints.right_hip[0]);
    expect(a.joints.left_hip[0]).toBeGreaterThan(a.joints.right_hip[0]);
  });

  it('marks the rise and the dropped shoulder in the front clip', () => {
    const clip = frontTurnsClip();
    const truths = clip.frames.map((f) => phantomTruth(f));
    const { riseTransition, droppedShoulderTurn, transitions, turns } = clip.events;
    expect(riseTransition).not.toBeNull();
    // Inclination crosses zero at every listed transition.
    for (const t of transitions) expect(Math.abs(truths[t].metrics.inclination as number)).toBeLessThan(2);
    // The rise: standing tall at one transition. Seen from the front, flexed knees come toward the
    // camera, so hip-knee-ankle stays nearly straight in the image and docs/metrics.md's leg extension
    // hardly changes (about 1 at every frame); the hip height above the snow shows the rise.
    const others = transitions.filter((t) => t !== riseTransition).map((t) => truths[t].hipHeight);
    for (const t of transitions) expect(truths[t].metrics.legExtension as number).toBeGreaterThan(0.97);
    expect(truths[riseTransition!].hipHeight - Math.max(...others)).toBeGreaterThan(0.15);
    // Inside shoulder lower at the apex: shoulder tilt against the lean is far past ±8° only there.
    turns.forEach((turn, i) => {
      const apex = truths[turn.apex].metrics;
      const insideDrop = -Math.sign(apex.inclination as number) * (apex.shoulderTilt as number);
      if (i === droppedShoulderTurn) expect(insideDrop).toBeGreaterThan(8);
      else expect(insideDrop).toBeLessThan(8);
    });
  });
});
