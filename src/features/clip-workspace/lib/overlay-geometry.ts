// Geometry of the overlays in screen space (x right, y down; canvas angles turn clockwise on screen).
// Pure functions: the canvas code only strokes what these return.

import type { ReferenceLine } from '@shared/keypoints';
import { referenceFrame } from '@shared/geometry';
import type { Point } from './stage-transform';

const len = (v: Point) => Math.hypot(v[0], v[1]);
const sub = (a: Point, b: Point): Point => [a[0] - b[0], a[1] - b[1]];
const add = (a: Point, b: Point): Point => [a[0] + b[0], a[1] + b[1]];
const scale = (v: Point, k: number): Point => [v[0] * k, v[1] * k];

export function unit(v: Point): Point | null {
  const l = len(v);
  return l > 0 ? [v[0] / l, v[1] / l] : null;
}

export interface ArcGeometry {
  center: Point;
  radius: number;
  /** Canvas angles in radians; `anticlockwise` as CanvasRenderingContext2D.arc takes it. */
  startAngle: number;
  endAngle: number;
  anticlockwise: boolean;
  /** Opening of the arc, degrees, 0..180. */
  degrees: number;
  /** Where a label sits: on the bisector, `labelGap` beyond the arc. */
  labelAt: Point;
}

/** The smaller arc at `center` from direction `from` to direction `to` (any lengths). */
export function arcBetween(
  center: Point,
  from: Point,
  to: Point,
  radius: number,
  labelGap = 14,
): ArcGeometry | null {
  const a = unit(from);
  const b = unit(to);
  if (!a || !b) return null;
  const startAngle = Math.atan2(a[1], a[0]);
  const endAngle = Math.atan2(b[1], b[0]);
  let delta = endAngle - startAngle;
  while (delta <= -Math.PI) delta += 2 * Math.PI;
  while (delta > Math.PI) delta -= 2 * Math.PI;
  const mid = startAngle + delta / 2;
  return {
    center,
    radius,
    startAngle,
    endAngle,
    anticlockwise: delta < 0,
    degrees: (Math.abs(delta) * 180) / Math.PI,
    labelAt: add(center, scale([Math.cos(mid), Math.sin(mid)], radius + labelGap)),
  };
}

/** The snow line's direction (toward the image right) and its upward normal, in screen axes. */
export function snowLineAxes(line: ReferenceLine | null): { along: Point; up: Point } {
  const frame = referenceFrame(line);
  // Flipping y to screen axes; "0 - y" keeps a level line's 0 from becoming -0.
  return { along: [frame.along.x, 0 - frame.along.y], up: [frame.up.x, 0 - frame.up.y] };
}

/**
 * The part of the infinite line through a and b inside the rectangle [0, width] × [0, height], or
 * null when the line misses it (Liang–Barsky clipping of a long segment).
 */
export function lineAcrossRect(a: Point, b: Point, width: number, height: number): [Point, Point] | null {
  const d = sub(b, a);
  if (len(d) === 0) return null;
  let t0 = -Infinity;
  let t1 = Infinity;
  const clip = (p: number, q: number): boolean => {
    if (p === 0) return q >= 0;
    const r = q / p;
    if (p < 0) t0 = Math.max(t0, r);
    else t1 = Math.min(t1, r);
    return t0 <= t1;
  };
  if (!clip(-d[0], a[0]) || !clip(d[0], width - a[0]) || !clip(-d[1], a[1]) || !clip(d[1], height - a[1])) {
    return null;
  }
  if (!Number.isFinite(t0) || !Number.isFinite(t1)) return null;
  return [add(a, scale(d, t0)), add(a, scale(d, t1))];
}

export interface WidthBar {
  /** Ends of the bar: the two points projected on the hip line through their midpoint. */
  from: Point;
  to: Point;
  /** Width measured along the hip line, in the input's units. */
  width: number;
}

/**
 * A left/right pair measured along the hip line (unit vector u from right hip to left hip), drawn
 * as a bar through the pair's midpoint: |(left − right) · u|, the quantity stanceWidthRatio and
 * kneeSeparationRatio divide by the hip width.
 */
export function widthBar(left: Point, right: Point, hipLeft: Point, hipRight: Point): WidthBar | null {
  const u = unit(sub(hipLeft, hipRight));
  if (!u) return null;
  const d = sub(left, right);
  const along = d[0] * u[0] + d[1] * u[1];
  const mid = scale(add(left, right), 0.5);
  return { from: add(mid, scale(u, -along / 2)), to: add(mid, scale(u, along / 2)), width: Math.abs(along) };
}

/** Nearest of `points` to `at` within `maxDistance`, as an index, or -1. */
export function nearestPoint(points: readonly Point[], at: Point, maxDistance: number): number {
  let best = -1;
  let bestDistance = maxDistance;
  points.forEach((p, i) => {
    const d = len(sub(p, at));
    if (d <= bestDistance) {
      best = i;
      bestDistance = d;
    }
  });
  return best;
}
