import { describe, expect, it } from 'vitest';
import { computeFrameMetrics, METRIC_DEFINITIONS, METRIC_KEYS, type MetricKey } from '@shared/metrics';
import {
  atan2d,
  FRONT_BLAZEPOSE_EXTRAS,
  FRONT_POSE,
  onlyCoco,
  SIDE_FEET,
  SIDE_POSE,
  toKeypoints,
  type Pose,
} from '../figures';

const S3 = Math.sqrt(3);
const ATAN_3_4 = atan2d(3, 4); // 36.8699°, the small angle of a 3-4-5 triangle

const side = (pose: Pose) => computeFrameMetrics({ keypoints: toKeypoints(pose), view: 'side' });
const front = (pose: Pose) => computeFrameMetrics({ keypoints: toKeypoints(pose), view: 'front' });

function expectValues(
  actual: Record<MetricKey, number | null>,
  expected: Partial<Record<MetricKey, number>>,
) {
  for (const [key, value] of Object.entries(expected) as [MetricKey, number][]) {
    expect(actual[key], key).not.toBeNull();
    expect(actual[key]!, key).toBeCloseTo(value, 6);
  }
}

const SIDE_ONLY = METRIC_KEYS.filter((k) => METRIC_DEFINITIONS[k].views.join() === 'side');
const FRONT_ONLY = METRIC_KEYS.filter((k) => METRIC_DEFINITIONS[k].views.join() === 'front');

describe('metric table', () => {
  it('has every docs/metrics.md key, in table order, with units and views', () => {
    expect(METRIC_KEYS).toEqual([
      'kneeFlexionLeft',
      'kneeFlexionRight',
      'hipFlexionLeft',
      'hipFlexionRight',
      'shinAngleLeft',
      'shinAngleRight',
      'torsoAngle',
      'shinTorsoMismatch',
      'ankleFlexionLeft',
      'ankleFlexionRight',
      'ankleFlexionDifference',
      'foreAftOffset',
      'legExtension',
      'standHeight',
      'stanceWidthRatio',
      'kneeSeparationRatio',
      'shoulderTilt',
      'hipTilt',
      'inclination',
      'upperBodyInclination',
      'angulation',
      'kneeAngulation',
      'comForeAft',
    ]);
    expect(METRIC_DEFINITIONS.legExtension.views).toEqual(['front', 'side']);
    expect(METRIC_DEFINITIONS.foreAftOffset.unit).toBe('shin lengths');
    expect(METRIC_DEFINITIONS.stanceWidthRatio.unit).toBe('ratio');
    expect(METRIC_DEFINITIONS.inclination.unit).toBe('deg');
  });
});

describe('side view worked example (COCO-17, facing image right)', () => {
  const m = side(onlyCoco(SIDE_POSE));

  it('detects the facing from the nose ahead of the ears', () => {
    expect(m.facing).toBe('right');
  });

  it('computes every side metric by hand', () => {
    expectValues(m.metrics, {
      // Left: knee→hip (-40,30) · knee→ankle (-30,-40) = 0, so the knee is at 90°: flexion 90.
      kneeFlexionLeft: 90,
      // Right: shin at 240° and thigh at 120° from +x meet at 120°: flexion 60.
      kneeFlexionRight: 60,
      // Left: hip→shoulder (36,48) · hip→knee (40,-30) = 0: flexion 90.
      hipFlexionLeft: 90,
      // Right: hip→shoulder at atan(4/3) = 53.13° above +x, hip→knee at -60°: interior 113.13°.
      hipFlexionRight: 180 - (atan2d(4, 3) + 60),
      // Shin (30,40): 36.87° ahead of vertical; right shin on the 30° line.
      shinAngleLeft: ATAN_3_4,
      shinAngleRight: 30,
      // Shoulder mid − hip mid = (36,48): 36.87° forward.
      torsoAngle: ATAN_3_4,
      shinTorsoMismatch: ATAN_3_4 - (ATAN_3_4 + 30) / 2,
      // No foot points: the foot lies along the snow line, so dorsiflexion equals the shin angle.
      ankleFlexionLeft: ATAN_3_4,
      ankleFlexionRight: 30,
      ankleFlexionDifference: ATAN_3_4 - 30,
      // Left ankle 20 ahead of the right; shins 50 and 40 long.
      foreAftOffset: 20 / 45,
      // Left |(-10,70)| / (50+50); right 40√3 / (40+40).
      legExtension: (Math.hypot(10, 70) / 100 + (40 * S3) / 80) / 2,
    });
    expect(m.notes.ankleFlexionLeft).toBe('foot along reference line');
  });

  it('leaves front-only metrics null with "wrong view"', () => {
    for (const key of FRONT_ONLY) {
      expect(m.metrics[key], key).toBeNull();
      expect(m.reasons[key], key).toBe('wrong view');
    }
  });

  it('reports the lowest score used as the confidence', () => {
    const scored = computeFrameMetrics({
      keypoints: toKeypoints(onlyCoco(SIDE_POSE), 0.9, { left_knee: 0.55 }),
      view: 'side',
    });
    expect(scored.confidence.kneeFlexionLeft).toBe(0.55);
    expect(scored.confidence.kneeFlexionRight).toBe(0.9);
  });
});

