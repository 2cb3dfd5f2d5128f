// Plain canvas drawing of the pose overlays. Everything is given in video pixels and mapped through
// `map`, so the same code draws on the zoomed stage and on a full-size still.

import {
  COCO17_NAMES,
  DEFAULT_CONFIDENCE_FLOOR,
  type Keypoint,
  type KeypointName,
  type ReferenceLine,
  type View,
} from '@shared/keypoints';
import type { MetricKey } from '@shared/metrics';
import { checkMetricBands, formatMetricValue } from '../../lib/metric-format';
import { arcBetween, lineAcrossRect, snowLineAxes, unit, widthBar } from '../../lib/overlay-geometry';
import type { Point, Size } from '../../lib/stage-transform';
import type { ToleranceBand } from '@shared/tolerance';
import type { PoseFrameResult } from '../stage/analysis-context';
import type { OverlayToggles } from '../stage/annotations-context';

// Readable on snow: every stroke gets a dark casing first, then a saturated colour.
export const OVERLAY_COLORS = {
  casing: 'rgba(17, 36, 58, 0.9)',
  left: '#f5b443',
  right: '#5ec8f0',
  centre: '#ffffff',
  uncertain: 'rgba(213, 217, 223, 0.9)',
  corrected: '#3fae8a',
  arc: '#ffffff',
  level: '#5ec8f0',
  snowLine: '#c3dbec',
  within: '#3fae8a',
  outside: '#ff6b52',
  hip: '#ffffff',
  label: 'rgba(17, 36, 58, 0.88)',
} as const;

export interface OverlayScene {
  pose: PoseFrameResult | null;
  view: View;
  referenceLine: ReferenceLine | null;
  toggles: OverlayToggles;
  bands: readonly ToleranceBand[];
  videoSize: Size;
  /** Show the snow line's handles (editing mode). */
  snowLineHandles: boolean;
  /** The line shown is the frame's own, not the clip's. */
  snowLineOwnFrame?: boolean;
  /** A point under the pointer or being dragged. */
  activePoint?: KeypointName | null;
}

export interface DrawOptions {
  /** Maps video pixels to the canvas' drawing units (CSS pixels on the stage). */
  map: (p: Point) => Point;
  /** Multiplies line widths, radii and text (1 on the stage; larger for a full-size still). */
  scale?: number;
}

type Side = 'left' | 'right' | 'centre';
const BONES: [KeypointName, KeypointName, Side][] = [
  ['left_shoulder', 'right_shoulder', 'centre'],
  ['left_hip', 'right_hip', 'centre'],
  ['left_shoulder', 'left_hip', 'left'],
  ['right_shoulder', 'right_hip', 'right'],
  ['left_shoulder', 'left_elbow', 'left'],
  ['left_elbow', 'left_wrist', 'left'],
  ['right_shoulder', 'right_elbow', 'right'],
  ['right_elbow', 'right_wrist', 'right'],
  ['left_hip', 'left_knee', 'left'],
  ['left_knee', 'left_ankle', 'left'],
  ['right_hip', 'right_knee', 'right'],
  ['right_knee', 'right_ankle', 'right'],
  ['left_ankle', 'left_heel', 'left'],
  ['left_heel', 'left_foot_index', 'left'],
  ['left_ankle', 'left_foot_index', 'left'],
  ['right_ankle', 'right_heel', 'right'],
  ['right_heel', 'right_foot_index', 'right'],
  ['right_ankle', 'right_foot_index', 'right'],
  ['nose', 'left_eye', 'left'],
  ['nose', 'right_eye', 'right'],
  ['left_eye', 'left_ear', 'left'],
  ['right_eye', 'right_ear', 'right'],
];

// Points drawn as joints; BlazePose's face and hand extras stay off to keep the figure legible.
const JOINTS: ReadonlySet<KeypointName> = new Set<KeypointName>([
  ...COCO17_NAMES,
  'left_heel',
  'right_heel',
  'left_foot_index',
  'right_foot_index',
]);

const sideOf = (name: KeypointName): Side =>
  name.startsWith('left_') ? 'left' : name.startsWith('right_') ? 'right' : 'centre';

class Painter {
  constructor(
    readonly ctx: CanvasRenderingContext2D,
    readonly map: (p: Point) => Point,
    readonly k: number,
  ) {}

  line(a: Point, b: Point, color: string, width: number, dash: number[] = []) {
    this.screenLine(this.map(a), this.map(b), color, width, dash);
  }

