import type { ClipFlagDto } from '@shared/schemas/flag.schema';
import type { View } from '@shared/keypoints';
import { METRIC_DEFINITIONS, METRIC_KEYS, type MetricKey, type MetricUnit } from '@shared/metrics';

/** What the curves need of a stored frame (GET /api/clips/:id/frames). */
export interface CurveFrame {
  frameIndex: number;
  timeMs: number;
  metrics: Partial<Record<MetricKey, number | null>>;
}

/** What the curves need of a turn (shared/series Turn). */
export interface CurveTurn {
  index: number;
  direction: 'left' | 'right';
  startMs: number;
  apexMs: number;
  endMs: number;
  apexFrame: number;
  complete: boolean;
}

export interface CurveFlag {
  metric: string;
  value: number;
  frameIndex: number | null;
  turnIndex: number | null;
}

export type ChartRow = { frameIndex: number; t: number } & Partial<Record<MetricKey, number | null>>;

export interface TurnShade {
  key: string;
  /** Seconds on the chart's time axis. */
  x1: number;
  x2: number;
  direction: 'left' | 'right';
  label: string;
}

export const metricsForView = (view: View): MetricKey[] =>
  METRIC_KEYS.filter((k) => METRIC_DEFINITIONS[k].views.includes(view));

/** A first look that answers the usual questions for the view; the coach can change it. */
export function defaultChartMetrics(view: View): MetricKey[] {
  return view === 'front'
    ? ['inclination', 'angulation', 'shoulderTilt', 'kneeSeparationRatio']
    : ['kneeFlexionLeft', 'kneeFlexionRight', 'shinTorsoMismatch'];
}

/** Rows for the line chart, in frame order, time in seconds; missing values stay null (a gap). */
export function chartRows(frames: readonly CurveFrame[], keys: readonly MetricKey[]): ChartRow[] {
  return [...frames]
    .sort((a, b) => a.frameIndex - b.frameIndex)
    .map((f) => {
      const row: ChartRow = { frameIndex: f.frameIndex, t: f.timeMs / 1000 };
      for (const k of keys) row[k] = f.metrics[k] ?? null;
      return row;
    });
}

/** One shaded band per turn, from its start to its end transition (or the clip edge). */
export function turnShading(turns: readonly CurveTurn[]): TurnShade[] {
  return turns
    .filter((t) => t.endMs > t.startMs)
    .map((t) => ({
      key: `turn-${t.index}`,
      x1: t.startMs / 1000,
      x2: t.endMs / 1000,
      direction: t.direction,
      label: `${t.direction === 'left' ? 'L' : 'R'}${t.index + 1}`,
    }));
}

/** The frame a click at chart time `t` (seconds) means: the nearest row's frame. */
export function nearestFrame(rows: readonly ChartRow[], t: number): number | null {
  if (rows.length === 0 || !Number.isFinite(t)) return null;
  let lo = 0;
  let hi = rows.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (rows[mid].t <= t) lo = mid;
    else hi = mid;
  }
  return Math.abs(rows[lo].t - t) <= Math.abs(rows[hi].t - t) ? rows[lo].frameIndex : rows[hi].frameIndex;
}

export interface FlagMarker {
  key: string;
  metric: MetricKey;
  t: number;
  value: number;
  frameIndex: number;
}

/** Flags of the charted metrics, placed on their line at the flagged frame. */
export function flagMarkers(
  flags: readonly CurveFlag[],
  frames: readonly CurveFrame[],
  charted: readonly MetricKey[],
): FlagMarker[] {
  const timeOf = new Map(frames.map((f) => [f.frameIndex, f.timeMs] as const));
  const out: FlagMarker[] = [];
  for (const f of flags) {
    if (f.frameIndex === null || !(charted as readonly string[]).includes(f.metric)) continue;
    const timeMs = timeOf.get(f.frameIndex);
    if (timeMs === undefined) continue;
    out.push({
      key: `${f.metric}-${f.frameIndex}`,
      metric: f.metric as MetricKey,
      t: timeMs / 1000,
      value: f.value,
      frameIndex: f.frameIndex,
    });
  }
  return out;
}

/** Degrees on the left axis, ratios and shin lengths (both dimensionless) on the right. */
export function axisFor(unit: MetricUnit): 'deg' | 'ratio' {
  return unit === 'deg' ? 'deg' : 'ratio';
}

export const UNIT_WORDS: Record<MetricUnit, string> = {
  deg: 'degrees',
  ratio: 'ratio',
  'shin lengths': 'shin lengths',
  'hip widths': 'hip widths',
};

export interface FlagSpan {
  key: string;
  metric: string;
  firstFrame: number;
  lastFrame: number;
  /** The frame furthest outside the band, where a click should go. */
  worstFrame: number;
  worstValue: number;
  count: number;
  turnIndex: number | null;
  status: ClipFlagDto['status'];
}

/** The server's flags (one per habit and turn, or stretch outside turns) as chips, in time order. */
export function flagSpans(flags: readonly ClipFlagDto[]): FlagSpan[] {
  return flags
    .map((f) => ({
      key: f.id,
      metric: f.metric,
      firstFrame: f.firstFrame,
      lastFrame: f.lastFrame,
      worstFrame: f.frameIndex,
      worstValue: f.value,
      count: f.frameCount,
      turnIndex: f.turnIndex,
      status: f.status,
    }))
    .sort((a, b) => a.firstFrame - b.firstFrame || a.metric.localeCompare(b.metric));
}
