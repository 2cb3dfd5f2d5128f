import type { View } from '@shared/keypoints';
import { changeTowardTarget, wrongViewReason, type FocusTarget, type TargetChange } from '@shared/plan';
import type { ClipFramesResponse } from '@shared/schemas/frames.schema';
import { isTurnValueKey, turnValue, turnWindow, type BandMetricKey } from '@shared/tolerance';

export interface SideValue {
  value: number | null;
  /** Why there is no value: the view, no analysis, no turn here, points not found. */
  reason: string | null;
}

/**
 * A metric's value on one side at the frame shown: the stored frame's value, or for a per-turn value
 * (apex lean, transition rise) the value of the turn the frame is in.
 */
export function valueAt(
  metric: BandMetricKey,
  view: View,
  stored: ClipFramesResponse | undefined,
  frame: number,
): SideValue {
  const wrongView = wrongViewReason(metric, view);
  if (wrongView) return { value: null, reason: wrongView };
  if (!stored || stored.frames.length === 0) return { value: null, reason: 'Not analysed yet' };
  if (isTurnValueKey(metric)) {
    const turn = stored.series?.turns.find((t) => frame >= t.startFrame && frame <= t.endFrame);
    if (!turn) return { value: null, reason: 'Not in a turn here' };
    const value = turnValue(turnWindow(turn), metric);
    return value === null ? { value, reason: 'Not measured in this turn' } : { value, reason: null };
  }
  const row = stored.frames.find((f) => f.frameIndex === frame);
  if (!row) return { value: null, reason: 'This frame was not analysed' };
  const value = row.metrics[metric];
  return value === null
    ? { value, reason: row.reasons[metric] ?? 'Not measured on this frame' }
    : { value, reason: null };
}

export interface CompareRow {
  metric: BandMetricKey;
  left: SideValue;
  right: SideValue;
  change: number | null;
  toward: TargetChange;
}

export function compareRow(
  metric: BandMetricKey,
  left: SideValue,
  right: SideValue,
  target: FocusTarget | null,
): CompareRow {
  const both = left.value !== null && right.value !== null;
  return {
    metric,
    left,
    right,
    change: both ? right.value! - left.value! : null,
    toward: both ? changeTowardTarget(left.value!, right.value!, target) : 'no target',
  };
}