  /** A line from a screen-space start in a screen direction: used for reference strokes of fixed length. */
  ray(from: Point, direction: Point, length: number, color: string, width: number, dash: number[] = []) {
    const p = this.map(from);
    const u = unit(direction);
    if (!u) return;
    const q: Point = [p[0] + u[0] * length * this.k, p[1] + u[1] * length * this.k];
    this.screenLine(p, q, color, width, dash);
  }

  screenLine(p: Point, q: Point, color: string, width: number, dash: number[] = []) {
    const { ctx } = this;
    ctx.save();
    ctx.lineCap = 'round';
    ctx.setLineDash(dash.map((d) => d * this.k));
    ctx.strokeStyle = OVERLAY_COLORS.casing;
    ctx.lineWidth = (width + 2.5) * this.k;
    ctx.beginPath();
    ctx.moveTo(p[0], p[1]);
    ctx.lineTo(q[0], q[1]);
    ctx.stroke();
    ctx.strokeStyle = color;
    ctx.lineWidth = width * this.k;
    ctx.stroke();
    ctx.restore();
  }

  point(at: Point, color: string, radius: number, shape: 'disc' | 'ring' | 'diamond') {
    const { ctx, k } = this;
    const [x, y] = this.map(at);
    const r = radius * k;
    ctx.save();
    ctx.beginPath();
    if (shape === 'diamond') {
      ctx.moveTo(x, y - r * 1.35);
      ctx.lineTo(x + r * 1.35, y);
      ctx.lineTo(x, y + r * 1.35);
      ctx.lineTo(x - r * 1.35, y);
      ctx.closePath();
    } else {
      ctx.arc(x, y, r, 0, 2 * Math.PI);
    }
    ctx.lineWidth = 2 * k;
    ctx.strokeStyle = OVERLAY_COLORS.casing;
    if (shape === 'ring') {
      ctx.stroke();
      ctx.lineWidth = 1.5 * k;
      ctx.strokeStyle = color;
      ctx.beginPath();
      ctx.arc(x, y, r - 1.5 * k, 0, 2 * Math.PI);
      ctx.stroke();
    } else {
      ctx.fillStyle = color;
      ctx.fill();
      ctx.stroke();
    }
    ctx.restore();
  }

  arc(center: Point, from: Point, to: Point, radius: number, color: string, label: string) {
    const c = this.map(center);
    // Directions are taken in screen space so the arc follows what the coach sees.
    const f = this.map([center[0] + from[0], center[1] + from[1]]);
    const t = this.map([center[0] + to[0], center[1] + to[1]]);
    const geometry = arcBetween(
      c,
      [f[0] - c[0], f[1] - c[1]],
      [t[0] - c[0], t[1] - c[1]],
      radius * this.k,
      16 * this.k,
    );
    if (!geometry) return;
    const { ctx } = this;
    ctx.save();
    ctx.beginPath();
    ctx.moveTo(c[0], c[1]);
    ctx.arc(c[0], c[1], geometry.radius, geometry.startAngle, geometry.endAngle, geometry.anticlockwise);
    ctx.closePath();
    ctx.fillStyle = 'rgba(255, 255, 255, 0.18)';
    ctx.fill();
    ctx.beginPath();
    ctx.arc(c[0], c[1], geometry.radius, geometry.startAngle, geometry.endAngle, geometry.anticlockwise);
    ctx.strokeStyle = OVERLAY_COLORS.casing;
    ctx.lineWidth = 4.5 * this.k;
    ctx.stroke();
    ctx.strokeStyle = color;
    ctx.lineWidth = 2 * this.k;
    ctx.stroke();
    ctx.restore();
    if (label) this.label(geometry.labelAt, label, color);
  }

  /** Label boxes already drawn, so a new label can step aside instead of covering one. */
  private placed: { x: number; y: number; w: number; h: number }[] = [];

