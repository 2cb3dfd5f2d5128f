import type { MetricKey } from '@shared/metrics';
import { checkBand, type ToleranceBand, type ToleranceFlag } from '@shared/tolerance';

// One formatting for every screen: the tolerances page, the inbox and the workspace show the same text.
export { formatBandRange, formatUnitValue as formatMetricValue } from '@shared/tolerance';

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
  // The camera is far from the view the clip is set to: say so rather than show a confident number.
  if (reason.startsWith('not trusted: seen from the side'))
    return 'not trusted here: the camera sees the skier from the side, this needs a front view';
  if (reason.startsWith('not trusted: seen three-quarters on'))
    return 'not trusted here: the camera sees the skier three-quarters on, this needs a side view';
  return reason;
}
