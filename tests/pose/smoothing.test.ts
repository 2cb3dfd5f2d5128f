// The series analysis' default smoothing against the phantom's truth (docs/accuracy.md, "Smoothing
// against the truth"): on the demo club's phantom clips as MoveNet Lightning read them, the default
// cut-off must lower the joint error, and no cut-off in the sweep may make it worse than none.
import { describe, expect, it } from 'vitest';
import { DEFAULT_CUTOFF_HZ } from '@shared/series/filters';
import { smoothingRun } from './smoothing-eval';

describe('keypoint smoothing against the phantom truth', () => {
  const rows = smoothingRun();
  const none = rows.find((r) => r.cutoffHz === 0)!;
  const standard = rows.find((r) => r.cutoffHz === DEFAULT_CUTOFF_HZ)!;

  it('the default cut-off lowers the median and the p90 joint error', () => {
    expect(standard.jointMedian).toBeLessThan(none.jointMedian);
    expect(standard.jointP90).toBeLessThan(none.jointP90);
  });

  it('no cut-off of the sweep is worse than none by more than rounding', () => {
    for (const r of rows) expect(r.jointMedian, `${r.cutoffHz} Hz`).toBeLessThan(none.jointMedian + 0.0005);
  });
});