  label(at: Point, text: string, color: string = '#ffffff', align: 'centre' | 'left' = 'centre') {
    const { ctx, k } = this;
    ctx.save();
    ctx.font = `500 ${12 * k}px "IBM Plex Mono", ui-monospace, monospace`;
    const width = ctx.measureText(text).width;
    const padX = 5 * k;
    const h = 18 * k;
    const w = width + 2 * padX;
    const x = align === 'centre' ? at[0] - width / 2 - padX : at[0];
    let y = at[1] - h / 2;
    const overlaps = (top: number) =>
      this.placed.some((r) => x < r.x + r.w && r.x < x + w && top < r.y + r.h && r.y < top + h);
    // Left and right joints often coincide in a side view; stack their labels downward.
    for (let tries = 0; tries < 6 && overlaps(y); tries++) y += h + 2 * k;
    this.placed.push({ x, y, w, h });
    at = [at[0], y + h / 2];
    ctx.fillStyle = OVERLAY_COLORS.label;
    ctx.beginPath();
    ctx.roundRect(x, y, w, h, 4 * k);
    ctx.fill();
    ctx.fillStyle = color;
    ctx.textBaseline = 'middle';
    ctx.fillText(text, x + padX, at[1] + 0.5 * k);
    ctx.restore();
  }
}

function byName(keypoints: readonly Keypoint[]) {
  const map = new Map<KeypointName, Keypoint>();
  for (const k of keypoints) map.set(k.name, k);
  return map;
}

const usable = (k: Keypoint | undefined): k is Keypoint =>
  k !== undefined && k.score >= DEFAULT_CONFIDENCE_FLOOR && Number.isFinite(k.x) && Number.isFinite(k.y);

const pt = (k: Keypoint): Point => [k.x, k.y];

function drawSnowLine(p: Painter, scene: OverlayScene) {
  const { referenceLine, videoSize } = scene;
  if (!referenceLine && !scene.snowLineHandles) return;
  const line = referenceLine ?? defaultSnowLine(videoSize);
  const across = lineAcrossRect(line[0], line[1], videoSize.width, videoSize.height);
  if (across) p.line(across[0], across[1], OVERLAY_COLORS.snowLine, 1.5, [10, 6]);
  if (scene.snowLineHandles) {
    for (const handle of line) p.point(handle, OVERLAY_COLORS.snowLine, 7, 'disc');
    const name = scene.snowLineOwnFrame ? 'snow line, this frame' : 'snow line';
    const at = p.map(line[0]);
    p.label([at[0] + 12 * p.k, at[1] - 18 * p.k], name, OVERLAY_COLORS.snowLine, 'left');
  }
}

/** Where the handles start when a clip has no snow line yet: level, low in the frame. */
export function defaultSnowLine(video: Size): ReferenceLine {
  const y = video.height * 0.85;
  return [
    [video.width * 0.2, y],
    [video.width * 0.8, y],
  ];
}

function drawSkeleton(p: Painter, scene: OverlayScene, points: Map<KeypointName, Keypoint>) {
  const corrected = new Set(scene.pose?.correctedPoints ?? []);
  for (const [a, b, side] of BONES) {
    const ka = points.get(a);
    const kb = points.get(b);
    if (!ka || !kb) continue;
    const sure = usable(ka) && usable(kb);
    p.line(
      pt(ka),
      pt(kb),
      sure ? OVERLAY_COLORS[side] : OVERLAY_COLORS.uncertain,
      sure ? 3 : 1.5,
      sure ? [] : [4, 4],
    );
  }
  for (const [name, k] of points) {
    if (!JOINTS.has(name)) continue;
    const active = scene.activePoint === name;
    const radius = active ? 7 : 4.5;
    if (corrected.has(name)) p.point(pt(k), OVERLAY_COLORS.corrected, radius, 'diamond');
    else if (!usable(k)) p.point(pt(k), OVERLAY_COLORS.uncertain, radius + 1, 'ring');
    else p.point(pt(k), OVERLAY_COLORS[sideOf(name)], radius, 'disc');
  }
}

function metricText(
  scene: OverlayScene,
  key: MetricKey,
  prefix: string,
): { text: string; color: string } | null {
  const value = scene.pose?.metrics[key];
  if (value === null || value === undefined) return null;
  const check = checkMetricBands(key, value, scene.bands);
  return {
    text: `${prefix}${formatMetricValue(value, 'deg')}`,
    color: check.state === 'outside' ? OVERLAY_COLORS.outside : OVERLAY_COLORS.arc,
  };
}

const ARC_RADIUS = 26;

