import type { Keypoint, ReferenceLine } from '../keypoints';
import { referenceFrame } from './reference-frame';

/**
 * The keypoints turned about the image origin so that the snow line `from` takes the direction of
 * `to` (null: the image horizontal). Every metric is measured against the snow line, so turning
 * points and line together changes none: a frame with its own line enters the clip's series as if
 * it had been filmed against the clip's line (docs/metrics.md, "Snow line").
 */
export function alignToLine(
  keypoints: Keypoint[],
  from: ReferenceLine,
  to: ReferenceLine | null,
): Keypoint[] {
  const a = referenceFrame(from).along;
  const b = referenceFrame(to).along;
  // Angle from a to b in the y-up frame; image y points down, so the turn is applied to (x, -y).
  const phi = Math.atan2(a.x * b.y - a.y * b.x, a.x * b.x + a.y * b.y);
  if (phi === 0) return keypoints;
  const cos = Math.cos(phi);
  const sin = Math.sin(phi);
  return keypoints.map((k) => {
    const x = k.x;
    const y = -k.y;
    return { ...k, x: x * cos - y * sin, y: -(x * sin + y * cos) };
  });
}
