import type { KeypointName, View } from '../keypoints';

export type MetricKey =
  | 'kneeFlexionLeft'
  | 'kneeFlexionRight'
  | 'hipFlexionLeft'
  | 'hipFlexionRight'
  | 'shinAngleLeft'
  | 'shinAngleRight'
  | 'torsoAngle'
  | 'shinTorsoMismatch'
  | 'ankleFlexionLeft'
  | 'ankleFlexionRight'
  | 'ankleFlexionDifference'
  | 'foreAftOffset'
  | 'legExtension'
  | 'standHeight'
  | 'stanceWidthRatio'
  | 'kneeSeparationRatio'
  | 'shoulderTilt'
  | 'hipTilt'
  | 'inclination'
  | 'upperBodyInclination'
  | 'angulation'
  | 'kneeAngulation'
  | 'comForeAft';

export type MetricUnit = 'deg' | 'ratio' | 'shin lengths' | 'hip widths';

export interface MetricDefinition {
  key: MetricKey;
  label: string;
  unit: MetricUnit;
  views: View[];
  description: string;
  /** Every keypoint the metric may read (BlazePose foot points are optional where noted). */
  keypoints: KeypointName[];
}

const LEFT_LEG: KeypointName[] = ['left_hip', 'left_knee', 'left_ankle'];
const RIGHT_LEG: KeypointName[] = ['right_hip', 'right_knee', 'right_ankle'];
const HIPS: KeypointName[] = ['left_hip', 'right_hip'];
const SHOULDERS: KeypointName[] = ['left_shoulder', 'right_shoulder'];
const ANKLES: KeypointName[] = ['left_ankle', 'right_ankle'];
const KNEES: KeypointName[] = ['left_knee', 'right_knee'];
const FACING: KeypointName[] = ['nose', 'left_ear', 'right_ear'];
const FEET: KeypointName[] = ['left_heel', 'left_foot_index', 'right_heel', 'right_foot_index'];
const ARMS: KeypointName[] = ['left_elbow', 'right_elbow', 'left_wrist', 'right_wrist'];

function def(
  key: MetricKey,
  label: string,
  unit: MetricUnit,
  views: View[],
  keypoints: KeypointName[],
  description: string,
): MetricDefinition {
  return { key, label, unit, views, description, keypoints: [...new Set(keypoints)] };
}

const SIDE: View[] = ['side'];
const FRONT: View[] = ['front'];