describe('side view worked example (BlazePose 33, with heels and foot tips)', () => {
  const m = side({ ...SIDE_POSE, ...SIDE_FEET });

  it('uses the heel→foot-tip line for ankle flexion', () => {
    expectValues(m.metrics, {
      // Left foot (40,-30) ⟂ shin (30,40): neutral, 0.
      ankleFlexionLeft: 0,
      // Right foot (40,0) and shin at 60° from +x: 90 − 60 = 30.
      ankleFlexionRight: 30,
      ankleFlexionDifference: -30,
      // The rest is unchanged by the extra points.
      kneeFlexionLeft: 90,
      kneeFlexionRight: 60,
      foreAftOffset: 20 / 45,
    });
    expect(m.notes.ankleFlexionLeft).toBeUndefined();
  });

  it('falls back to the snow line when a foot point is below the confidence floor', () => {
    const low = computeFrameMetrics({
      keypoints: toKeypoints({ ...SIDE_POSE, ...SIDE_FEET }, 0.9, { left_heel: 0.1 }),
      view: 'side',
    });
    expect(low.metrics.ankleFlexionLeft).toBeCloseTo(ATAN_3_4, 6);
    expect(low.notes.ankleFlexionLeft).toBe('foot along reference line');
  });
});

describe('front view worked example', () => {
  const hipL = FRONT_POSE.left_hip!;
  const hipR = FRONT_POSE.right_hip!;
  const kneeL = FRONT_POSE.left_knee!;
  const kneeR = FRONT_POSE.right_knee!;
  const ankleL = FRONT_POSE.left_ankle!;
  const ankleR = FRONT_POSE.right_ankle!;
  const leg = (h: [number, number], k: [number, number], a: [number, number]) =>
    Math.hypot(h[0] - a[0], h[1] - a[1]) /
    (Math.hypot(h[0] - k[0], h[1] - k[1]) + Math.hypot(k[0] - a[0], k[1] - a[1]));
  const expected: Partial<Record<MetricKey, number>> = {
    // Ankle mid (0,0) → hip mid (60,80): 36.87° toward the left hip's side (+x).
    inclination: ATAN_3_4,
    // Hip mid → shoulder mid (30, 30√3): 30°.
    upperBodyInclination: 30,
    angulation: ATAN_3_4 - 30,
    // Hip line (20, 20/√3) is 30° above the snow line, left side higher.
    hipTilt: 30,
    // Shoulder line right→left (40,-30): the left shoulder is 36.87° lower.
    shoulderTilt: -ATAN_3_4,
    // Ankles (30,0) apart; along the hip line that is 30·cos30; hip width 20/cos30: 30·0.75/20.
    stanceWidthRatio: 1.125,
    // Knees 30 + 40/√3 − ... apart: (45 − (40/√3 − 15)) · 0.75 / 20.
    kneeSeparationRatio: ((45 - (40 / S3 - 15)) * 0.75) / 20,
    // Shins 36.87° and 30° toward +x; thighs knee→hip (25, 45.77) and (41.91, 34.23).
    kneeAngulation:
      (ATAN_3_4 + 30) / 2 -
      (atan2d(hipL[0] - kneeL[0], hipL[1] - kneeL[1]) + atan2d(hipR[0] - kneeR[0], hipR[1] - kneeR[1])) / 2,
    legExtension: (leg(hipL, kneeL, ankleL) + leg(hipR, kneeR, ankleR)) / 2,
  };

  it('computes every front metric by hand (COCO-17)', () => {
    const m = front(onlyCoco(FRONT_POSE));
    expectValues(m.metrics, expected);
    expect(m.facing).toBeNull();
    for (const key of SIDE_ONLY) expect(m.reasons[key], key).toBe('wrong view');
  });

  it('gives the same values with the 33 BlazePose points', () => {
    expectValues(front({ ...FRONT_POSE, ...FRONT_BLAZEPOSE_EXTRAS }).metrics, expected);
  });

  it('measures against a tilted snow line: a snow line rising 30° shifts every lean and tilt by 30°', () => {
    // Line rising 30° toward image right; the hip line is also 30° up, so hip tilt becomes 0.
    const m = computeFrameMetrics({
      keypoints: toKeypoints(FRONT_POSE),
      view: 'front',
      referenceLine: [
        [0, 400],
        [S3 * 100, 300],
      ],
    });
    expect(m.metrics.hipTilt).toBeCloseTo(0, 6);
    expect(m.metrics.shoulderTilt).toBeCloseTo(-ATAN_3_4 - 30, 6);
    // The line's normal leans 30° toward −x, so the lean toward +x (the left side) grows by 30°.
    expect(m.metrics.inclination).toBeCloseTo(ATAN_3_4 + 30, 6);
    expect(m.metrics.upperBodyInclination).toBeCloseTo(60, 6);
    expect(m.metrics.stanceWidthRatio).toBeCloseTo(1.125, 6);
  });
});

