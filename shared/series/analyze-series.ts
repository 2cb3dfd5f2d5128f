import type { Keypoint, KeypointName, ReferenceLine, View } from '../keypoints';
import { DEFAULT_CONFIDENCE_FLOOR } from '../keypoints';
import {
  computeFrameMetrics,
  detectFacing,
  METRIC_KEYS,
  type Facing,
  type MetricKey,
  type SegmentTableName,
} from '../metrics';
import { fillGaps, runsOf } from './gap-fill';
import { makeSmoother, type FilterOptions, type FilterRecord } from './filters';
import { segmentTurns } from './turns';

export class SeriesInputError extends Error {
  override name = 'SeriesInputError';
}

export interface SeriesFrameInput {
  frameIndex: number;
  timeMs: number;
  keypoints: Keypoint[];
}

export interface SeriesOptions {
  view: View;
  referenceLine?: ReferenceLine | null;
  fps: number;
  /** Longest dropout, in samples, that is interpolated (default 3). */
  maxGapFrames?: number;
  /** Default: zero-lag Butterworth at 6 Hz. */
  filter?: FilterOptions;
  confidenceFloor?: number;
  /** Side view facing for the whole clip; by default the confidence-weighted vote of its frames. */
  facing?: Facing | null;
  segmentTable?: SegmentTableName;
  /** |inclination| (deg) a turn must reach to count, so jitter around zero is not a turn (default 3). */
  minTurnPeakDeg?: number;
}

export interface SeriesFrame {
  frameIndex: number;
  timeMs: number;
  /** Gap-filled and smoothed; points that could not be filled keep their raw values and scores. */
  keypoints: Keypoint[];
  interpolated: boolean;
  interpolatedKeypoints: KeypointName[];
  metrics: Record<MetricKey, number | null>;
  reasons: Partial<Record<MetricKey, string>>;
}

export interface Turn {
  index: number;
  direction: 'left' | 'right';
  startFrame: number;
  apexFrame: number;
  endFrame: number;
  startMs: number;
  apexMs: number;
  endMs: number;
  durationMs: number;
  /** False when the clip cuts the turn: it starts or ends at the clip edge, not at a transition. */
  complete: boolean;
  insideSide: 'left' | 'right';
  apexValues: Record<MetricKey, number | null>;
  /** standHeight at the transition ending this turn over its value at this turn's apex, minus 1. */
  transitionRise: number | null;
  /** shoulderTilt at the apex, positive when the inside shoulder is lower. */
  insideShoulderDrop: number | null;
  /** foreAftOffset at the apex, positive when the inside foot is ahead (side view only, so usually null). */
  insideFootLead: number | null;
}

export interface MetricSummary {
  median: number | null;
  min: number | null;
  max: number | null;
  count: number;
}

export type SeriesSummary = Record<MetricKey, MetricSummary> & {
  byDirection?: Record<'left' | 'right', Record<MetricKey, MetricSummary>>;
};

export interface SeriesResult {
  frames: SeriesFrame[];
  turns: Turn[];
  transitions: { frameIndex: number; timeMs: number }[];
  summary: SeriesSummary;
  filter: FilterRecord;
  facing: Facing | null;
  gapFill: { maxGapFrames: number };
}

export const DEFAULT_MAX_GAP_FRAMES = 3;
export const DEFAULT_MIN_TURN_PEAK_DEG = 3;

/**
 * Median (the mean of the two middle values for an even count), min and max; reorders `values`. A
 * selection instead of a sort: a 10,000-frame clip's sixty summaries take a few milliseconds.
 */
export function summarizeValues(values: Float64Array): MetricSummary {
  const n = values.length;
  if (n === 0) return { median: null, min: null, max: null, count: 0 };
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  const upper = selectKth(values, n >> 1);
  // After selecting the upper middle, everything before it is no larger: the lower middle is their max.
  let lower = upper;
  if (n % 2 === 0) {
    lower = -Infinity;
    for (let i = 0; i < n >> 1; i++) if (values[i] > lower) lower = values[i];
  }
  return { median: (lower + upper) / 2, min, max, count: n };
}

