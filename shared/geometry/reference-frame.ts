import type { ReferenceLine } from '../keypoints';
import { dot, normalize, perpendicular, sub } from './vector';
import { radians, toDegrees, type Degrees, type Vec2 } from './types';

export class GeometryInputError extends Error {
  override name = 'GeometryInputError';
}

/** Image pixels (x right, y down) to the measurement frame (x right, y up). */
export const fromImage = (x: number, y: number): Vec2 => ({ x, y: -y });
export const toImage = (p: Vec2): { x: number; y: number } => ({ x: p.x, y: -p.y });

/**
 * The snow line in the y-up frame: `along` is a unit vector along the line, oriented toward the
 * image right (so a tilted camera keeps "right" meaning right), and `up` is its upward normal.
 */
export interface ReferenceFrame {
  readonly along: Vec2;
  readonly up: Vec2;
}

export const IMAGE_HORIZONTAL: ReferenceFrame = { along: { x: 1, y: 0 }, up: { x: 0, y: 1 } };

/** Builds the frame from two image points; null or undefined gives the image horizontal. */
export function referenceFrame(line: ReferenceLine | null | undefined): ReferenceFrame {
  if (!line) return IMAGE_HORIZONTAL;
  const [[x1, y1], [x2, y2]] = line;
  if (![x1, y1, x2, y2].every(Number.isFinite)) {
    throw new GeometryInputError('reference line: coordinates must be finite numbers');
  }
  const dir = normalize(sub(fromImage(x2, y2), fromImage(x1, y1)));
  if (!dir) throw new GeometryInputError('reference line: the two points coincide');
  // Orient so the normal points up the image; a vertical line keeps the normal pointing right.
  let along = dir;
  if (along.x < 0 || (along.x === 0 && along.y > 0)) along = { x: -along.x, y: -along.y };
  return { along, up: perpendicular(along) };
}

/** Coordinates of v in the reference frame: (component along the line, component along the normal). */
export function project(frame: ReferenceFrame, v: Vec2): { along: number; up: number } {
  return { along: dot(v, frame.along), up: dot(v, frame.up) };
}

/**
 * Signed angle of v from the reference vertical, positive toward `toward` (+1: the line's
 * direction, -1: against it). 0 when v points straight up from the snow line.
 */
export function angleFromVertical(frame: ReferenceFrame, v: Vec2, toward: 1 | -1 = 1): Degrees | null {
  const p = project(frame, v);
  if (p.along === 0 && p.up === 0) return null;
  return toDegrees(radians(Math.atan2(toward * p.along, p.up)));
}

/** Tilt of v against the line itself, positive when v rises: atan2(v·n, |v·t|), -90..90 degrees. */
export function tiltFromLine(frame: ReferenceFrame, v: Vec2): Degrees | null {
  const p = project(frame, v);
  if (p.along === 0 && p.up === 0) return null;
  return toDegrees(radians(Math.atan2(p.up, Math.abs(p.along))));
}

/** Angle of the snow line against the image horizontal, counter-clockwise positive (y up). */
export function lineTilt(frame: ReferenceFrame): Degrees {
  return toDegrees(radians(Math.atan2(frame.along.y, frame.along.x)));
}
