import { interiorAngle } from '@shared/geometry';
import type { NoteDrawing, NotePoint } from '../../api/get-clip-notes';

/** A point in video pixel space (x right, y down), the space every stored drawing uses. */
export type VideoPoint = NotePoint;
export type Drawing = NoteDrawing;

export type DrawingTool = 'freehand' | 'arrow' | 'angle';

export const emptyDrawing = (): Drawing => ({ strokes: [], arrows: [], angles: [] });

export function isDrawingEmpty(d: Drawing | null | undefined): boolean {
  return !d || (d.strokes.length === 0 && d.arrows.length === 0 && d.angles.length === 0);
}

/** The manual angle tool's reading: the interior angle at the vertex, 0..180 degrees; null if degenerate. */
export function manualAngleDegrees(a: VideoPoint, vertex: VideoPoint, b: VideoPoint): number | null {
  // The interior angle is the same in a y-down and a y-up frame, so image points go in as they are.
  const angle = interiorAngle({ x: a[0], y: a[1] }, { x: vertex[0], y: vertex[1] }, { x: b[0], y: b[1] });
  return angle === null ? null : Number(angle);
}

/** Adds a pointer sample to a freehand stroke unless it is closer than `minStep` to the last one. */
export function appendStrokePoint(points: VideoPoint[], p: VideoPoint, minStep: number): VideoPoint[] {
  const last = points[points.length - 1];
  if (last && Math.hypot(p[0] - last[0], p[1] - last[1]) < minStep) return points;
  return [...points, p];
}

/**
 * The two barb ends of an arrow head at `to`: each `length` long, `spreadDeg` off the shaft.
 * Null for a zero-length arrow, which has no direction.
 */
export function arrowHead(
  from: VideoPoint,
  to: VideoPoint,
  length: number,
  spreadDeg = 25,
): [VideoPoint, VideoPoint] | null {
  const dx = from[0] - to[0];
  const dy = from[1] - to[1];
  const len = Math.hypot(dx, dy);
  if (len === 0) return null;
  const back = Math.atan2(dy, dx);
  const spread = (spreadDeg * Math.PI) / 180;
  const barb = (angle: number): VideoPoint => [
    to[0] + length * Math.cos(angle),
    to[1] + length * Math.sin(angle),
  ];
  return [barb(back - spread), barb(back + spread)];
}

/**
 * Start and end angles (radians, canvas convention: clockwise from +x in a y-down frame) of the
 * arc that marks the smaller angle between the arms vertex→a and vertex→b.
 */
export function angleArc(a: VideoPoint, vertex: VideoPoint, b: VideoPoint): { start: number; end: number } {
  const ta = Math.atan2(a[1] - vertex[1], a[0] - vertex[0]);
  const tb = Math.atan2(b[1] - vertex[1], b[0] - vertex[0]);
  let sweep = tb - ta;
  while (sweep <= -Math.PI) sweep += 2 * Math.PI;
  while (sweep > Math.PI) sweep -= 2 * Math.PI;
  return sweep >= 0 ? { start: ta, end: ta + sweep } : { start: tb, end: tb - sweep };
}

/** Where the degrees label of an angle goes: along the bisector, `offset` pixels out from the vertex. */
export function angleLabelPosition(
  a: VideoPoint,
  vertex: VideoPoint,
  b: VideoPoint,
  offset: number,
): VideoPoint {
  const { start, end } = angleArc(a, vertex, b);
  const mid = (start + end) / 2;
  return [vertex[0] + offset * Math.cos(mid), vertex[1] + offset * Math.sin(mid)];
}

/** Distance from p to the segment a-b, for picking the drawing element under the pointer. */
export function distanceToSegment(p: VideoPoint, a: VideoPoint, b: VideoPoint): number {
  const vx = b[0] - a[0];
  const vy = b[1] - a[1];
  const len2 = vx * vx + vy * vy;
  const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((p[0] - a[0]) * vx + (p[1] - a[1]) * vy) / len2));
  return Math.hypot(p[0] - (a[0] + t * vx), p[1] - (a[1] + t * vy));
}