function drawSideArcs(p: Painter, scene: OverlayScene, points: Map<KeypointName, Keypoint>) {
  const { up } = snowLineAxes(scene.referenceLine);
  for (const side of ['left', 'right'] as const) {
    const tag = side === 'left' ? 'L ' : 'R ';
    const get = (part: string) => points.get(`${side}_${part}` as KeypointName);
    const [shoulder, hip, knee, ankle] = [get('shoulder'), get('hip'), get('knee'), get('ankle')];
    const sideKey = side === 'left' ? 'Left' : 'Right';
    // Knee: thigh carried on past the knee (straight leg) against the shin; the opening is the flexion.
    const kneeText = metricText(scene, `kneeFlexion${sideKey}`, tag);
    if (kneeText && usable(hip) && usable(knee) && usable(ankle)) {
      const thigh: Point = [knee.x - hip.x, knee.y - hip.y];
      p.ray(pt(knee), thigh, ARC_RADIUS + 10, OVERLAY_COLORS.arc, 1, [3, 3]);
      p.arc(pt(knee), thigh, [ankle.x - knee.x, ankle.y - knee.y], ARC_RADIUS, kneeText.color, kneeText.text);
    }
    const hipText = metricText(scene, `hipFlexion${sideKey}`, tag);
    if (hipText && usable(shoulder) && usable(hip) && usable(knee)) {
      const trunk: Point = [hip.x - shoulder.x, hip.y - shoulder.y];
      p.ray(pt(hip), trunk, ARC_RADIUS + 10, OVERLAY_COLORS.arc, 1, [3, 3]);
      p.arc(pt(hip), trunk, [knee.x - hip.x, knee.y - hip.y], ARC_RADIUS, hipText.color, hipText.text);
    }
    // Ankle: the neutral shin is perpendicular to the foot; without foot points the foot lies along the snow line.
    const ankleText = metricText(scene, `ankleFlexion${sideKey}`, tag);
    if (ankleText && usable(knee) && usable(ankle)) {
      const heel = get('heel');
      const toe = get('foot_index');
      let neutral: Point = up;
      if (usable(heel) && usable(toe)) {
        const foot = unit([toe.x - heel.x, toe.y - heel.y]);
        if (foot) {
          const normal: Point = [foot[1], -foot[0]];
          neutral = normal[1] <= 0 ? normal : [-normal[0], -normal[1]];
        }
      }
      p.ray(pt(ankle), neutral, ARC_RADIUS + 10, OVERLAY_COLORS.arc, 1, [3, 3]);
      p.arc(
        pt(ankle),
        neutral,
        [knee.x - ankle.x, knee.y - ankle.y],
        ARC_RADIUS - 6,
        ankleText.color,
        ankleText.text,
      );
    }
  }
}

const mid = (a: Keypoint, b: Keypoint): Point => [(a.x + b.x) / 2, (a.y + b.y) / 2];

function drawFrontArcs(p: Painter, scene: OverlayScene, points: Map<KeypointName, Keypoint>) {
  const { up } = snowLineAxes(scene.referenceLine);
  const [ls, rs, lh, rh, la, ra] = (
    ['left_shoulder', 'right_shoulder', 'left_hip', 'right_hip', 'left_ankle', 'right_ankle'] as const
  ).map((n) => points.get(n));
  if (usable(lh) && usable(rh) && usable(la) && usable(ra)) {
    const text = metricText(scene, 'inclination', 'incl ');
    if (text) {
      const base = mid(la, ra);
      const hipMid = mid(lh, rh);
      p.ray(base, up, ARC_RADIUS * 2.2, OVERLAY_COLORS.arc, 1, [3, 3]);
      p.line(base, hipMid, OVERLAY_COLORS.arc, 1.5);
      p.arc(base, up, [hipMid[0] - base[0], hipMid[1] - base[1]], ARC_RADIUS * 1.6, text.color, text.text);
    }
  }
  if (usable(lh) && usable(rh) && usable(ls) && usable(rs)) {
    const text = metricText(scene, 'upperBodyInclination', 'upper ');
    if (text) {
      const base = mid(lh, rh);
      const top = mid(ls, rs);
      p.ray(base, up, ARC_RADIUS * 2, OVERLAY_COLORS.arc, 1, [3, 3]);
      p.line(base, top, OVERLAY_COLORS.arc, 1.5);
      p.arc(base, up, [top[0] - base[0], top[1] - base[1]], ARC_RADIUS * 1.3, text.color, text.text);
    }
  }
}