function summarizeFrames(frames: readonly SeriesFrame[]): Record<MetricKey, MetricSummary> {
  const out = {} as Record<MetricKey, MetricSummary>;
  // One buffer for every metric: the present values are copied in, sorted in place and read.
  const buffer = new Float64Array(frames.length);
  for (const key of METRIC_KEYS) {
    let n = 0;
    for (const f of frames) {
      const v = f.metrics[key];
      if (v !== null) buffer[n++] = v;
    }
    out[key] = summarizeValues(buffer.subarray(0, n));
  }
  return out;
}

/** The k-th smallest value (0-based) of `a`, reordering it in place (Hoare's selection, O(n) on average). */
function selectKth(a: Float64Array, k: number): number {
  let lo = 0;
  let hi = a.length - 1;
  while (lo < hi) {
    const pivot = a[(lo + hi) >> 1];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return a[k];
  }
  return a[k];
}

function validate(frames: readonly SeriesFrameInput[], options: SeriesOptions) {
  if (!(options.fps > 0) || !Number.isFinite(options.fps)) {
    throw new SeriesInputError(`fps must be a positive number, got ${options.fps}`);
  }
  const maxGap = options.maxGapFrames ?? DEFAULT_MAX_GAP_FRAMES;
  if (!Number.isInteger(maxGap) || maxGap < 0) {
    throw new SeriesInputError(`maxGapFrames must be a whole number ≥ 0, got ${maxGap}`);
  }
  for (const f of frames) {
    if (!Number.isFinite(f.frameIndex) || !Number.isFinite(f.timeMs)) {
      throw new SeriesInputError(`frame ${f.frameIndex}: frameIndex and timeMs must be finite numbers`);
    }
  }
}