describe('null reasons', () => {
  it('names a missing keypoint', () => {
    const pose = onlyCoco(SIDE_POSE);
    delete pose.left_knee;
    const m = side(pose);
    expect(m.metrics.kneeFlexionLeft).toBeNull();
    expect(m.reasons.kneeFlexionLeft).toBe('missing: left_knee');
    // The other leg still measures, and means over legs use the visible one.
    expect(m.metrics.kneeFlexionRight).toBeCloseTo(60, 6);
    expect(m.metrics.legExtension).toBeCloseTo((40 * S3) / 80, 6);
  });

  it('treats a score below the floor (default 0.3) as missing', () => {
    const m = computeFrameMetrics({
      keypoints: toKeypoints(onlyCoco(SIDE_POSE), 0.9, { right_ankle: 0.29 }),
      view: 'side',
    });
    expect(m.reasons.kneeFlexionRight).toBe('low confidence: right_ankle');
    expect(m.reasons.foreAftOffset).toBe('low confidence: right_ankle');
    const lowered = computeFrameMetrics({
      keypoints: toKeypoints(onlyCoco(SIDE_POSE), 0.9, { right_ankle: 0.29 }),
      view: 'side',
      confidenceFloor: 0.2,
    });
    expect(lowered.metrics.kneeFlexionRight).toBeCloseTo(60, 6);
  });

  it('refuses signed side metrics when the facing cannot be told', () => {
    const pose = onlyCoco(SIDE_POSE);
    delete pose.nose;
    const m = side(pose);
    expect(m.facing).toBeNull();
    expect(m.reasons.shinAngleLeft).toBe('facing unknown');
    expect(m.reasons.comForeAft).toBe('facing unknown');
    // Unsigned angles do not need it.
    expect(m.metrics.kneeFlexionLeft).toBeCloseTo(90, 6);
    // A facing given by the caller is used.
    const given = computeFrameMetrics({ keypoints: toKeypoints(pose), view: 'side' }, { facing: 'right' });
    expect(given.metrics.shinAngleLeft).toBeCloseTo(ATAN_3_4, 6);
  });

  it('gives every metric a value or a reason, never both', () => {
    for (const m of [side(SIDE_POSE), front(FRONT_POSE), side({}), front({})]) {
      for (const key of METRIC_KEYS) {
        expect(m.metrics[key] === null, key).toBe(m.reasons[key] !== undefined);
      }
    }
  });

  it('treats a non-finite coordinate as unusable', () => {
    const keypoints = toKeypoints(onlyCoco(SIDE_POSE)).map((k) =>
      k.name === 'left_hip' ? { ...k, x: Number.NaN } : k,
    );
    const m = computeFrameMetrics({ keypoints, view: 'side' });
    expect(m.reasons.kneeFlexionLeft).toBe('invalid: left_hip');
  });
});
