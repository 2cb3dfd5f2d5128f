import type { FrameInput, KeypointName } from '../keypoints';
import {
  angleBetween,
  angleFromVertical,
  distance,
  dot,
  interiorAngle,
  lerp,
  midpoint,
  normalize,
  norm,
  referenceFrame,
  scale,
  sub,
  tiltFromLine,
  weightedMean,
  type ReferenceFrame,
  type Vec2,
} from '../geometry';
import { METRIC_DEFINITIONS, METRIC_KEYS, type MetricKey } from './definitions';
import { MetricUnavailable, PointReader, PosePoints } from './pose-points';
import { SEGMENT_TABLES, type SegmentTableName } from './segment-table';
import { detectFacing, viewDistrust, type Facing } from './view-detection';

export interface FrameMetrics {
  metrics: Record<MetricKey, number | null>;
  /** Why a metric is null, e.g. 'missing: left_knee', 'low confidence: left_knee', 'wrong view'. */
  reasons: Partial<Record<MetricKey, string>>;
  /** Lowest score among the keypoints a metric used. */
  confidence: Partial<Record<MetricKey, number>>;
  /** Remarks on metrics that have a value, e.g. 'foot along reference line'. */
  notes: Partial<Record<MetricKey, string>>;
  /** Side view: the facing used for signed leans (given or detected); null otherwise. */
  facing: Facing | null;
}

export interface FrameMetricOptions {
  /** Side view facing; detected from head and foot points when absent. */
  facing?: Facing | null;
  segmentTable?: SegmentTableName;
}

type Side = 'left' | 'right';
const SIDES: readonly Side[] = ['left', 'right'];
const name = (side: Side, part: string) => `${side}_${part}` as KeypointName;

interface Context {
  r: PointReader;
  frame: ReferenceFrame;
  /** +1 when the skier faces along the line's direction (image right), -1 against it. */
  facingSign: () => 1 | -1;
  note: (text: string) => void;
  options: FrameMetricOptions;
}

const shinVector = (c: Context, side: Side) => sub(c.r.get(name(side, 'knee')), c.r.get(name(side, 'ankle')));

/** Legs whose three points are all usable. */
function usableLegs(c: Context): Side[] {
  const legs = SIDES.filter((s) => ['hip', 'knee', 'ankle'].every((part) => c.r.has(name(s, part))));
  if (legs.length === 0) {
    const first = SIDES.flatMap((s) => ['hip', 'knee', 'ankle'].map((part) => name(s, part))).find(
      (n) => !c.r.has(n),
    )!;
    throw new MetricUnavailable(c.r.points.problem(first)!);
  }
  return legs;
}

function meanOver<T>(items: readonly T[], f: (item: T) => number): number {
  return items.reduce((sum, item) => sum + f(item), 0) / items.length;
}

function meanShinLength(c: Context, sides: readonly Side[] = SIDES): number {
  const lengths = sides.filter((s) => c.r.has(name(s, 'knee'))).map((s) => norm(shinVector(c, s)));
  if (lengths.length === 0) throw new MetricUnavailable(c.r.points.problem(name(sides[0], 'knee'))!);
  const m = lengths.reduce((a, b) => a + b, 0) / lengths.length;
  if (m === 0) throw new MetricUnavailable('zero shin length');
  return m;
}

function need(value: number | null, reason: string): number {
  if (value === null || !Number.isFinite(value)) throw new MetricUnavailable(reason);
  return value;
}

/** +1 when the skier's left hip lies along the line's direction, -1 when against it. */
function leftSideSign(c: Context): 1 | -1 {
  const along = dot(sub(c.r.get('left_hip'), c.r.get('right_hip')), c.frame.along);
  if (along === 0) throw new MetricUnavailable('hips not separated along the reference line');
  return along > 0 ? 1 : -1;
}

const kneeFlexion = (c: Context, s: Side) =>
  180 -
  need(
    interiorAngle(c.r.get(name(s, 'hip')), c.r.get(name(s, 'knee')), c.r.get(name(s, 'ankle'))),
    'zero-length segment',
  );

const hipFlexion = (c: Context, s: Side) =>
  180 -
  need(
    interiorAngle(c.r.get(name(s, 'shoulder')), c.r.get(name(s, 'hip')), c.r.get(name(s, 'knee'))),
    'zero-length segment',
  );

const shinAngle = (c: Context, s: Side) =>
  need(angleFromVertical(c.frame, shinVector(c, s), c.facingSign()), 'zero-length segment');

function torsoAngle(c: Context): number {
  const v = sub(c.r.either('left_shoulder', 'right_shoulder'), c.r.either('left_hip', 'right_hip'));
  return need(angleFromVertical(c.frame, v, c.facingSign()), 'zero-length segment');
}

function shinTorsoMismatch(c: Context): number {
  const torso = torsoAngle(c);
  const sides = SIDES.filter((s) => c.r.has(name(s, 'knee')) && c.r.has(name(s, 'ankle')));
  if (sides.length === 0) shinAngle(c, 'left'); // throws with the left leg's reason
  return torso - meanOver(sides, (s) => shinAngle(c, s));
}

