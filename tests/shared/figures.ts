// Stick figures for worked examples, written in the y-up measurement frame and turned into image
// keypoints (y down) the way a pose model would report them.
import { BLAZEPOSE33_NAMES, COCO17_NAMES, type Keypoint, type KeypointName } from '@shared/keypoints';

export type Pose = Partial<Record<KeypointName, [number, number]>>;

const S3 = Math.sqrt(3);
const IMAGE_HEIGHT = 400;
const X_OFFSET = 200;

export function toKeypoints(
  pose: Pose,
  score = 0.9,
  scores: Partial<Record<KeypointName, number>> = {},
): Keypoint[] {
  return (Object.entries(pose) as [KeypointName, [number, number]][]).map(([name, [x, y]]) => ({
    name,
    x: x + X_OFFSET,
    y: IMAGE_HEIGHT - y,
    score: scores[name] ?? score,
  }));
}

export const onlyCoco = (pose: Pose): Pose =>
  Object.fromEntries(Object.entries(pose).filter(([n]) => (COCO17_NAMES as readonly string[]).includes(n)));

export const ALL_NAMES = BLAZEPOSE33_NAMES;

/**
 * Side view, facing +x (image right). Left leg on a 3-4-5 triangle: ankle (0,0), knee (30,40),
 * hip (-10,70), so knee→ankle (-30,-40) ⟂ knee→hip (-40,30). Right leg on 30/60/90 lines: shin
 * 40 long at 30° from vertical, thigh 40 long at 120° from +x. Trunk (36,48) from each hip.
 */
export const SIDE_POSE: Pose = {
  nose: [42, 132],
  left_eye: [38, 137],
  right_eye: [38, 137],
  left_ear: [30, 135],
  right_ear: [30, 135],
  left_shoulder: [26, 118],
  right_shoulder: [16, 40 * S3 + 48],
  left_elbow: [36, 88],
  right_elbow: [26, 40 * S3 + 18],
  left_wrist: [56, 78],
  right_wrist: [46, 40 * S3 + 8],
  left_hip: [-10, 70],
  right_hip: [-20, 40 * S3],
  left_knee: [30, 40],
  right_knee: [0, 20 * S3],
  left_ankle: [0, 0],
  right_ankle: [-20, 0],
};

/**
 * BlazePose extras for the side pose. Left foot perpendicular to the left shin (neutral ankle):
 * heel→toe (40,-30) ⟂ shin (30,40). Right foot level: heel→toe (40,0).
 */
export const SIDE_FEET: Pose = {
  left_heel: [-16, 12],
  left_foot_index: [24, -18],
  right_heel: [-30, -5],
  right_foot_index: [10, -5],
};

/**
 * Front view, skier's left on +x. Ankles (15,0) and (-15,0); left shin (30,40) (3-4-5), right
 * shin 40 high at 30°; hips 20 apart along x and tilted 30°: (70, 80+10/√3), (50, 80-10/√3), mid
 * (60,80) so ankle-mid→hip-mid is (60,80) (3-4-5). Shoulder mid (90, 80+30√3): 30° from hip mid;
 * shoulder line (40,-30) from right to left.
 */
export const FRONT_POSE: Pose = {
  nose: [92, 160],
  left_eye: [96, 164],
  right_eye: [88, 164],
  left_ear: [100, 162],
  right_ear: [84, 162],
  left_shoulder: [110, 80 + 30 * S3 - 15],
  right_shoulder: [70, 80 + 30 * S3 + 15],
  left_elbow: [125, 100],
  right_elbow: [55, 120],
  left_wrist: [130, 75],
  right_wrist: [45, 95],
  left_hip: [70, 80 + 10 / S3],
  right_hip: [50, 80 - 10 / S3],
  left_knee: [45, 40],
  right_knee: [-15 + 40 / S3, 40],
  left_ankle: [15, 0],
  right_ankle: [-15, 0],
};

export const FRONT_BLAZEPOSE_EXTRAS: Pose = {
  left_eye_inner: [94, 164],
  left_eye_outer: [98, 164],
  right_eye_inner: [90, 164],
  right_eye_outer: [86, 164],
  mouth_left: [95, 156],
  mouth_right: [89, 156],
  left_pinky: [132, 68],
  right_pinky: [43, 88],
  left_index: [131, 67],
  right_index: [44, 87],
  left_thumb: [128, 70],
  right_thumb: [47, 90],
  left_heel: [17, -4],
  right_heel: [-17, -4],
  left_foot_index: [15, -12],
  right_foot_index: [-15, -12],
};

export const deg = (rad: number) => (rad * 180) / Math.PI;
/** atan2 in degrees. */
export const atan2d = (y: number, x: number) => deg(Math.atan2(y, x));
