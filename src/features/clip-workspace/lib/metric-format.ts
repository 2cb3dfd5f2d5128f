import type { MetricKey, MetricUnit } from '@shared/metrics';
import { checkBand, type ToleranceBand, type ToleranceFlag } from '@shared/tolerance';

/** A metric value with its unit: degrees to 0.1°, ratios to 0.01, shin lengths to 0.01. */
export function formatMetricValue(value: number, unit: MetricUnit): string {
  switch (unit) {
    case 'deg':
      return `${value.toFixed(1)}°`;
    case 'ratio':
      return value.toFixed(2);
    case 'shin lengths':
      return `${value.toFixed(2)} shin lengths`;
  }
}

/** "0.80 to 1.30", "at most 0.05", "at least 2.0°" for a band's limits. */
export function formatBandRange(band: Pick<ToleranceBand, 'min' | 'max'>, unit: MetricUnit): string {
  const f = (v: number) => formatMetricValue(v, unit);
  if (band.min !== null && band.max !== null) return `${f(band.min)} to ${f(band.max)}`;
  if (band.max !== null) return `at most ${f(band.max)}`;
  if (band.min !== null) return `at least ${f(band.min)}`;
  return 'no limits';
}

export type BandCheck =
  | { state: 'none' }
  | { state: 'inside'; band: ToleranceBand }
  | { state: 'outside'; band: ToleranceBand; flag: ToleranceFlag };

/** The first band for `metric` that the value breaks, else the band it sits in, else none. */
export function checkMetricBands(
  metric: MetricKey,
  value: number,
  bands: readonly ToleranceBand[],
): BandCheck {
  const own = bands.filter((b) => b.metric === metric);
  for (const band of own) {
    const flag = checkBand(band, value, { frameIndex: null, turnIndex: null });
    if (flag) return { state: 'outside', band, flag };
  }
  return own[0] ? { state: 'inside', band: own[0] } : { state: 'none' };
}

/** Reasons from the metric core, in words a coach reads: "missing: left_knee" → "left knee not found". */
export function describeReason(reason: string | undefined): string {
  if (!reason) return 'not computed';
  const point = (name: string) => name.replace(/_/g, ' ');
  const missing = /^missing: (.+)$/.exec(reason);
  if (missing) return `${missing[1].split(/,\s*/).map(point).join(', ')} not found`;
  const low = /^low confidence: (.+)$/.exec(reason);
  if (low) return `${low[1].split(/,\s*/).map(point).join(', ')} too uncertain`;
  const invalid = /^invalid: (.+)$/.exec(reason);
  if (invalid) return `${point(invalid[1])} has no usable position`;
  if (reason === 'wrong view') return 'not measured in this view';
  return reason;
}
