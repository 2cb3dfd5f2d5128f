// A front-view skier built from chosen values, so a clip's metrics are known by construction.
import type { Keypoint } from '@shared/keypoints';
import type { SeriesFrameInput } from '@shared/series';
import { toKeypoints, type Pose } from '../figures';

export interface PoseSpec {
  /** Ankle-mid → hip-mid lean from vertical, degrees, + toward the skier's left (+x). */
  inclinationDeg: number;
  /** Hip–ankle distance over thigh + shin (both legs). */
  legExtension: number;
  /** Shoulder line against the horizontal, + left shoulder higher. */
  shoulderTiltDeg: number;
  /** Ankle-mid → hip-mid distance over hip width (the front view's standing height); default 4. */
  standHeight?: number;
}

const rad = (d: number) => (d * Math.PI) / 180;

export function frontPose({
  inclinationDeg,
  legExtension,
  shoulderTiltDeg,
  standHeight = 4,
}: PoseSpec): Pose {
  const i = rad(inclinationDeg);
  // Hips 20 apart, so the hip midpoint sits standHeight × 20 from the ankle midpoint.
  const leg = standHeight * 20;
  const hipMid: [number, number] = [leg * Math.sin(i), leg * Math.cos(i)];
  const pose: Pose = {
    left_ankle: [15, 0],
    right_ankle: [-15, 0],
    left_hip: [hipMid[0] + 10, hipMid[1]],
    right_hip: [hipMid[0] - 10, hipMid[1]],
  };
  for (const side of ['left', 'right'] as const) {
    const hip = pose[`${side}_hip`]!;
    const ankle = pose[`${side}_ankle`]!;
    // Equal thigh and shin of length L with |hip − ankle| = 2·L·extension: the knee sits off the
    // hip–ankle line by √(L² − (d/2)²), outward.
    const d = Math.hypot(hip[0] - ankle[0], hip[1] - ankle[1]);
    const L = d / (2 * legExtension);
    const h = Math.sqrt(Math.max(0, L * L - (d / 2) ** 2));
    const ux = (hip[0] - ankle[0]) / d;
    const uy = (hip[1] - ankle[1]) / d;
    const out = side === 'left' ? 1 : -1;
    pose[`${side}_knee`] = [ankle[0] + (ux * d) / 2 + out * uy * h, ankle[1] + (uy * d) / 2 - out * ux * h];
  }
  const t = rad(shoulderTiltDeg);
  const mid: [number, number] = [hipMid[0] + 50 * Math.sin(i), hipMid[1] + 50 * Math.cos(i)];
  pose.left_shoulder = [mid[0] + 20 * Math.cos(t), mid[1] + 20 * Math.sin(t)];
  pose.right_shoulder = [mid[0] - 20 * Math.cos(t), mid[1] - 20 * Math.sin(t)];
  pose.nose = [mid[0], mid[1] + 22];
  pose.left_ear = [mid[0] + 8, mid[1] + 24];
  pose.right_ear = [mid[0] - 8, mid[1] + 24];
  return pose;
}

export function clip(
  count: number,
  fps: number,
  spec: (timeMs: number, frame: number) => PoseSpec,
): SeriesFrameInput[] {
  return Array.from({ length: count }, (_, frame) => {
    const timeMs = (frame * 1000) / fps;
    return {
      frameIndex: frame,
      timeMs,
      keypoints: toKeypoints(frontPose(spec(timeMs, frame))) as Keypoint[],
    };
  });
}