function ankleFlexion(c: Context, s: Side): number {
  const shin = shinVector(c, s);
  const heel = name(s, 'heel');
  const toe = name(s, 'foot_index');
  let foot: Vec2;
  if (c.r.has(heel) && c.r.has(toe)) {
    foot = sub(c.r.get(toe), c.r.get(heel));
  } else {
    foot = scale(c.frame.along, c.facingSign());
    c.note('foot along reference line');
  }
  return 90 - need(angleBetween(shin, foot), 'zero-length segment');
}

function foreAftOffset(c: Context): number {
  const d = sub(c.r.get('left_ankle'), c.r.get('right_ankle'));
  return (c.facingSign() * dot(d, c.frame.along)) / meanShinLength(c);
}

function legExtension(c: Context): number {
  return meanOver(usableLegs(c), (s) => {
    const hip = c.r.get(name(s, 'hip'));
    const knee = c.r.get(name(s, 'knee'));
    const ankle = c.r.get(name(s, 'ankle'));
    const path = distance(hip, knee) + distance(knee, ankle);
    return need(path > 0 ? distance(hip, ankle) / path : null, 'zero-length segment');
  });
}

/**
 * How tall the skier stands, seen from the front: the ankle-midpoint→hip-midpoint distance (along the
 * leg axis, whatever its lean) over hip width. Flexing the legs shortens it (thighs and shins point at
 * the camera); leaning into the turn turns it in the image plane without changing it; the skier's
 * distance from the camera scales both lengths alike.
 */
function standHeight(c: Context): number {
  const leg = distance(c.r.pair('left_hip', 'right_hip'), c.r.pair('left_ankle', 'right_ankle'));
  const hipWidth = distance(c.r.get('left_hip'), c.r.get('right_hip'));
  return need(hipWidth > 0 ? leg / hipWidth : null, 'hips not separated');
}

function separationRatio(c: Context, part: 'ankle' | 'knee'): number {
  const hipLine = sub(c.r.get('left_hip'), c.r.get('right_hip'));
  const u = normalize(hipLine);
  if (!u) throw new MetricUnavailable('hips not separated');
  const d = sub(c.r.get(name('left', part)), c.r.get(name('right', part)));
  return Math.abs(dot(d, u)) / norm(hipLine);
}

const tilt = (c: Context, part: 'shoulder' | 'hip') =>
  need(
    tiltFromLine(c.frame, sub(c.r.get(name('left', part)), c.r.get(name('right', part)))),
    `${part}s not separated`,
  );

function inclination(c: Context): number {
  const v = sub(c.r.pair('left_hip', 'right_hip'), c.r.pair('left_ankle', 'right_ankle'));
  return need(angleFromVertical(c.frame, v, leftSideSign(c)), 'zero-length segment');
}

function upperBodyInclination(c: Context): number {
  const v = sub(c.r.pair('left_shoulder', 'right_shoulder'), c.r.pair('left_hip', 'right_hip'));
  return need(angleFromVertical(c.frame, v, leftSideSign(c)), 'zero-length segment');
}

function kneeAngulation(c: Context): number {
  const toward = leftSideSign(c);
  const legs = usableLegs(c);
  const lean = (from: Vec2, to: Vec2) =>
    need(angleFromVertical(c.frame, sub(to, from), toward), 'zero-length segment');
  const shin = meanOver(legs, (s) => lean(c.r.get(name(s, 'ankle')), c.r.get(name(s, 'knee'))));
  const thigh = meanOver(legs, (s) => lean(c.r.get(name(s, 'knee')), c.r.get(name(s, 'hip'))));
  return shin - thigh;
}

/**
 * Whole-body centre of mass from the segment table. Hands sit at the wrists and, without foot
 * points, feet at the ankles (COCO-17 has no hand or foot ends); the head+neck mass sits at the
 * ear midpoint (Dempster/Winter put the head+neck CoM at the ear canal).
 */
export function centreOfMass(r: PointReader, table: SegmentTableName = 'de-leva-male'): Vec2 {
  const t = SEGMENT_TABLES[table];
  const parts: { point: Vec2; weight: number }[] = [];
  const seg = (from: Vec2, to: Vec2, p: { mass: number; com: number }) =>
    parts.push({ point: lerp(from, to, p.com), weight: p.mass });
  parts.push({ point: r.either('left_ear', 'right_ear'), weight: t.headNeck.mass });
  seg(r.pair('left_shoulder', 'right_shoulder'), r.pair('left_hip', 'right_hip'), t.trunk);
  for (const s of SIDES) {
    const shoulder = r.get(name(s, 'shoulder'));
    const elbow = r.get(name(s, 'elbow'));
    const wrist = r.get(name(s, 'wrist'));
    const hip = r.get(name(s, 'hip'));
    const knee = r.get(name(s, 'knee'));
    const ankle = r.get(name(s, 'ankle'));
    seg(shoulder, elbow, t.upperArm);
    seg(elbow, wrist, t.forearm);
    parts.push({ point: wrist, weight: t.hand.mass });
    seg(hip, knee, t.thigh);
    seg(knee, ankle, t.shank);
    const heel = name(s, 'heel');
    const toe = name(s, 'foot_index');
    if (r.has(heel) && r.has(toe)) seg(r.get(heel), r.get(toe), t.foot);
    else parts.push({ point: ankle, weight: t.foot.mass });
  }
  return weightedMean(parts)!;
}

