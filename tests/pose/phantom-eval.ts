// Comparing detector output with phantom truth; used by the accuracy report and the detector tests,
// so the report's numbers and the tests' thresholds come from one computation.

import type { Keypoint, PoseModelName } from '@shared/keypoints';
import { computeFrameMetrics, type MetricKey } from '@shared/metrics';
import type { DetectOptions, PoseDetector } from '@shared/pose/pose-detector';
import type { PhantomTruth, RenderedPhantom } from '../../fixtures/phantom/render-phantom';

/** The joints every model gives and the metrics depend on. */
export const BODY_JOINTS = [
  'left_shoulder',
  'right_shoulder',
  'left_elbow',
  'right_elbow',
  'left_wrist',
  'right_wrist',
  'left_hip',
  'right_hip',
  'left_knee',
  'right_knee',
  'left_ankle',
  'right_ankle',
] as const;
export type BodyJoint = (typeof BODY_JOINTS)[number];

/** Metrics the tests hold to a tolerance, with the view each applies to. */
export const CHECKED_METRICS: { key: MetricKey; view: 'front' | 'side' }[] = [
  { key: 'kneeFlexionRight', view: 'side' },
  { key: 'kneeFlexionLeft', view: 'side' },
  { key: 'shinAngleRight', view: 'side' },
  { key: 'shinAngleLeft', view: 'side' },
  { key: 'torsoAngle', view: 'side' },
  { key: 'shoulderTilt', view: 'front' },
  { key: 'kneeSeparationRatio', view: 'front' },
  { key: 'stanceWidthRatio', view: 'front' },
  { key: 'inclination', view: 'front' },
];

export interface FrameEvaluation {
  found: boolean;
  /** |detected - true| / torso length, per joint; null when the model did not return the joint. */
  jointError: Partial<Record<BodyJoint, number | null>>;
  metricError: Partial<Record<MetricKey, number | null>>;
  metrics: Record<MetricKey, number | null>;
}

export function evaluateFrame(keypoints: Keypoint[], truth: PhantomTruth): FrameEvaluation {
  const jointError: FrameEvaluation['jointError'] = {};
  for (const joint of BODY_JOINTS) {
    const k = keypoints.find((p) => p.name === joint);
    const t = truth.joints[joint];
    jointError[joint] = k ? Math.hypot(k.x - t[0], k.y - t[1]) / truth.torsoLength : null;
  }
  const { metrics } = computeFrameMetrics({
    keypoints,
    view: truth.view,
    referenceLine: truth.referenceLine,
    width: truth.width,
    height: truth.height,
    // Every joint counts: this compares positions, the confidence floor is the app's business.
    confidenceFloor: 0,
  });
  const metricError: FrameEvaluation['metricError'] = {};
  for (const key of Object.keys(truth.metrics) as MetricKey[]) {
    const want = truth.metrics[key];
    const got = metrics[key];
    metricError[key] = want === null || got === null ? null : got - want;
  }
  return { found: keypoints.length > 0, jointError, metricError, metrics };
}

export interface Summary {
  model: PoseModelName;
  frames: number;
  found: number;
  joints: Record<BodyJoint, { median: number; p90: number; max: number }>;
  metrics: Partial<Record<MetricKey, { n: number; medianAbs: number; p90Abs: number; bias: number }>>;
}

export function quantile(values: number[], q: number): number {
  if (values.length === 0) return NaN;
  const s = [...values].sort((a, b) => a - b);
  const pos = (s.length - 1) * q;
  const lo = Math.floor(pos);
  const hi = Math.ceil(pos);
  return s[lo] + (s[hi] - s[lo]) * (pos - lo);
}

export function summarise(model: PoseModelName, evals: FrameEvaluation[]): Summary {
  const joints = {} as Summary['joints'];
  for (const joint of BODY_JOINTS) {
    const v = evals.map((e) => e.jointError[joint]).filter((x): x is number => typeof x === 'number');
    joints[joint] = { median: quantile(v, 0.5), p90: quantile(v, 0.9), max: Math.max(...v) };
  }
  const metrics: Summary['metrics'] = {};
  const keys = new Set(evals.flatMap((e) => Object.keys(e.metricError) as MetricKey[]));
  for (const key of keys) {
    const v = evals.map((e) => e.metricError[key]).filter((x): x is number => typeof x === 'number');
    if (v.length === 0) continue;
    metrics[key] = {
      n: v.length,
      medianAbs: quantile(v.map(Math.abs), 0.5),
      p90Abs: quantile(v.map(Math.abs), 0.9),
      bias: v.reduce((a, b) => a + b, 0) / v.length,
    };
  }
  return { model, frames: evals.length, found: evals.filter((e) => e.found).length, joints, metrics };
}

/** Pooled body-joint errors and found share over frames (the quantities SET_LIMITS bounds). */
export function pooledErrors(evals: FrameEvaluation[]): { median: number; p90: number; found: number } {
  const errors = evals.flatMap((e) => Object.values(e.jointError).filter((v): v is number => v !== null));
  return {
    median: quantile(errors, 0.5),
    p90: quantile(errors, 0.9),
    found: evals.filter((e) => e.found).length / Math.max(1, evals.length),
  };
}

/** One phantom still read as a fresh image (tracking state forgotten first); its keypoints. */
export async function detectStill(
  detector: PoseDetector,
  frame: Pick<RenderedPhantom, 'rgba' | 'width' | 'height'>,
  options?: DetectOptions,
): Promise<Keypoint[]> {
  detector.reset();
  const found = await detector.detect(
    { data: frame.rgba, width: frame.width, height: frame.height, channels: 4 },
    options,
  );
  return found.keypoints;
}
