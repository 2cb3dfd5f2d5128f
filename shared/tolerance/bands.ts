import { METRIC_KEYS, type MetricKey } from '../metrics';
import type { BandMetricKey } from './band-metrics';

export interface ToleranceBand {
  metric: BandMetricKey;
  ageGroup: string;
  min: number | null;
  max: number | null;
  target: number | null;
  source: 'common practice' | 'club';
}

export interface ToleranceFlag {
  metric: BandMetricKey;
  ageGroup: string;
  frameIndex: number | null;
  turnIndex: number | null;
  value: number;
  min: number | null;
  max: number | null;
  /** How far outside the band, in the metric's unit; always positive. */
  distance: number;
  side: 'below' | 'above';
}

export const AGE_GROUPS = ['U8', 'U10', 'U12', 'U14', 'U16', 'U18', 'Masters'] as const;
export type AgeGroup = (typeof AGE_GROUPS)[number];

/** Groups given the wider ±10° shin–torso band; the rest get ±7° (common practice). */
export const YOUNGER_AGE_GROUPS: readonly AgeGroup[] = ['U8', 'U10', 'U12'];

function seedBands(ageGroup: AgeGroup): ToleranceBand[] {
  const band = (
    metric: BandMetricKey,
    min: number | null,
    max: number | null,
    target: number | null,
  ): ToleranceBand => ({
    metric,
    ageGroup,
    min,
    max,
    target,
    source: 'common practice',
  });
  const mismatch = YOUNGER_AGE_GROUPS.includes(ageGroup) ? 10 : 7;
  return [
    // Stance width and knee separation about hip width.
    band('stanceWidthRatio', 0.8, 1.3, 1),
    band('kneeSeparationRatio', 0.8, 1.3, 1),
    // Back parallel to the shins.
    band('shinTorsoMismatch', -mismatch, mismatch, 0),
    // Level shoulders against the snow line.
    band('shoulderTilt', -8, 8, 0),
    // Equal ankle flexion left and right.
    band('ankleFlexionDifference', -5, 5, 0),
    // No standing tall in the transition.
    band('transitionRise', null, 0.05, null),
  ];
}

/** Coaching rules of thumb from docs/metrics.md, labelled common practice, for every age group. */
export const DEFAULT_BANDS: ToleranceBand[] = AGE_GROUPS.flatMap(seedBands);

export function bandsForAgeGroup(
  ageGroup: string,
  bands: readonly ToleranceBand[] = DEFAULT_BANDS,
): ToleranceBand[] {
  return bands.filter((b) => b.ageGroup === ageGroup);
}

/** The flag for one value against one band, or null when it is inside (bounds included). */
export function checkBand(
  band: ToleranceBand,
  value: number,
  where: { frameIndex: number | null; turnIndex: number | null },
): ToleranceFlag | null {
  if (!Number.isFinite(value)) return null;
  const base = {
    metric: band.metric,
    ageGroup: band.ageGroup,
    ...where,
    value,
    min: band.min,
    max: band.max,
  };
  if (band.min !== null && value < band.min) return { ...base, distance: band.min - value, side: 'below' };
  if (band.max !== null && value > band.max) return { ...base, distance: value - band.max, side: 'above' };
  return null;
}

const isFrameMetric = (metric: BandMetricKey): metric is MetricKey =>
  (METRIC_KEYS as string[]).includes(metric);

/**
 * Flags for one frame's metrics. Every band given is applied, so pass one age group's bands
 * (see bandsForAgeGroup); bands on transitionRise are per turn and ignored here.
 */
export function evaluateFrame(
  metrics: Record<MetricKey, number | null>,
  bands: ToleranceBand[],
  frameIndex?: number,
): ToleranceFlag[] {
  const flags: ToleranceFlag[] = [];
  for (const band of bands) {
    if (!isFrameMetric(band.metric)) continue;
    const value = metrics[band.metric];
    if (value === null || value === undefined) continue;
    const flag = checkBand(band, value, { frameIndex: frameIndex ?? null, turnIndex: null });
    if (flag) flags.push(flag);
  }
  return flags;
}

/** The seeded band of a metric for a default set (U8 … Masters), or null when none is seeded. */
export function defaultBandFor(set: string, metric: BandMetricKey): ToleranceBand | null {
  return DEFAULT_BANDS.find((b) => b.ageGroup === set && b.metric === metric) ?? null;
}
