import type { Keypoint, KeypointName, PoseModelName, ReferenceLine, SkierFacing, View } from '../keypoints';
import { distance, dot, midpoint, mean, norm, referenceFrame, sub, type Vec2 } from '../geometry';
import { PosePoints } from './pose-points';

export type Facing = 'left' | 'right';

/**
 * Shoulder and hip width over torso length above which a frame looks like a front view. A
 * front-on skier's shoulders are roughly 0.8 torso lengths wide and hips 0.6; in a true side view
 * both project to nearly nothing (common practice, not a published figure).
 */
export const FRONT_WIDTH_THRESHOLD = 0.35;

/**
 * Below this body width (torso lengths) a front-view number is not trusted: the camera is more than
 * about 48° off the skier's front (the phantom and MoveNet read 0.52 to 0.61 front-on, and width
 * shrinks with the cosine of the turn: 0.57 × cos 48° ≈ 0.38). docs/metrics.md, "Trusting a number".
 */
export const FRONT_TRUST_MIN_WIDTH = 0.38;
/**
 * Above this body width a side-view number is not trusted: the camera is more than about 26° off the
 * skier's side (0.57 × cos 64° ≈ 0.25); a three-quarter view reads about 0.40.
 */
export const SIDE_TRUST_MAX_WIDTH = 0.25;

/** Mean of shoulder and hip width over torso length; null when a point is missing or the torso has no length. */
export function bodyWidthRatio(keypoints: Keypoint[] | PosePoints): number | null {
  const p = keypoints instanceof PosePoints ? keypoints : new PosePoints(keypoints);
  const pt = (n: KeypointName): Vec2 => p.record(n).point;
  const pairs: [KeypointName, KeypointName][] = [
    ['left_shoulder', 'right_shoulder'],
    ['left_hip', 'right_hip'],
  ];
  if (!pairs.every(([l, r]) => p.has(l) && p.has(r))) return null;
  const shoulderMid = midpoint(pt('left_shoulder'), pt('right_shoulder'));
  const hipMid = midpoint(pt('left_hip'), pt('right_hip'));
  const torso = distance(shoulderMid, hipMid);
  if (torso === 0) return null;
  return mean(pairs.map(([l, r]) => ({ x: distance(pt(l), pt(r)), y: 0 })))!.x / torso;
}

/**
 * Why this frame's numbers of the clip's view should not be trusted, or null when the camera sees the
 * skier as that view needs (or the widths cannot be measured, which other reasons already cover).
 */
export function viewDistrust(points: Keypoint[] | PosePoints, view: View): string | null {
  const ratio = bodyWidthRatio(points);
  if (ratio === null) return null;
  if (view === 'front' && ratio < FRONT_TRUST_MIN_WIDTH)
    return `not trusted: seen from the side (body ${ratio.toFixed(2)} torso lengths wide, a front view needs ${FRONT_TRUST_MIN_WIDTH})`;
  if (view === 'side' && ratio > SIDE_TRUST_MAX_WIDTH)
    return `not trusted: seen three-quarters on (body ${ratio.toFixed(2)} torso lengths wide, a side view needs at most ${SIDE_TRUST_MAX_WIDTH})`;
  return null;
}

/** Suggests front or side view from body widths; confidence 0 means "could not tell". */
export function suggestView(keypoints: Keypoint[]): { view: View; confidence: number } {
  const ratio = bodyWidthRatio(keypoints);
  if (ratio === null) return { view: 'front', confidence: 0 };
  const confidence = Math.min(1, Math.abs(ratio - FRONT_WIDTH_THRESHOLD) / FRONT_WIDTH_THRESHOLD);
  return { view: ratio >= FRONT_WIDTH_THRESHOLD ? 'front' : 'side', confidence };
}

/**
 * Which way the skier faces in a side view, as an image direction along the snow line: the nose
 * ahead of the ears and, with BlazePose, foot tips ahead of heels. Confidence is the mean cosine
 * of those cues with the line (1 = all point straight along it); null when there is no cue.
 */
