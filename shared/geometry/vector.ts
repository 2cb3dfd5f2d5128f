import type { Vec2 } from './types';

export const vec = (x: number, y: number): Vec2 => ({ x, y });
export const add = (a: Vec2, b: Vec2): Vec2 => ({ x: a.x + b.x, y: a.y + b.y });
export const sub = (a: Vec2, b: Vec2): Vec2 => ({ x: a.x - b.x, y: a.y - b.y });
export const scale = (a: Vec2, k: number): Vec2 => ({ x: a.x * k, y: a.y * k });
export const dot = (a: Vec2, b: Vec2): number => a.x * b.x + a.y * b.y;
/** z component of the 3-D cross product; positive when b is counter-clockwise from a. */
export const cross = (a: Vec2, b: Vec2): number => a.x * b.y - a.y * b.x;
export const norm = (a: Vec2): number => Math.hypot(a.x, a.y);
export const distance = (a: Vec2, b: Vec2): number => Math.hypot(a.x - b.x, a.y - b.y);
export const midpoint = (a: Vec2, b: Vec2): Vec2 => ({ x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 });
/** Counter-clockwise quarter turn. */
export const perpendicular = (a: Vec2): Vec2 => ({ x: -a.y, y: a.x });

export function normalize(a: Vec2): Vec2 | null {
  const n = norm(a);
  return n > 0 && Number.isFinite(n) ? { x: a.x / n, y: a.y / n } : null;
}

export function mean(points: readonly Vec2[]): Vec2 | null {
  if (points.length === 0) return null;
  let x = 0;
  let y = 0;
  for (const p of points) {
    x += p.x;
    y += p.y;
  }
  return { x: x / points.length, y: y / points.length };
}

/** Weighted mean of points; weights need not sum to one. */
export function weightedMean(points: readonly { point: Vec2; weight: number }[]): Vec2 | null {
  let x = 0;
  let y = 0;
  let w = 0;
  for (const { point, weight } of points) {
    x += point.x * weight;
    y += point.y * weight;
    w += weight;
  }
  return w > 0 ? { x: x / w, y: y / w } : null;
}

/** Point a fraction `t` of the way from a to b. */
export const lerp = (a: Vec2, b: Vec2, t: number): Vec2 => ({
  x: a.x + (b.x - a.x) * t,
  y: a.y + (b.y - a.y) * t,
});