export const METRIC_DEFINITIONS: Record<MetricKey, MetricDefinition> = {
  kneeFlexionLeft: def(
    'kneeFlexionLeft',
    'Knee flexion, left',
    'deg',
    SIDE,
    LEFT_LEG,
    '180° minus the hip–knee–ankle angle; 0 = straight leg, positive = flexed.',
  ),
  kneeFlexionRight: def(
    'kneeFlexionRight',
    'Knee flexion, right',
    'deg',
    SIDE,
    RIGHT_LEG,
    '180° minus the hip–knee–ankle angle; 0 = straight leg, positive = flexed.',
  ),
  hipFlexionLeft: def(
    'hipFlexionLeft',
    'Hip flexion, left',
    'deg',
    SIDE,
    ['left_shoulder', 'left_hip', 'left_knee'],
    '180° minus the shoulder–hip–knee angle; 0 = body and thigh in line.',
  ),
  hipFlexionRight: def(
    'hipFlexionRight',
    'Hip flexion, right',
    'deg',
    SIDE,
    ['right_shoulder', 'right_hip', 'right_knee'],
    '180° minus the shoulder–hip–knee angle; 0 = body and thigh in line.',
  ),
  shinAngleLeft: def(
    'shinAngleLeft',
    'Shin angle, left',
    'deg',
    SIDE,
    ['left_knee', 'left_ankle', ...FACING],
    'Ankle→knee against the snow-line vertical; positive = knee ahead of the ankle.',
  ),
  shinAngleRight: def(
    'shinAngleRight',
    'Shin angle, right',
    'deg',
    SIDE,
    ['right_knee', 'right_ankle', ...FACING],
    'Ankle→knee against the snow-line vertical; positive = knee ahead of the ankle.',
  ),
  torsoAngle: def(
    'torsoAngle',
    'Torso angle',
    'deg',
    SIDE,
    [...HIPS, ...SHOULDERS, ...FACING],
    'Hip midpoint→shoulder midpoint against the snow-line vertical; positive = leaning forward.',
  ),
  shinTorsoMismatch: def(
    'shinTorsoMismatch',
    'Shin–torso mismatch',
    'deg',
    SIDE,
    [...HIPS, ...SHOULDERS, ...KNEES, ...ANKLES, ...FACING],
    'Torso angle minus the mean shin angle; 0 = back parallel to the shins, positive = folded at the waist.',
  ),
  ankleFlexionLeft: def(
    'ankleFlexionLeft',
    'Ankle flexion, left',
    'deg',
    SIDE,
    ['left_knee', 'left_ankle', 'left_heel', 'left_foot_index', ...FACING],
    'Dorsiflexion: 90° minus the shin–foot angle (foot = heel→foot tip, else along the snow line).',
  ),
  ankleFlexionRight: def(
    'ankleFlexionRight',
    'Ankle flexion, right',
    'deg',
    SIDE,
    ['right_knee', 'right_ankle', 'right_heel', 'right_foot_index', ...FACING],
    'Dorsiflexion: 90° minus the shin–foot angle (foot = heel→foot tip, else along the snow line).',
  ),
  ankleFlexionDifference: def(
    'ankleFlexionDifference',
    'Ankle flexion difference',
    'deg',
    SIDE,
    [...KNEES, ...ANKLES, ...FEET, ...FACING],
    'Left minus right ankle flexion.',
  ),
  foreAftOffset: def(
    'foreAftOffset',
    'Fore-aft foot offset',
    'shin lengths',
    SIDE,
    [...KNEES, ...ANKLES, ...FACING],
    'Right ankle to left ankle along the snow line, positive = left foot ahead, in mean shin lengths.',
  ),
  legExtension: def(
    'legExtension',
    'Leg extension',
    'ratio',
    ['front', 'side'],
    [...LEFT_LEG, ...RIGHT_LEG],
    'Hip–ankle distance over thigh plus shin length, mean of the legs; 1 = fully straight.',
  ),
  standHeight: def(
    'standHeight',
    'Standing height',
    'hip widths',
    FRONT,
    [...HIPS, ...ANKLES],
    'Ankle midpoint to hip midpoint over hip width, seen from the front; larger = standing taller.',
  ),
  stanceWidthRatio: def(
    'stanceWidthRatio',
    'Stance width',
    'ratio',
    FRONT,
    [...HIPS, ...ANKLES],
    'Ankle separation along the hip line over hip width.',
  ),
  kneeSeparationRatio: def(
    'kneeSeparationRatio',
    'Knee separation',
    'ratio',
    FRONT,
    [...HIPS, ...KNEES],
    'Knee separation along the hip line over hip width; below 1 = knees pinched.',
  ),
  shoulderTilt: def(
    'shoulderTilt',
    'Shoulder tilt',
    'deg',
    FRONT,
    SHOULDERS,
    'Shoulder line against the snow line; positive = left shoulder higher.',
  ),
  hipTilt: def(
    'hipTilt',
    'Hip tilt',
    'deg',
    FRONT,
    HIPS,
    'Hip line against the snow line; positive = left hip higher.',
  ),
  inclination: def(
    'inclination',
    'Inclination',
    'deg',
    FRONT,
    [...HIPS, ...ANKLES],
    "Ankle midpoint→hip midpoint against the snow-line vertical; positive = toward the skier's left.",
  ),
  upperBodyInclination: def(
    'upperBodyInclination',
    'Upper-body inclination',
    'deg',
    FRONT,
    [...HIPS, ...SHOULDERS],
    "Hip midpoint→shoulder midpoint against the snow-line vertical; positive = toward the skier's left.",
  ),
  angulation: def(
    'angulation',
    'Angulation',
    'deg',
    FRONT,
    [...HIPS, ...ANKLES, ...SHOULDERS],
    'Inclination minus upper-body inclination.',
  ),
  kneeAngulation: def(
    'kneeAngulation',
    'Knee angulation',
    'deg',
    FRONT,
    [...LEFT_LEG, ...RIGHT_LEG],
    'Mean shin inclination minus mean thigh inclination.',
  ),
  comForeAft: def(
    'comForeAft',
    'Centre of mass fore-aft',
    'shin lengths',
    SIDE,
    [...FACING, ...SHOULDERS, ...ARMS, ...LEFT_LEG, ...RIGHT_LEG, ...FEET],
    'Whole-body centre of mass (de Leva 1996 segment table) ahead of the ankle midpoint or mid-foot; negative = back.',
  ),
};

/** In the order of the docs/metrics.md table. */
export const METRIC_KEYS: readonly MetricKey[] = Object.keys(METRIC_DEFINITIONS) as MetricKey[];

export function isMetricKey(key: string): key is MetricKey {
  return Object.prototype.hasOwnProperty.call(METRIC_DEFINITIONS, key);
}