/** Gap filling, smoothing, per-frame metrics, turns and a summary for one clip. */
export function analyzeSeries(input: SeriesFrameInput[], options: SeriesOptions): SeriesResult {
  validate(input, options);
  const maxGap = options.maxGapFrames ?? DEFAULT_MAX_GAP_FRAMES;
  const floor = options.confidenceFloor ?? DEFAULT_CONFIDENCE_FLOOR;
  const frames = [...input].sort((a, b) => a.frameIndex - b.frameIndex);
  const n = frames.length;
  const times = frames.map((f) => f.timeMs);
  const smoother = makeSmoother(options.filter, options.fps);

  // Each keypoint's track through the clip, in one pass (frame i's point, or undefined).
  const tracks = new Map<KeypointName, (Keypoint | undefined)[]>();
  frames.forEach((f, i) => {
    for (const k of f.keypoints) {
      let track = tracks.get(k.name);
      if (!track) tracks.set(k.name, (track = new Array<Keypoint | undefined>(n)));
      track[i] = k;
    }
  });

  // Per frame, each name once: the smoothed point inside a run of valid points, else the raw one.
  const smoothed: Keypoint[][] = frames.map(() => []);
  const interpolated: KeypointName[][] = frames.map(() => []);
  for (const [name, track] of tracks) {
    const raw = Array.from(track);
    const inRun = new Uint8Array(n);
    const valid = raw.map(
      (k) =>
        !!k && k.score >= floor && Number.isFinite(k.x) && Number.isFinite(k.y) && Number.isFinite(k.score),
    );
    const xs = fillGaps(
      raw.map((k) => k?.x ?? 0),
      valid,
      maxGap,
    );
    const ys = fillGaps(
      raw.map((k) => k?.y ?? 0),
      valid,
      maxGap,
    );
    const scores = raw.map((k) => k?.score ?? 0);
    for (const [start, end] of runsOf(xs.valid)) {
      const t = times.slice(start, end);
      const sx = smoother.run(xs.values.slice(start, end), t);
      const sy = smoother.run(ys.values.slice(start, end), t);
      for (let i = start; i < end; i++) {
        let score = scores[i];
        if (xs.filled[i]) {
          // A filled point is as trustworthy as the weaker of the two points it was drawn between.
          let before = i - 1;
          while (xs.filled[before]) before--;
          let after = i + 1;
          while (xs.filled[after]) after++;
          score = Math.min(scores[before], scores[after]);
          interpolated[i].push(name);
        }
        smoothed[i].push({ name, x: sx[i - start], y: sy[i - start], score });
        inRun[i] = 1;
      }
    }
    for (let i = 0; i < n; i++) {
      const k = raw[i];
      if (!inRun[i] && k) smoothed[i].push(k);
    }
  }

  let facing: Facing | null = null;
  if (options.view === 'side') {
    if (options.facing) facing = options.facing;
    else {
      let vote = 0;
      for (const m of smoothed) {
        const f = detectFacing(m, options.referenceLine);
        if (f) vote += f.facing === 'right' ? f.confidence : -f.confidence;
      }
      facing = vote > 0 ? 'right' : vote < 0 ? 'left' : null;
    }
  }

  const out: SeriesFrame[] = frames.map((f, i) => {
    const keypoints = smoothed[i];
    const m = computeFrameMetrics(
      { keypoints, view: options.view, referenceLine: options.referenceLine, confidenceFloor: floor },
      { facing, segmentTable: options.segmentTable },
    );
    return {
      frameIndex: f.frameIndex,
      timeMs: f.timeMs,
      keypoints,
      interpolated: interpolated[i].length > 0,
      interpolatedKeypoints: interpolated[i],
      metrics: m.metrics,
      reasons: m.reasons,
    };
  });

  const turns: Turn[] = [];
  let transitions: { frameIndex: number; timeMs: number }[] = [];
  if (options.view === 'front') {
    const seg = segmentTurns(
      out.map((f) => f.metrics.inclination),
      times,
      options.minTurnPeakDeg ?? DEFAULT_MIN_TURN_PEAK_DEG,
    );
    transitions = seg.transitions.map((t) => ({ frameIndex: out[t.index].frameIndex, timeMs: t.timeMs }));
    for (const span of seg.turns) {
      const apex = out[span.apex];
      const side = span.direction > 0 ? 'left' : 'right';
      // Seen from the front the legs' bend shows as a shorter ankle-to-hip distance, so the rise is
      // how much taller the skier stands at the transition than at the apex, as a share of the latter.
      const atEnd = out[span.end].metrics.standHeight;
      const atApex = apex.metrics.standHeight;
      const rise =
        span.endsAtTransition && atEnd !== null && atApex !== null && atApex > 0 ? atEnd / atApex - 1 : null;
      const tilt = apex.metrics.shoulderTilt;
      const foreAft = apex.metrics.foreAftOffset;
      turns.push({
        index: turns.length,
        direction: side,
        startFrame: out[span.start].frameIndex,
        apexFrame: apex.frameIndex,
        endFrame: out[span.end].frameIndex,
        startMs: span.startMs,
        apexMs: apex.timeMs,
        endMs: span.endMs,
        durationMs: span.endMs - span.startMs,
        complete: span.startsAtTransition && span.endsAtTransition,
        insideSide: side,
        apexValues: { ...apex.metrics },
        transitionRise: rise,
        // shoulderTilt is positive with the left shoulder higher, so a left turn's drop is its negative.
        insideShoulderDrop: tilt === null ? null : side === 'left' ? -tilt : tilt,
        insideFootLead: foreAft === null ? null : side === 'left' ? foreAft : -foreAft,
      });
    }
  }

  const summary: SeriesSummary = summarizeFrames(out);
  if (turns.length > 0) {
    summary.byDirection = {
      left: summarizeFrames(framesInTurns(out, turns, 'left')),
      right: summarizeFrames(framesInTurns(out, turns, 'right')),
    };
  }

  return {
    frames: out,
    turns,
    transitions,
    summary,
    filter: smoother.record,
    facing,
    gapFill: { maxGapFrames: maxGap },
  };
}

/**
 * The frames inside turns of one direction: a frame belongs to a turn from its start up to (not
 * including) its end, except the clip's last frame, which belongs to a turn ending on it. Frames and
 * turns are both in time order, so one walk through each does it.
 */
function framesInTurns(
  frames: readonly SeriesFrame[],
  turns: readonly Turn[],
  direction: 'left' | 'right',
): SeriesFrame[] {
  const mine = turns.filter((t) => t.direction === direction);
  const inside: SeriesFrame[] = [];
  let j = 0;
  for (let i = 0; i < frames.length; i++) {
    const frame = frames[i].frameIndex;
    const last = i === frames.length - 1;
    while (j < mine.length && frame >= mine[j].endFrame && !(last && frame === mine[j].endFrame)) j++;
    if (j < mine.length && frame >= mine[j].startFrame) inside.push(frames[i]);
  }
  return inside;
}
