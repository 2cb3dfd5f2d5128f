import { cross, dot, norm, sub } from './vector';
import { toDegrees, radians, type Degrees, type Vec2 } from './types';

/** Unsigned angle between two vectors, 0..180 degrees; null if either has zero length. */
export function angleBetween(a: Vec2, b: Vec2): Degrees | null {
  if (norm(a) === 0 || norm(b) === 0) return null;
  return toDegrees(radians(Math.atan2(Math.abs(cross(a, b)), dot(a, b))));
}

/** Interior angle at `vertex` of the path a-vertex-c, 0..180 degrees (180 = straight). */
export function interiorAngle(a: Vec2, vertex: Vec2, c: Vec2): Degrees | null {
  return angleBetween(sub(a, vertex), sub(c, vertex));
}

/** Signed angle from a to b, -180..180 degrees, counter-clockwise positive (y-up frame). */
export function signedAngle(a: Vec2, b: Vec2): Degrees | null {
  if (norm(a) === 0 || norm(b) === 0) return null;
  return toDegrees(radians(Math.atan2(cross(a, b), dot(a, b))));
}

/**
 * Segment angle in Winter's convention: direction of the vector from the distal to the proximal
 * point, counter-clockwise from +x, in 0..360 degrees.
 */
export function segmentAngle(distal: Vec2, proximal: Vec2): Degrees | null {
  const d = sub(proximal, distal);
  if (norm(d) === 0) return null;
  const a = toDegrees(radians(Math.atan2(d.y, d.x)));
  return (a < 0 ? a + 360 : a) as Degrees;
}