/** Smallest mean cue (cosine against the snow line), and smallest cue length as a share of the
 * figure's size, that still count as a facing direction. */
const MIN_FACING_CUE = 0.01;

export function detectFacing(
  keypoints: Keypoint[],
  referenceLine?: ReferenceLine | null,
): { facing: Facing; confidence: number } | null {
  const p = new PosePoints(keypoints);
  const frame = referenceFrame(referenceLine);
  // A cue is a direction; points that (almost) coincide give a direction made of noise, so cues
  // shorter than a small share of the figure's size are left out (relative, so scale does not matter).
  const present = keypoints.filter((k) => p.has(k.name)).map((k) => p.record(k.name).point);
  const xs = present.map((q) => q.x);
  const ys = present.map((q) => q.y);
  const figureSize = present.length
    ? Math.hypot(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys))
    : 0;
  const cues: number[] = [];
  const cue = (from: Vec2, to: Vec2) => {
    const d = sub(to, from);
    const n = norm(d);
    if (n > MIN_FACING_CUE * figureSize && n > 0) cues.push(dot(d, frame.along) / n);
  };
  const ears = (['left_ear', 'right_ear'] as const).filter((n) => p.has(n)).map((n) => p.record(n).point);
  if (p.has('nose') && ears.length > 0) cue(mean(ears)!, p.record('nose').point);
  for (const side of ['left', 'right'] as const) {
    const heel = `${side}_heel` as const;
    const toe = `${side}_foot_index` as const;
    if (p.has(heel) && p.has(toe)) cue(p.record(heel).point, p.record(toe).point);
  }
  if (cues.length === 0) return null;
  const combined = cues.reduce((a, b) => a + b, 0) / cues.length;
  // Nose straight above the ears (or feet pointing at the camera) says nothing about facing; a dead
  // band also keeps rounding noise from deciding a mirrored image differently.
  if (Math.abs(combined) < MIN_FACING_CUE) return null;
  return { facing: combined > 0 ? 'right' : 'left', confidence: Math.abs(combined) };
}

/**
 * A clip whose median face score (mean of nose and eye scores, over frames where the body was found)
 * is below this was likely filmed from behind. MoveNet on the phantom: Lightning 0.42 to 0.60 from
 * behind against 0.53 to 0.86 from the front (medians 0.52 and 0.75); Thunder 0.38 to 0.68 against
 * 0.71 to 0.88 (medians 0.56 and 0.80). docs/metrics.md, "Filmed from behind".
 */
export const FACING_AWAY_BELOW = 0.65;
/** Fewer frames than this with a body found give no suggestion. */
const FACING_MIN_FRAMES = 5;

/**
 * Whether a front-view clip's skier seems to face the camera or away from it, from its raw detections:
 * the models put a face on a skier seen from behind too, but score it lower. Shoulder order cannot
 * tell (the models label every figure as if it faced the camera; docs/accuracy.md), and BlazePose
 * scores every face point 1 front or back, so it gives no suggestion. A suggestion for the coach to
 * confirm, never applied by itself.
 */
export function suggestFacing(
  frames: readonly (readonly Keypoint[])[],
  model: PoseModelName,
): { facing: SkierFacing; faceScore: number; frames: number } | null {
  if (model === 'blazepose') return null;
  const faces: number[] = [];
  for (const keypoints of frames) {
    const score = (n: KeypointName) => keypoints.find((k) => k.name === n)?.score ?? 0;
    const body = (['left_shoulder', 'right_shoulder', 'left_hip', 'right_hip'] as const).every(
      (n) => score(n) >= 0.3,
    );
    if (body) faces.push((score('nose') + score('left_eye') + score('right_eye')) / 3);
  }
  if (faces.length < FACING_MIN_FRAMES) return null;
  faces.sort((a, b) => a - b);
  const mid = faces.length >> 1;
  const faceScore = faces.length % 2 ? faces[mid] : (faces[mid - 1] + faces[mid]) / 2;
  return { facing: faceScore < FACING_AWAY_BELOW ? 'away' : 'toward', faceScore, frames: faces.length };
}
