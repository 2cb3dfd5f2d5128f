// Keypoint names and the frame input every measurement starts from.
// Coordinates are image pixels, x to the right, y down (docs/metrics.md "Frames of reference").

export const COCO17_NAMES = [
  'nose',
  'left_eye',
  'right_eye',
  'left_ear',
  'right_ear',
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

/** BlazePose GHUM 33-point order, as @tensorflow-models/pose-detection names it. */
export const BLAZEPOSE33_NAMES = [
  'nose',
  'left_eye_inner',
  'left_eye',
  'left_eye_outer',
  'right_eye_inner',
  'right_eye',
  'right_eye_outer',
  'left_ear',
  'right_ear',
  'mouth_left',
  'mouth_right',
  'left_shoulder',
  'right_shoulder',
  'left_elbow',
  'right_elbow',
  'left_wrist',
  'right_wrist',
  'left_pinky',
  'right_pinky',
  'left_index',
  'right_index',
  'left_thumb',
  'right_thumb',
  'left_hip',
  'right_hip',
  'left_knee',
  'right_knee',
  'left_ankle',
  'right_ankle',
  'left_heel',
  'right_heel',
  'left_foot_index',
  'right_foot_index',
] as const;

export type Coco17Name = (typeof COCO17_NAMES)[number];
export type KeypointName = (typeof BLAZEPOSE33_NAMES)[number];

export const KEYPOINT_NAMES: ReadonlySet<string> = new Set<string>(BLAZEPOSE33_NAMES);

export function isKeypointName(name: string): name is KeypointName {
  return KEYPOINT_NAMES.has(name);
}

/** One detected point in image pixels (y down). `score` is the model's confidence, 0..1. */
export interface Keypoint {
  name: KeypointName;
  x: number;
  y: number;
  score: number;
}

export type View = 'front' | 'side';

/**
 * Which way a front-view skier faces: toward the camera (filmed from below, the usual) or away from it
 * (filmed from behind, where the models swap left and right; docs/metrics.md "Filmed from behind").
 */
export type SkierFacing = 'toward' | 'away';
export const SKIER_FACINGS: readonly SkierFacing[] = ['toward', 'away'];

/** Where the coach pointed at the athlete: a frame and a point in its pixels (y down). */
export interface AthletePick {
  frameIndex: number;
  x: number;
  y: number;
}
export const VIEWS: readonly View[] = ['front', 'side'];

export type PoseModelName = 'lightning' | 'thunder' | 'blazepose';
export const POSE_MODELS: readonly PoseModelName[] = ['lightning', 'thunder', 'blazepose'];

/** Two image points (pixels, y down) along the snow surface. */
export type ReferenceLine = [[number, number], [number, number]];

/** Default confidence floor below which a keypoint counts as missing (docs/metrics.md). */
export const DEFAULT_CONFIDENCE_FLOOR = 0.3;

export interface FrameInput {
  keypoints: Keypoint[];
  view: View;
  /** Snow line; null or absent means the image horizontal. */
  referenceLine?: ReferenceLine | null;
  width?: number;
  height?: number;
  confidenceFloor?: number;
}
