import type { View } from '../keypoints';
import type { MetricKey } from '../metrics';
import { BAND_METRICS, isTurnValueKey, turnValue, type BandMetricKey, type TurnWindow } from '../tolerance';

/** Where in a turn a focus point is judged: at the apex, at the transition that ends it, or over it all. */
export const FOCUS_PHASES = ['apex', 'transition', 'turn'] as const;
export type FocusPhase = (typeof FOCUS_PHASES)[number];

export const FOCUS_PHASE_LABELS: Record<FocusPhase, string> = {
  apex: 'at the apex',
  transition: 'at the transition',
  turn: 'over the whole turn',
};

/** Per-turn values have their phase built in: the rise at the transition, the rest at the apex. */
export function fixedPhaseOf(metric: BandMetricKey): FocusPhase | null {
  if (!isTurnValueKey(metric)) return null;
  return metric === 'transitionRise' ? 'transition' : 'apex';
}

/** "Knee separation at the apex"; a per-turn value's label names its phase already ("Apex lean"). */
export function focusLabel(metric: BandMetricKey, phase: FocusPhase | null): string {
  const label = BAND_METRICS[metric].label;
  return phase && !fixedPhaseOf(metric) ? `${label} ${FOCUS_PHASE_LABELS[phase]}` : label;
}

export interface StoredFrameValues {
  frameIndex: number;
  metrics: Partial<Record<MetricKey, number | null>>;
}

export interface PhaseValueInput {
  view: View;
  /** The clip's stored (per-frame, unsmoothed) values. */
  frames: readonly StoredFrameValues[];
  /** The clip's stored turns (empty in a side view: turns are found from the front). */
  turns: readonly TurnWindow[];
}

/** One clip's value of a focus point: the median over its turns, with the spread. */
export interface PhaseValue {
  /** Median over the turns (or, over a side view's whole clip, over its frames); null with a reason. */
  median: number | null;
  min: number | null;
  max: number | null;
  /** Values the median is taken over, and what they are. */
  count: number;
  over: 'turns' | 'frames';
  reason: string | null;
}

export function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

const none = (reason: string): PhaseValue => ({
  median: null,
  min: null,
  max: null,
  count: 0,
  over: 'turns',
  reason,
});

function summarise(values: readonly (number | null | undefined)[], over: PhaseValue['over'], empty: string) {
  const present = values.filter((v): v is number => typeof v === 'number' && Number.isFinite(v));
  if (present.length === 0) return none(empty);
  return {
    median: median(present),
    min: Math.min(...present),
    max: Math.max(...present),
    count: present.length,
    over,
    reason: null,
  };
}

/** Why a metric cannot be read in a view, or null when it can. */
export function wrongViewReason(metric: BandMetricKey, view: View): string | null {
  const info = BAND_METRICS[metric];
  if (info.view === 'both' || info.view === view) return null;
  return `Filmed from the ${view}; ${info.label.toLowerCase()} is measured in a ${info.view} view`;
}

/**
 * A clip's value of a metric at a turn phase (docs/metrics.md "Season plan"): at the apex, the stored
 * frame at each turn's apex; at the transition, the frame where a turn hands over to the next; over the
 * turn, the median of the turn's frames. The clip's value is the median over its turns.
 */
export function clipPhaseValue(input: PhaseValueInput, metric: BandMetricKey, phase: FocusPhase): PhaseValue {
  const wrongView = wrongViewReason(metric, input.view);
  if (wrongView) return none(wrongView);
  const { turns } = input;
  if (isTurnValueKey(metric)) {
    if (turns.length === 0) return none('No turns were found in this clip');
    return summarise(
      turns.map((t) => turnValue(t, metric)),
      'turns',
      'No turn of this clip has this value (the points it needs were not found)',
    );
  }
  const byFrame = new Map(input.frames.map((f) => [f.frameIndex, f.metrics[metric]]));
  if (turns.length === 0) {
    if (phase !== 'turn') return none('No turns were found in this clip, so it has no apex or transition');
    return summarise(
      input.frames.map((f) => f.metrics[metric]),
      'frames',
      'No analysed frame of this clip has this value',
    );
  }
  let values: (number | null | undefined)[];
  if (phase === 'apex') values = turns.map((t) => byFrame.get(t.apexFrame));
  else if (phase === 'transition') {
    values = turns.flatMap((t, i) =>
      i + 1 < turns.length && turns[i + 1].startFrame === t.endFrame ? [byFrame.get(t.endFrame)] : [],
    );
    if (values.length === 0) return none('This clip has no transition between two turns');
  } else {
    values = turns.map((t) => {
      const inTurn = input.frames
        .filter((f) => f.frameIndex >= t.startFrame && f.frameIndex < t.endFrame)
        .map((f) => f.metrics[metric])
        .filter((v): v is number => typeof v === 'number');
      return inTurn.length ? median(inTurn) : null;
    });
  }
  return summarise(values, 'turns', `No turn of this clip has this value ${FOCUS_PHASE_LABELS[phase]}`);
}