/** A level on the shoulders: the shoulder line against a line parallel to the snow, and the tilt. */
function drawTiltGauge(p: Painter, scene: OverlayScene, points: Map<KeypointName, Keypoint>) {
  const ls = points.get('left_shoulder');
  const rs = points.get('right_shoulder');
  const value = scene.pose?.metrics.shoulderTilt;
  if (!usable(ls) || !usable(rs) || value === null || value === undefined) return;
  const centre = mid(ls, rs);
  const half = Math.hypot(ls.x - rs.x, ls.y - rs.y) / 2;
  const { along } = snowLineAxes(scene.referenceLine);
  const reach = half * 1.45;
  const level: [Point, Point] = [
    [centre[0] - along[0] * reach, centre[1] - along[1] * reach],
    [centre[0] + along[0] * reach, centre[1] + along[1] * reach],
  ];
  const shoulderDir = unit([ls.x - rs.x, ls.y - rs.y]);
  if (!shoulderDir) return;
  // Orient the shoulder line like the level (toward the image right) so the arc opens at the right end.
  const sd: Point =
    shoulderDir[0] * along[0] + shoulderDir[1] * along[1] < 0
      ? [-shoulderDir[0], -shoulderDir[1]]
      : shoulderDir;
  p.line(level[0], level[1], OVERLAY_COLORS.level, 1.5, [6, 4]);
  p.line(
    [centre[0] - sd[0] * reach, centre[1] - sd[1] * reach],
    [centre[0] + sd[0] * reach, centre[1] + sd[1] * reach],
    OVERLAY_COLORS.level,
    2.5,
  );
  const check = checkMetricBands('shoulderTilt', value, scene.bands);
  const color = check.state === 'outside' ? OVERLAY_COLORS.outside : OVERLAY_COLORS.level;
  const higher = value > 0 ? ' L up' : value < 0 ? ' R up' : '';
  const end = level[1];
  p.arc(centre, along, sd, 34, color, '');
  const labelAt = p.map([end[0], end[1]]);
  p.label(
    [labelAt[0] + 8 * p.k, labelAt[1] - 14 * p.k],
    `tilt ${formatMetricValue(value, 'deg')}${higher}`,
    color,
    'left',
  );
}

function drawWidthBars(p: Painter, scene: OverlayScene, points: Map<KeypointName, Keypoint>) {
  const lh = points.get('left_hip');
  const rh = points.get('right_hip');
  if (!usable(lh) || !usable(rh)) return;
  const hips = widthBar(pt(lh), pt(rh), pt(lh), pt(rh));
  if (!hips) return;
  p.line(hips.from, hips.to, OVERLAY_COLORS.hip, 4);
  const hipEnd = p.map(hips.to);
  p.label([hipEnd[0] + 10 * p.k, hipEnd[1]], 'hip width', '#ffffff', 'left');
  const pairs = [
    ['left_knee', 'right_knee', 'kneeSeparationRatio', 'knees'],
    ['left_ankle', 'right_ankle', 'stanceWidthRatio', 'stance'],
  ] as const;
  for (const [left, right, key, name] of pairs) {
    const kl = points.get(left);
    const kr = points.get(right);
    const value = scene.pose?.metrics[key];
    if (!usable(kl) || !usable(kr) || value === null || value === undefined) continue;
    const bar = widthBar(pt(kl), pt(kr), pt(lh), pt(rh));
    if (!bar) continue;
    const check = checkMetricBands(key, value, scene.bands);
    const color = check.state === 'outside' ? OVERLAY_COLORS.outside : OVERLAY_COLORS.within;
    p.line(bar.from, bar.to, color, 4);
    const end = p.map(bar.to);
    p.label([end[0] + 10 * p.k, end[1]], `${name} ${formatMetricValue(value, 'ratio')}× hip`, color, 'left');
  }
}

/** Draws the enabled overlays of one frame. The caller clears and sizes the canvas. */
export function drawOverlays(ctx: CanvasRenderingContext2D, scene: OverlayScene, options: DrawOptions) {
  const p = new Painter(ctx, options.map, options.scale ?? 1);
  drawSnowLine(p, scene);
  const pose = scene.pose;
  if (!pose || pose.keypoints.length === 0) return;
  const points = byName(pose.keypoints);
  if (scene.toggles.widthBars && scene.view === 'front') drawWidthBars(p, scene, points);
  if (scene.toggles.tiltGauge && scene.view === 'front') drawTiltGauge(p, scene, points);
  if (scene.toggles.skeleton) drawSkeleton(p, scene, points);
  if (scene.toggles.angleArcs) {
    if (scene.view === 'side') drawSideArcs(p, scene, points);
    else drawFrontArcs(p, scene, points);
  }
}
