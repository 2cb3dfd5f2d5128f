import { formatBandRange, type BandMetricInfo } from '../tolerance';

export const TARGET_DIRECTIONS = ['increase', 'decrease'] as const;
export type TargetDirection = (typeof TARGET_DIRECTIONS)[number];

/** A focus point's target: a range (either edge may be open), or just a direction to move in. */
export interface FocusTarget {
  min: number | null;
  max: number | null;
  direction: TargetDirection | null;
}

const SAME = 1e-9;

export type TargetChange = 'toward' | 'away' | 'unchanged' | 'inside' | 'no target';

/** How far a value lies outside a range; 0 inside it. */
export function distanceOutside(value: number, target: Pick<FocusTarget, 'min' | 'max'>): number {
  if (target.min !== null && value < target.min) return target.min - value;
  if (target.max !== null && value > target.max) return value - target.max;
  return 0;
}

/** Whether going from `before` to `after` moves toward the target. */
export function changeTowardTarget(before: number, after: number, target: FocusTarget | null): TargetChange {
  if (!target) return 'no target';
  if (target.min !== null || target.max !== null) {
    const was = distanceOutside(before, target);
    const now = distanceOutside(after, target);
    if (was === 0 && now === 0) return 'inside';
    // Differences below rounding (0.8 − 0.7 against 1.4 − 1.3) are no change.
    if (Math.abs(now - was) < SAME) return 'unchanged';
    return now < was ? 'toward' : 'away';
  }
  if (target.direction === null || after === before) return target.direction ? 'unchanged' : 'no target';
  return after > before === (target.direction === 'increase') ? 'toward' : 'away';
}

/** "0.80 to 1.30", "higher", "lower" for a target, in the metric's unit. */
export function describeTarget(target: FocusTarget, info: Pick<BandMetricInfo, 'unit'>): string {
  if (target.min !== null || target.max !== null) return formatBandRange(target, info.unit);
  if (target.direction === 'increase') return 'higher';
  if (target.direction === 'decrease') return 'lower';
  return 'no target';
}