function comForeAft(c: Context): number {
  const com = centreOfMass(c.r, c.options.segmentTable);
  const feet = SIDES.every((s) => c.r.has(name(s, 'heel')) && c.r.has(name(s, 'foot_index')));
  const base = feet
    ? midpoint(
        midpoint(c.r.get('left_heel'), c.r.get('left_foot_index')),
        midpoint(c.r.get('right_heel'), c.r.get('right_foot_index')),
      )
    : c.r.pair('left_ankle', 'right_ankle');
  if (!feet) c.note('from ankle midpoint');
  return (c.facingSign() * dot(sub(com, base), c.frame.along)) / meanShinLength(c);
}

const COMPUTE: Record<MetricKey, (c: Context) => number> = {
  kneeFlexionLeft: (c) => kneeFlexion(c, 'left'),
  kneeFlexionRight: (c) => kneeFlexion(c, 'right'),
  hipFlexionLeft: (c) => hipFlexion(c, 'left'),
  hipFlexionRight: (c) => hipFlexion(c, 'right'),
  shinAngleLeft: (c) => shinAngle(c, 'left'),
  shinAngleRight: (c) => shinAngle(c, 'right'),
  torsoAngle,
  shinTorsoMismatch,
  ankleFlexionLeft: (c) => ankleFlexion(c, 'left'),
  ankleFlexionRight: (c) => ankleFlexion(c, 'right'),
  ankleFlexionDifference: (c) => ankleFlexion(c, 'left') - ankleFlexion(c, 'right'),
  foreAftOffset,
  legExtension,
  standHeight,
  stanceWidthRatio: (c) => separationRatio(c, 'ankle'),
  kneeSeparationRatio: (c) => separationRatio(c, 'knee'),
  shoulderTilt: (c) => tilt(c, 'shoulder'),
  hipTilt: (c) => tilt(c, 'hip'),
  inclination,
  upperBodyInclination,
  angulation: (c) => inclination(c) - upperBodyInclination(c),
  kneeAngulation,
  comForeAft,
};

/** Every metric of docs/metrics.md for one frame; null with a reason where it cannot be computed. */
export function computeFrameMetrics(input: FrameInput, options: FrameMetricOptions = {}): FrameMetrics {
  const points = new PosePoints(input.keypoints, input.confidenceFloor);
  const frame = referenceFrame(input.referenceLine);
  let facing: Facing | null = null;
  if (input.view === 'side') {
    facing = options.facing ?? detectFacing(input.keypoints, input.referenceLine)?.facing ?? null;
  }
  const result: FrameMetrics = {
    metrics: {} as Record<MetricKey, number | null>,
    reasons: {},
    confidence: {},
    notes: {},
    facing,
  };
  // A camera far from the view the clip says (a front clip seen from the side, a side clip seen
  // three-quarters on) makes that view's numbers wrong by an unknown amount: no number, the reason.
  const distrust = viewDistrust(points, input.view);
  // One context per frame, its reader and notes renewed per metric (closures made once, not twenty times).
  let notes = new Set<string>();
  const context: Context = {
    r: new PointReader(points),
    frame,
    facingSign: () => {
      if (!facing) throw new MetricUnavailable('facing unknown');
      return facing === 'right' ? 1 : -1;
    },
    note: (text) => notes.add(text),
    options,
  };
  for (const key of METRIC_KEYS) {
    result.metrics[key] = null;
    const views = METRIC_DEFINITIONS[key].views;
    if (!views.includes(input.view)) {
      result.reasons[key] = 'wrong view';
      continue;
    }
    if (distrust && views.length === 1) {
      result.reasons[key] = distrust;
      continue;
    }
    const reader = new PointReader(points);
    context.r = reader;
    notes = new Set<string>();
    try {
      const value = COMPUTE[key](context);
      if (!Number.isFinite(value)) throw new MetricUnavailable('not computable');
      // Normalise -0 so JSON and equality checks see one zero.
      result.metrics[key] = value === 0 ? 0 : value;
      if (Number.isFinite(reader.minScore)) result.confidence[key] = reader.minScore;
      if (notes.size > 0) result.notes[key] = [...notes].join('; ');
    } catch (error) {
      if (!(error instanceof MetricUnavailable)) throw error;
      result.reasons[key] = error.message;
    }
  }
  return result;
}

/** Every metric null with the same reason, e.g. 'no skier found'. */
export function emptyFrameMetrics(reason: string): FrameMetrics {
  const metrics = {} as Record<MetricKey, number | null>;
  const reasons: Partial<Record<MetricKey, string>> = {};
  for (const key of METRIC_KEYS) {
    metrics[key] = null;
    reasons[key] = reason;
  }
  return { metrics, reasons, confidence: {}, notes: {}, facing: null };
}
