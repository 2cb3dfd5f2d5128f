import type { MetricKey } from '../metrics';
import type { Turn } from '../series';
import { isTurnValueKey, type BandMetricKey, type TurnValueKey } from './band-metrics';
import { checkBand, type ToleranceBand } from './bands';

/** What grouping needs of a turn (a stored series keeps just this). */
export type TurnWindow = Pick<
  Turn,
  'index' | 'startFrame' | 'apexFrame' | 'endFrame' | 'transitionRise' | 'insideShoulderDrop'
> & { apexValues: Partial<Record<MetricKey, number | null>> };

/** The part of a series turn that grouping and per-turn bands read (what a clip's stored turns keep). */
export function turnWindow(turn: Turn): TurnWindow {
  return {
    index: turn.index,
    startFrame: turn.startFrame,
    apexFrame: turn.apexFrame,
    endFrame: turn.endFrame,
    transitionRise: turn.transitionRise,
    insideShoulderDrop: turn.insideShoulderDrop,
    apexValues: { inclination: turn.apexValues.inclination, angulation: turn.apexValues.angulation },
  };
}

/**
 * One coaching point: a habit (a band's metric) outside its band in one turn, however many frames of
 * the turn it lasted; between turns (or in a clip without turns) one per stretch of neighbouring frames.
 */
export interface FlagGroup {
  metric: BandMetricKey;
  /** "t3" for turn 3, "r120" for the stretch outside any turn that starts at frame 120. */
  groupKey: string;
  turnIndex: number | null;
  firstFrame: number;
  lastFrame: number;
  /** Analysed frames outside the band in the group (1 for a per-turn value). */
  frameCount: number;
  /** The frame furthest outside the band, where the flag opens the clip. */
  worstFrame: number;
  value: number;
  /** How far outside the band, in the metric's unit; always positive. */
  distance: number;
  side: 'below' | 'above';
  min: number | null;
  max: number | null;
}

export interface FrameValues {
  frameIndex: number;
  metrics: Partial<Record<MetricKey, number | null>>;
}

function openGroup(
  metric: MetricKey,
  groupKey: string,
  turnIndex: number | null,
  frameIndex: number,
  band: ToleranceBand,
): FlagGroup {
  return {
    metric,
    groupKey,
    turnIndex,
    firstFrame: frameIndex,
    lastFrame: frameIndex,
    frameCount: 0,
    worstFrame: frameIndex,
    value: 0,
    distance: -1,
    side: 'above',
    min: band.min,
    max: band.max,
  };
}

/** The per-turn value a band on `key` judges: apex lean and angulation unsigned, into the turn. */
export function turnValue(turn: TurnWindow, key: TurnValueKey): number | null {
  switch (key) {
    case 'transitionRise':
      return turn.transitionRise;
    case 'insideShoulderDrop':
      return turn.insideShoulderDrop;
    case 'apexInclination': {
      const v = turn.apexValues.inclination;
      return v === null || v === undefined ? null : Math.abs(v);
    }
    case 'apexAngulation': {
      const v = turn.apexValues.angulation;
      return v === null || v === undefined ? null : Math.abs(v);
    }
  }
}

/** The frame a per-turn value belongs to: the transition for the rise, else the apex. */
const turnValueFrame = (turn: TurnWindow, key: TurnValueKey) =>
  key === 'transitionRise' ? turn.endFrame : turn.apexFrame;

/**
 * The turn holding a frame. Neighbouring turns share their transition frame; it counts to the turn it
 * starts (the last turn keeps its own end).
 */
function turnLocator(turns: readonly TurnWindow[]): (frameIndex: number) => TurnWindow | null {
  const sorted = [...turns].sort((a, b) => a.startFrame - b.startFrame);
  return (frameIndex) => {
    let lo = 0;
    let hi = sorted.length - 1;
    let found: TurnWindow | null = null;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      if (sorted[mid].startFrame <= frameIndex) {
        found = sorted[mid];
        lo = mid + 1;
      } else hi = mid - 1;
    }
    if (!found) return null;
    const isLast = found === sorted[sorted.length - 1];
    return frameIndex < found.endFrame || (isLast && frameIndex === found.endFrame) ? found : null;
  };
}

/**
 * Flags as coaching points (docs/metrics.md "Tolerance bands"): every frame and turn value judged
 * against its band, then one flag per band and turn, keeping the worst value and its frame.
 * `maxGapFrames` is the largest frame step still one stretch outside turns.
 */
export function groupFlags(
  frames: readonly FrameValues[],
  turns: readonly TurnWindow[],
  bands: readonly ToleranceBand[],
  options: { maxGapFrames: number },
): FlagGroup[] {
  const locate = turnLocator(turns);
  const groups: FlagGroup[] = [];
  const sortedFrames = [...frames].sort((a, b) => a.frameIndex - b.frameIndex);
  for (const band of bands) {
    if (band.min === null && band.max === null) continue;
    if (isTurnValueKey(band.metric)) {
      for (const turn of turns) {
        const value = turnValue(turn, band.metric);
        if (value === null) continue;
        const frameIndex = turnValueFrame(turn, band.metric);
        const flag = checkBand(band, value, { frameIndex, turnIndex: turn.index });
        if (!flag) continue;
        groups.push({
          metric: band.metric,
          groupKey: `t${turn.index}`,
          turnIndex: turn.index,
          firstFrame: frameIndex,
          lastFrame: frameIndex,
          frameCount: 1,
          worstFrame: frameIndex,
          value,
          distance: flag.distance,
          side: flag.side,
          min: band.min,
          max: band.max,
        });
      }
      continue;
    }
    const metric = band.metric as MetricKey;
    const { min, max } = band;
    const byTurn = new Map<number, FlagGroup>();
    let stretch: FlagGroup | null = null;
    // The hot loop of a re-check (every stored frame × every band): no allocation unless outside.
    for (const frame of sortedFrames) {
      const value = frame.metrics[metric];
      if (value === null || value === undefined || !Number.isFinite(value)) continue;
      const below = min !== null && value < min;
      if (!below && !(max !== null && value > max)) continue;
      const distance = below ? (min as number) - value : value - (max as number);
      const turn = locate(frame.frameIndex);
      let group: FlagGroup | undefined;
      if (turn) {
        group = byTurn.get(turn.index);
        if (!group) {
          group = openGroup(metric, `t${turn.index}`, turn.index, frame.frameIndex, band);
          byTurn.set(turn.index, group);
        }
      } else {
        if (!stretch || frame.frameIndex - stretch.lastFrame > options.maxGapFrames) {
          stretch = openGroup(metric, `r${frame.frameIndex}`, null, frame.frameIndex, band);
          groups.push(stretch);
        }
        group = stretch;
      }
      group.lastFrame = frame.frameIndex;
      group.frameCount += 1;
      if (distance > group.distance) {
        group.distance = distance;
        group.worstFrame = frame.frameIndex;
        group.value = value;
        group.side = below ? 'below' : 'above';
      }
    }
    groups.push(...byTurn.values());
  }
  return groups.sort((a, b) => a.firstFrame - b.firstFrame || a.metric.localeCompare(b.metric));
}
